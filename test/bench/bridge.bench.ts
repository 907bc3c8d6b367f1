/**
 * Bridge package: cost of the exact, checked maps against hand-written textbook formulas on the
 * same data (informative; no target is set for this package).
 */
import { createStrainBridge, solveBridge } from '@bridgework/bridge';
import { compare, report, sinkValue } from './harness.js';

const n = 4096;
const strainsA = Float64Array.from({ length: n }, (_, i) => (i / n - 0.5) * 4e-3);
const strainsB = Float64Array.from({ length: n }, (_, i) => (0.5 - i / n) * 4e-3);
const gf = 2.1;
const quarter = createStrainBridge({
  arrangement: 'quarter',
  gaugeFactor: gf,
  leads: { ohmsPerLead: 1.2, wiring: 'three-wire' },
});
const ratiosA = strainsA.map((e) => quarter.ratioFromStrain(e));
const ratiosB = strainsB.map((e) => quarter.ratioFromStrain(e));

report(
  'bridge: strain → ratio (quarter, three-wire), per strain',
  compare([
    {
      name: 'textbook x/(4+2x), no leads',
      opsPerCall: n,
      run(call) {
        const s = call % 2 === 0 ? strainsA : strainsB;
        let acc = 0;
        for (let i = 0; i < n; i++) {
          const x = gf * (s[i] as number);
          acc += x / (4 + 2 * x);
        }
        return acc;
      },
    },
    {
      name: 'ratioFromStrain (exact, checked)',
      opsPerCall: n,
      run(call) {
        const s = call % 2 === 0 ? strainsA : strainsB;
        let acc = 0;
        for (let i = 0; i < n; i++) acc += quarter.ratioFromStrain(s[i] as number);
        return acc;
      },
    },
  ]),
);

report(
  'bridge: ratio → strain (quarter, three-wire), per ratio',
  compare([
    {
      name: 'textbook 4r/(GF(1-2r)), no leads',
      opsPerCall: n,
      run(call) {
        const r = call % 2 === 0 ? ratiosA : ratiosB;
        let acc = 0;
        for (let i = 0; i < n; i++) {
          const v = r[i] as number;
          acc += (4 * v) / (gf * (1 - 2 * v));
        }
        return acc;
      },
    },
    {
      name: 'strainFromRatio (exact, checked)',
      opsPerCall: n,
      run(call) {
        const r = call % 2 === 0 ? ratiosA : ratiosB;
        let acc = 0;
        for (let i = 0; i < n; i++) acc += quarter.strainFromRatio(r[i] as number);
        return acc;
      },
    },
  ]),
);

const arms: [number, number, number, number][] = Array.from({ length: 256 }, (_, i) => [
  350 + i * 0.01,
  350,
  349.9,
  350.2,
]);
report(
  'bridge: solveBridge, full network with source and meter, per call',
  compare([
    {
      name: 'unloaded ratio formula only',
      opsPerCall: arms.length,
      run() {
        let acc = 0;
        for (const [r1, r2, r3, r4] of arms) acc += (r1 * r3 - r2 * r4) / ((r1 + r2) * (r3 + r4));
        return acc;
      },
    },
    {
      name: 'solveBridge (all fields, checked)',
      opsPerCall: arms.length,
      run() {
        let acc = 0;
        for (const armsOhms of arms)
          acc += solveBridge({ armsOhms, excitationVolts: 5, sourceOhms: 10, meterOhms: 1e6 }).outputVolts;
        return acc;
      },
    },
  ]),
);
console.log(`\n(sink ${sinkValue().toExponential(3)})`);
