import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveBridge } from '@bridgework/bridge';
import { bridgeNoiseSource, johnsonNoiseDensity } from '@bridgework/chain';
import { bridgeTransimpedance } from '../../../test/support/nodal.js';

const ohms = fc.double({ min: 0, max: 5, noNaN: true }).map((d) => 10 ** d); // 1 Ω … 100 kΩ
const network = fc.record({
  armsOhms: fc.tuple(ohms, ohms, ohms, ohms),
  sourceOhms: fc.oneof(
    fc.constant(0),
    fc.double({ min: -2, max: 4, noNaN: true }).map((d) => 10 ** d),
  ),
});

describe('bridgeNoiseSource: equal arms', () => {
  it('four 350 Ω arms: output 350 Ω, thermal 2.40062 nV/√Hz, current-noise ohms 350/√2', () => {
    const n = bridgeNoiseSource({ armsOhms: [350, 350, 350, 350] });
    // Two 175 Ω halves in series (R∥R + R∥R = R); each input node sees R∥R = 175 Ω to the stiff source.
    expect(n.bridgeOhms).toBe(350);
    expect(n.outputOhms).toBe(350);
    expect(n.voltsPerRootHz).toBe(johnsonNoiseDensity({ ohms: 350 }));
    expect(n.positiveInputOhms).toBeNear(175, { ulps: 1 });
    expect(n.negativeInputOhms).toBeNear(175, { ulps: 1 });
    expect(n.currentNoiseOhms).toBeNear(350 / Math.SQRT2, { ulps: 2 });
  });

  it('adds input series resistance to the output resistance and to each transimpedance', () => {
    const n = bridgeNoiseSource({
      armsOhms: [350, 350, 350, 350],
      inputSeriesOhms: [1000, 1200],
      temperatureCelsius: 40,
    });
    expect(n.outputOhms).toBe(2550);
    expect(n.positiveInputOhms).toBeNear(1175, { ulps: 1 });
    expect(n.negativeInputOhms).toBeNear(1375, { ulps: 1 });
    expect(n.voltsPerRootHz).toBe(johnsonNoiseDensity({ ohms: 2550, temperatureCelsius: 40 }));
  });
});

describe('bridgeNoiseSource against 40-digit nodal analysis (mathjs lusolve, BigNumber)', () => {
  it('the output resistance is solveBridge’s Thevenin resistance (no second formula)', () => {
    fc.assert(
      fc.property(network, (n) => {
        const s = bridgeNoiseSource(n);
        expect(s.bridgeOhms).toBe(solveBridge({ ...n, excitationVolts: 1 }).theveninOhms);
      }),
      { numRuns: 100 },
    );
  });

  it('each transimpedance matches a nodal solve with a test current, and they add to the output resistance', () => {
    fc.assert(
      fc.property(network, (n) => {
        const s = bridgeNoiseSource(n);
        expect(s.positiveInputOhms).toBeNear(bridgeTransimpedance(n, 'S+', 1), { rel: 1e-13 });
        expect(s.negativeInputOhms).toBeNear(bridgeTransimpedance(n, 'S-', -1), { rel: 1e-13 });
        // Superposition: a current into S+ and out of S− is the output port's test current.
        expect(s.positiveInputOhms + s.negativeInputOhms).toBeNear(s.bridgeOhms, { rel: 1e-13 });
      }),
      { numRuns: 150 },
    );
  });
});

describe('bridgeNoiseSource: bad inputs', () => {
  const good = { armsOhms: [350, 350, 350, 350] as const };
  it.each([
    ['zero arm', { armsOhms: [0, 350, 350, 350] }, 'not-positive', 'armsOhms[0]'],
    ['NaN arm', { armsOhms: [350, Number.NaN, 350, 350] }, 'not-finite', 'armsOhms[1]'],
    ['three arms', { armsOhms: [350, 350, 350] }, 'invalid-shape', 'armsOhms'],
    ['negative source', { ...good, sourceOhms: -1 }, 'negative', 'sourceOhms'],
    ['one series value', { ...good, inputSeriesOhms: [10] }, 'invalid-shape', 'inputSeriesOhms'],
    ['negative series', { ...good, inputSeriesOhms: [10, -1] }, 'negative', 'inputSeriesOhms[1]'],
    ['cold', { ...good, temperatureCelsius: -274 }, 'out-of-range', 'temperatureCelsius'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => bridgeNoiseSource(options as never)).toThrowBridgeworkError(code, { param });
  });
});
