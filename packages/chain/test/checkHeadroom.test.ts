import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkHeadroom, createAdc, type HeadroomMargin } from '@bridgework/chain';

const byLimit = (margins: readonly HeadroomMargin[]) => Object.fromEntries(margins.map((m) => [m.limit, m]));

describe('checkHeadroom: the issue #4 case — the first stage clips while the output does not', () => {
  it('gain 200 on a 0–5 V in-amp: first-stage outputs need 0.5 V and 4.5 V, the output only 4.5 V', () => {
    // 5 V bridge (common mode 2.5 V), +20 mV full scale, G1 = G = 200, output reference 0.5 V.
    // First stage: 2.5 ± 200·0.02/2 = 0.5 V and 4.5 V, outside its 1.2–3.8 V swing by 0.7 V;
    // output: 0.5 + 200·0.02 = 4.5 V, inside its 0.1–4.9 V swing by 0.4 V. (Three-op-amp in-amp
    // model, by hand.)
    const r = checkHeadroom({
      points: [
        { differentialVolts: 0, commonModeVolts: 2.5 },
        { differentialVolts: 0.02, commonModeVolts: 2.5 },
      ],
      gain: 200,
      outputReferenceVolts: 0.5,
      limits: { firstStageVolts: { min: 1.2, max: 3.8 }, outputVolts: { min: 0.1, max: 4.9 } },
    });
    expect(r.ok).toBe(false);
    expect(r.issues.map((i) => i.limit)).toEqual(['first-stage-low', 'first-stage-high']);
    const m = byLimit(r.value.margins);
    expect(m['first-stage-low']!.marginVolts).toBeNear(-0.7, { abs: 1e-15 });
    expect(m['first-stage-high']!.marginVolts).toBeNear(-0.7, { abs: 1e-15 });
    expect(m['first-stage-high']!.pointIndex).toBe(1);
    expect(m['output-high']!.marginVolts).toBeNear(0.4, { abs: 1e-15 });
    expect(m['output-low']!.marginVolts).toBeNear(0.4, { abs: 1e-15 }); // at zero: 0.5 − 0.1
    expect(r.issues[0]!.message).toMatch(/first-stage output clips at its low limit: 0\.5 V against 1\.2 V/);
    // The same span passes at a lower first-stage gain (G2 = 4 puts 50 in the first stage).
    const split = checkHeadroom({
      points: [{ differentialVolts: 0.02, commonModeVolts: 2.5 }],
      gain: 200,
      secondStageGain: 4,
      outputReferenceVolts: 0.5,
      limits: { firstStageVolts: { min: 1.2, max: 3.8 }, outputVolts: { min: 0.1, max: 4.9 } },
    });
    expect(split.ok).toBe(true);
    expect(split.value.firstStageGain).toBe(50);
    expect(split.value.nodes[0]!.firstStagePositiveVolts).toBeNear(3, { ulps: 1 });
  });
});

describe('checkHeadroom: every limit, by hand', () => {
  const limits = {
    inputCommonModeVolts: { min: 0.2, max: 3.5 },
    inputDifferentialVolts: 0.05,
    firstStageVolts: { min: 0.1, max: 4.9 },
    outputVolts: { min: 0.05, max: 4.95 },
  };

  it('common mode, differential range, first stage and output margins, worst over the points', () => {
    const r = checkHeadroom({
      points: [
        { differentialVolts: -0.03, commonModeVolts: 3.6 },
        { differentialVolts: 0.06, commonModeVolts: 0.3 },
      ],
      gain: 40,
      secondStageGain: 2,
      outputReferenceVolts: 2.5,
      limits,
    });
    const m = byLimit(r.value.margins);
    expect(m['input-common-mode-high']!.marginVolts).toBeNear(-0.1, { abs: 1e-15 });
    expect(m['input-common-mode-low']!.marginVolts).toBeNear(0.1, { abs: 1e-15 });
    expect(m['input-differential']!.marginVolts).toBeNear(-0.01, { abs: 1e-15 });
    // G1 = 20: point 0 nodes 3.6 ∓ 0.3 → 3.3/3.9; point 1 nodes 0.3 ± 0.6 → 0.9/−0.3.
    expect(m['first-stage-low']!.marginVolts).toBeNear(-0.4, { abs: 1e-15 });
    expect(m['first-stage-low']!.pointIndex).toBe(1);
    expect(m['first-stage-high']!.marginVolts).toBeNear(1.0, { abs: 1e-15 });
    // Output 2.5 + 40·Vd: 1.3 V and 4.9 V.
    expect(m['output-high']!.marginVolts).toBeNear(0.05, { abs: 1e-15 });
    expect(m['output-low']!.marginVolts).toBeNear(1.25, { abs: 1e-15 });
    expect(r.issues.map((i) => i.limit).sort()).toEqual([
      'first-stage-low',
      'input-common-mode-high',
      'input-differential',
    ]);
    expect(r.ok).toBe(false);
  });

  it('with no limits there is nothing to violate', () => {
    const r = checkHeadroom({ points: [{ differentialVolts: 10, commonModeVolts: 100 }], gain: 1000 });
    expect(r).toMatchObject({ ok: true, issues: [] });
    expect(r.value.margins).toEqual([]);
  });
});

describe('checkHeadroom: the converter range agrees with the converter’s own codes', () => {
  it('adc-low/high margins are ≥ 0 exactly when the code is strictly inside the rails', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 4, max: 24 }),
        fc.boolean(),
        fc.double({ min: 1, max: 256, noNaN: true }),
        fc.double({ min: -1.05, max: 1.05, noNaN: true }),
        (bits, bipolar, gain, u) => {
          const adc = createAdc({ bits, referenceVolts: 2.5, gain, bipolar });
          const vd = (u * 2.5) / gain;
          const r = checkHeadroom({ points: [{ differentialVolts: vd, commonModeVolts: 2.5 }], gain, adc });
          const m = byLimit(r.value.margins);
          const code = adc.codeFromVolts(vd);
          expect(m['adc-low']!.ok).toBe(code.code > adc.codeMin);
          expect(m['adc-high']!.ok).toBe(code.code < adc.codeMax);
          // Margins agree in sign with the exact decision (clamped only within rounding).
          if (m['adc-low']!.marginVolts > 0) expect(code.code).toBeGreaterThan(adc.codeMin);
          if (m['adc-high']!.marginVolts < 0) expect(code.code).toBe(adc.codeMax);
          expect(r.value.nodes[0]!.quantizerVolts).toBe(gain * vd);
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('checkHeadroom: the converter’s low rail at an exact tie', () => {
  it('at exactly (codeMin + ½)·Vref/s the tie rounds to the even rail code: violated with margin 0', () => {
    const adc = createAdc({ bits: 8, referenceVolts: 128 }); // step 1 V: thresholds −127.5 V and 126.5 V
    const at = checkHeadroom({ points: [{ differentialVolts: -127.5, commonModeVolts: 0 }], gain: 1, adc });
    expect(adc.codeFromVolts(-127.5).code).toBe(-128);
    expect(at.issues.map((i) => i.limit)).toEqual(['adc-low']);
    expect(at.issues[0]!.marginVolts).toBe(0);
    const high = checkHeadroom({ points: [{ differentialVolts: 126.5, commonModeVolts: 0 }], gain: 1, adc });
    expect(adc.codeFromVolts(126.5).code).toBe(126); // 126.5 ties to even 126: not the rail 127
    expect(high.ok).toBe(true);
  });
});

describe('checkHeadroom: bad inputs', () => {
  const point = { differentialVolts: 0.01, commonModeVolts: 2.5 };
  it.each([
    ['no points', { points: [], gain: 1 }, 'invalid-shape', 'points'],
    ['points not an array', { points: point, gain: 1 }, 'invalid-shape', 'points'],
    [
      'a point without common mode',
      { points: [{ differentialVolts: 0 }], gain: 1 },
      'missing-option',
      'points[0].commonModeVolts',
    ],
    [
      'a NaN point',
      { points: [{ ...point, differentialVolts: Number.NaN }], gain: 1 },
      'not-finite',
      'points[0].differentialVolts',
    ],
    ['zero gain', { points: [point], gain: 0 }, 'not-positive', 'gain'],
    [
      'zero second stage',
      { points: [point], gain: 10, secondStageGain: 0 },
      'not-positive',
      'secondStageGain',
    ],
    [
      'NaN reference',
      { points: [point], gain: 10, outputReferenceVolts: Number.NaN },
      'not-finite',
      'outputReferenceVolts',
    ],
    [
      'inverted range',
      { points: [point], gain: 1, limits: { firstStageVolts: { min: 4, max: 1 } } },
      'out-of-range',
      'limits.firstStageVolts.max',
    ],
    [
      'zero differential limit',
      { points: [point], gain: 1, limits: { inputDifferentialVolts: 0 } },
      'not-positive',
      'limits.inputDifferentialVolts',
    ],
    [
      'range without max',
      { points: [point], gain: 1, limits: { outputVolts: { min: 0 } } },
      'missing-option',
      'limits.outputVolts.max',
    ],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => checkHeadroom(options as never)).toThrowBridgeworkError(code, { param });
  });
});
