import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveBridge } from '@bridgework/bridge';
import { bridgeShortCircuitAmps, solveBridgeNetwork } from '../../../test/support/nodal.js';

/** Log-uniform resistance between 1 Ω and 1 MΩ. */
const ohms = fc.double({ min: 0, max: 6, noNaN: true }).map((d) => 10 ** d);
const network = fc.record({
  armsOhms: fc.tuple(ohms, ohms, ohms, ohms),
  excitationVolts: fc.double({ min: 0.1, max: 20, noNaN: true }),
  sourceOhms: fc.double({ min: -2, max: 4, noNaN: true }).map((d) => 10 ** d),
  meterOhms: fc.double({ min: 2, max: 9, noNaN: true }).map((d) => 10 ** d),
});

describe('solveBridge: check values', () => {
  it('350.7/350/350/350 Ω, 10 V, source 50 Ω, meter 10 kΩ reads 4.223022653 mV', () => {
    // Issue #2 check value; confirmed independently by the 40-digit nodal solve below.
    const s = solveBridge({
      armsOhms: [350.7, 350, 350, 350],
      excitationVolts: 10,
      sourceOhms: 50,
      meterOhms: 10_000,
    });
    expect(s.outputVolts).toBeNear(4.223022653e-3, { rel: 1e-9 });
    const ref = solveBridgeNetwork({
      armsOhms: [350.7, 350, 350, 350],
      excitationVolts: 10,
      sourceOhms: 50,
      meterOhms: 10_000,
    });
    expect(s.outputVolts).toBeNear(ref.outputVolts, { rel: 1e-14 });
    expect(s.ratio).toBeNear(s.outputVolts / 10, { ulps: 1 });
  });

  it('an unloaded equal-arm quarter bridge gives ΔR/(4R + 2ΔR) (textbook quarter-bridge equation)', () => {
    // Dally & Riley, Experimental Stress Analysis, Wheatstone bridge chapter (from memory):
    // Vout/Vexc = (ΔR/R)/(4 + 2ΔR/R) for one active arm.
    const s = solveBridge({ armsOhms: [350.7, 350, 350, 350], excitationVolts: 5 });
    const x = (350.7 - 350) / 350; // the exact arm change of the double 350.7
    expect(s.ratio).toBeNear(x / (4 + 2 * x), { rel: 1e-15 });
    expect(s.bridgeVolts).toBe(5);
    expect(s.meterAmps).toBe(0);
    expect(s.theveninOhms).toBeNear((350.7 * 350) / 700.7 + 175, { rel: 1e-15 });
    expect(s.inputOhms).toBeNear((700.7 * 700) / 1400.7, { rel: 1e-15 });
  });
});

describe('solveBridge: special cases', () => {
  it('gives exactly 0 for balanced bridges, equal arms or not', () => {
    for (const armsOhms of [
      [350, 350, 350, 350],
      [100, 200, 400, 200],
      [120, 1000, 1000, 120],
      [0.125, 3e5, 2.4e6, 1],
    ] as const) {
      const s = solveBridge({ armsOhms, excitationVolts: 10, sourceOhms: 12, meterOhms: 5e4 });
      expect(s.outputVolts).toBe(0);
      expect(s.theveninVolts).toBe(0);
      expect(s.meterAmps).toBe(0);
    }
  });

  it('tension in arm 1 or 3 reads positive, in arm 2 or 4 negative (DESIGN.md sign convention)', () => {
    for (let arm = 0; arm < 4; arm++) {
      const armsOhms: [number, number, number, number] = [350, 350, 350, 350];
      armsOhms[arm] = 350.35;
      const { ratio } = solveBridge({ armsOhms, excitationVolts: 5 });
      expect(Math.sign(ratio)).toBe(arm % 2 === 0 ? 1 : -1);
    }
  });

  it('defaults to a stiff source and an ideal meter', () => {
    const a = solveBridge({ armsOhms: [351, 349, 350, 350], excitationVolts: 2.5 });
    const b = solveBridge({
      armsOhms: [351, 349, 350, 350],
      excitationVolts: 2.5,
      sourceOhms: 0,
      meterOhms: Infinity,
    });
    expect(a).toEqual(b);
  });

  it('conserves energy: supply power = arm powers + meter power (exact within rounding)', () => {
    fc.assert(
      fc.property(network, (n) => {
        const s = solveBridge(n);
        const supply = s.supplyAmps * s.bridgeVolts;
        const dissipated = s.armWatts.reduce((a, b) => a + b, 0) + s.meterAmps * s.outputVolts;
        expect(dissipated).toBeNear(supply, { rel: 1e-12 });
      }),
      { numRuns: 300 },
    );
  });
});

describe('solveBridge against a 40-digit nodal solve (mathjs lusolve, BigNumber)', () => {
  it('agrees on 1000 random networks with source and meter resistance', () => {
    fc.assert(
      fc.property(network, (n) => {
        const s = solveBridge(n);
        const ref = solveBridgeNetwork(n);
        // Absolute floor: 1e-15 of the excitation, far below any measurable signal.
        const floor = 1e-15 * n.excitationVolts;
        expect(s.outputVolts).toBeNear(ref.outputVolts, { rel: 1e-12, abs: floor });
        expect(s.bridgeVolts).toBeNear(ref.bridgeVolts, { rel: 1e-13 });
        expect(s.supplyAmps).toBeNear(ref.supplyAmps, { rel: 1e-13 });
        expect(s.meterAmps).toBeNear(ref.meterAmps, { rel: 1e-12, abs: floor / n.meterOhms });
        expect(s.armAmps).toBeNear(ref.armAmps, { rel: 1e-12 });
      }),
      { numRuns: 1000 },
    );
  });

  it('gives the Thevenin equivalent: open-circuit volts and Voc/Isc', () => {
    fc.assert(
      fc.property(network, (n) => {
        const s = solveBridge(n);
        const open = solveBridgeNetwork({ ...n, meterOhms: Infinity });
        const isc = bridgeShortCircuitAmps(n);
        const floor = 1e-15 * n.excitationVolts;
        expect(s.theveninVolts).toBeNear(open.outputVolts, { rel: 1e-12, abs: floor });
        // Voc/Isc is 0/0 for a balanced bridge; skip the (measure-zero) exact-balance case.
        if (Math.abs(open.outputVolts) > 1e-9 * n.excitationVolts) {
          expect(s.theveninOhms).toBeNear(open.outputVolts / isc, { rel: 1e-10 });
        }
      }),
      { numRuns: 300 },
    );
  });

  it('handles a zero source resistance (node E+ fixed at the EMF)', () => {
    fc.assert(
      fc.property(network, (n) => {
        const m = { ...n, sourceOhms: 0 };
        const s = solveBridge(m);
        const ref = solveBridgeNetwork(m);
        expect(s.outputVolts).toBeNear(ref.outputVolts, { rel: 1e-12, abs: 1e-15 * n.excitationVolts });
        expect(s.bridgeVolts).toBe(n.excitationVolts);
      }),
      { numRuns: 200 },
    );
  });
});

describe('solveBridge: bad inputs', () => {
  const good = { armsOhms: [350, 350, 350, 350] as [number, number, number, number], excitationVolts: 5 };
  it.each([
    ['NaN arm', { ...good, armsOhms: [Number.NaN, 350, 350, 350] }, 'not-finite', 'armsOhms[0]'],
    ['+Infinity arm', { ...good, armsOhms: [350, Infinity, 350, 350] }, 'not-finite', 'armsOhms[1]'],
    ['-Infinity arm', { ...good, armsOhms: [350, 350, -Infinity, 350] }, 'not-finite', 'armsOhms[2]'],
    ['zero arm', { ...good, armsOhms: [350, 350, 350, 0] }, 'not-positive', 'armsOhms[3]'],
    ['negative arm', { ...good, armsOhms: [-350, 350, 350, 350] }, 'not-positive', 'armsOhms[0]'],
    ['string arm', { ...good, armsOhms: ['350', 350, 350, 350] }, 'wrong-type', 'armsOhms[0]'],
    ['null arm', { ...good, armsOhms: [null, 350, 350, 350] }, 'wrong-type', 'armsOhms[0]'],
    ['three arms', { ...good, armsOhms: [350, 350, 350] }, 'invalid-shape', 'armsOhms'],
    ['zero excitation', { ...good, excitationVolts: 0 }, 'not-positive', 'excitationVolts'],
    ['negative excitation', { ...good, excitationVolts: -5 }, 'not-positive', 'excitationVolts'],
    ['NaN excitation', { ...good, excitationVolts: Number.NaN }, 'not-finite', 'excitationVolts'],
    ['negative source', { ...good, sourceOhms: -1 }, 'negative', 'sourceOhms'],
    ['infinite source', { ...good, sourceOhms: Infinity }, 'not-finite', 'sourceOhms'],
    ['zero meter', { ...good, meterOhms: 0 }, 'not-positive', 'meterOhms'],
    ['NaN meter', { ...good, meterOhms: Number.NaN }, 'not-finite', 'meterOhms'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => solveBridge(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a missing options object', () => {
    expect(() => solveBridge(undefined as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
