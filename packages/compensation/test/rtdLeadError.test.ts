import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createRtd, rtdLeadError, wireOhms } from '@bridgework/compensation';

const pt100 = createRtd();
const temperature = fc.double({ min: -150, max: 600, noNaN: true });
const lead = fc.double({ min: 0, max: 3, noNaN: true });
const mismatch = fc.double({ min: -0.05, max: 0.05, noNaN: true });

describe('rtdLeadError', () => {
  it('resistance readout: two-wire R = Rt + RL1 + RL2, three-wire Rt + ΔRL, four-wire Rt', () => {
    fc.assert(
      fc.property(temperature, lead, mismatch, (t, rl, d) => {
        const rt = pt100.ohmsAt(t);
        const common = { rtd: pt100, temperatureCelsius: t, ohmsPerLead: rl + 0.05, leadMismatchOhms: d };
        const two = rtdLeadError({ ...common, wiring: 'two-wire' });
        const three = rtdLeadError({ ...common, wiring: 'three-wire' });
        const four = rtdLeadError({ ...common, wiring: 'four-wire' });
        expect(two.measuredOhms).toBeNear(rt + (rl + 0.05 + d) + (rl + 0.05), { ulps: 4 });
        expect(three.measuredOhms).toBeNear(rt + d, { rel: 1e-15, abs: 1e-15 });
        expect(four.measuredOhms).toBe(rt);
        expect(four.errorCelsius).toBeNear(0, { abs: 1e-9 });
        expect(two.errorCelsius).toBeNear(pt100.temperatureAt(two.measuredOhms) - t, { ulps: 0 });
      }),
      { numRuns: 300 },
    );
  });

  it('three-wire with equal leads is exact for the resistance readout', () => {
    const r = rtdLeadError({ rtd: pt100, temperatureCelsius: 250, ohmsPerLead: 2, wiring: 'three-wire' });
    expect(r.measuredOhms).toBe(pt100.ohmsAt(250));
    expect(r.errorCelsius).toBeNear(0, { abs: 1e-9 });
  });

  it('quarter-bridge readout: two-wire R = Rt + 2RL; three-wire R = Rc·(Rt + RL1)/(Rc + RL2) (derived)', () => {
    // Derived: the lead-free bridge reads the same ratio when R1/R2 is the same, so the inferred
    // arm is Rc·(Rt + RL1)/(Rc + RL2) for three wires; with two wires arm 1 is Rt + RL1 + RL2.
    fc.assert(
      fc.property(temperature, lead, mismatch, fc.constantFrom(100, 138.5, 175), (t, rl, d, rc) => {
        const common = {
          rtd: pt100,
          temperatureCelsius: t,
          ohmsPerLead: rl + 0.05,
          leadMismatchOhms: d,
          readout: 'quarter-bridge',
          completionOhms: rc,
        } as const;
        const rt = pt100.ohmsAt(t);
        const two = rtdLeadError({ ...common, wiring: 'two-wire' });
        const three = rtdLeadError({ ...common, wiring: 'three-wire' });
        // 1e-12: solveBridge then solveArm, both exact to ~1e-13 on bridges of this scale.
        expect(two.measuredOhms).toBeNear(rt + 2 * (rl + 0.05) + d, { rel: 1e-12 });
        expect(three.measuredOhms).toBeNear((rc * (rt + rl + 0.05 + d)) / (rc + rl + 0.05), { rel: 1e-12 });
      }),
      { numRuns: 300 },
    );
  });

  it('quarter-bridge three-wire cancels equal leads only at the balance temperature (Rt = Rc)', () => {
    const at = (t: number) =>
      rtdLeadError({
        rtd: pt100,
        temperatureCelsius: t,
        ohmsPerLead: 1.5,
        wiring: 'three-wire',
        readout: 'quarter-bridge',
      });
    expect(at(0).errorCelsius).toBeNear(0, { abs: 1e-9 });
    expect(Math.abs(at(200).errorCelsius)).toBeGreaterThan(1);
  });

  it('scenario: Pt100 at 60 °C on 25 m of AWG 24 copper, two-wire reads 10.98 K high', () => {
    const ohmsPerLead = wireOhms({ awg: 24, lengthMeters: 25 });
    const r = rtdLeadError({ rtd: pt100, temperatureCelsius: 60, ohmsPerLead, wiring: 'two-wire' });
    // By hand: 2·2.1054 Ω = 4.2108 Ω over the mean slope between 60 and 71 °C,
    // 100·(3.9083e-3 − 2·5.775e-7·65.5) = 0.38327 Ω/K, gives 10.987 K (the chord, to ±0.005 K).
    expect(r.errorCelsius).toBeNear(10.987, { abs: 0.005 });
    expect(r.measuredOhms).toBeNear(pt100.ohmsAt(60) + 2 * ohmsPerLead, { ulps: 2 });
  });

  it.each([
    [
      'no rtd',
      { temperatureCelsius: 0, ohmsPerLead: 1, wiring: 'two-wire' },
      'missing-option',
      'options.rtd',
    ],
    [
      'an object as rtd',
      { rtd: { r0Ohms: 100 }, temperatureCelsius: 0, ohmsPerLead: 1, wiring: 'two-wire' },
      'wrong-type',
      'rtd',
    ],
    [
      'unknown wiring',
      { rtd: pt100, temperatureCelsius: 0, ohmsPerLead: 1, wiring: 'six-wire' },
      'invalid-option',
      'wiring',
    ],
    [
      'four-wire bridge',
      { rtd: pt100, temperatureCelsius: 0, ohmsPerLead: 1, wiring: 'four-wire', readout: 'quarter-bridge' },
      'invalid-option',
      'wiring',
    ],
    [
      'unknown readout',
      { rtd: pt100, temperatureCelsius: 0, ohmsPerLead: 1, wiring: 'two-wire', readout: 'bridge' },
      'invalid-option',
      'readout',
    ],
    [
      'negative lead',
      { rtd: pt100, temperatureCelsius: 0, ohmsPerLead: -1, wiring: 'two-wire' },
      'negative',
      'ohmsPerLead',
    ],
    [
      'too negative mismatch',
      { rtd: pt100, temperatureCelsius: 0, ohmsPerLead: 1, leadMismatchOhms: -1.5, wiring: 'three-wire' },
      'negative',
      'leadMismatchOhms',
    ],
    [
      'NaN mismatch',
      {
        rtd: pt100,
        temperatureCelsius: 0,
        ohmsPerLead: 1,
        leadMismatchOhms: Number.NaN,
        wiring: 'three-wire',
      },
      'not-finite',
      'leadMismatchOhms',
    ],
    [
      'temperature 900 °C',
      { rtd: pt100, temperatureCelsius: 900, ohmsPerLead: 1, wiring: 'two-wire' },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'a two-wire reading above 850 °C',
      { rtd: pt100, temperatureCelsius: 849, ohmsPerLead: 1, wiring: 'two-wire' },
      'out-of-range',
      'ohmsPerLead',
    ],
    [
      'zero completion',
      {
        rtd: pt100,
        temperatureCelsius: 0,
        ohmsPerLead: 1,
        wiring: 'two-wire',
        readout: 'quarter-bridge',
        completionOhms: 0,
      },
      'not-positive',
      'completionOhms',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => rtdLeadError(options as never)).toThrowBridgeworkError(code, { param });
  });
});
