import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { resolutionBudget, selectGain } from '@bridgework/chain';

const quarter = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
const pga = [1, 2, 4, 8, 16, 32, 64, 128];
const base = {
  excitationVolts: 5,
  adc: { bits: 24, ratiometric: true },
  filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
} as const;
const span = (microstrain: number) => ({
  bridge: quarter,
  strainRange: { min: -microstrain * 1e-6, max: microstrain * 1e-6 },
});

describe('selectGain from a PGA list', () => {
  it('±3000 µε on a quarter bridge (±1.5 mV/V) takes gain 128 (full scale ±7.8 mV/V)', () => {
    const r = selectGain({ ...base, span: span(3000), gains: pga });
    expect(r.ok).toBe(true);
    expect(r.value.gain).toBe(128);
    expect(r.value.candidates.map((c) => c.fitsHeadroom)).toEqual(pga.map(() => true));
    // Resolution improves with every step up here (quantization falls as 1/G).
    const rms = r.value.candidates.map((c) => c.rmsResolution);
    for (let i = 1; i < rms.length; i++) expect(rms[i]).toBeLessThan(rms[i - 1]!);
    const direct = resolutionBudget({ ...base, span: span(3000), gain: 128 }).value;
    expect(r.value.budget.noise.totalRmsVolts).toBe(direct.noise.totalRmsVolts);
    expect(r.value.budget.resolution).toEqual(direct.resolution);
  });

  it('±20 000 µε clips the converter at 128 (−20 000 µε is −10.2 mV/V) and takes 64', () => {
    // By hand: x = GF·ε = −0.04 gives −0.04/3.92 = −0.010204 V/V, beyond −1/128 = −0.0078125 V/V.
    const r = selectGain({ ...base, span: span(20000), gains: pga });
    expect(r.value.gain).toBe(64);
    const at128 = r.value.candidates[7]!;
    expect(at128.fitsHeadroom).toBe(false);
    expect(at128.issues.map((i) => i.limit)).toEqual(['adc-low', 'adc-high']);
    // The low margin at the quantizer: 128·5·(−0.010204) V against −5 V (plus half a step).
    expect(at128.issues[0]!.marginVolts).toBeNear(128 * 5 * (-0.04 / 3.92) + 5 - 5 / 2 ** 24, { rel: 1e-12 });
  });

  it('an amplifier output swing can bind before the converter', () => {
    // Output 2.5 V ± G·Vd must stay in 1–4 V: G ≤ 1.5/|Vd|; at ±5000 µε |Vd| ≤ 12.56 mV → G ≤ 119.
    const r = selectGain({
      ...base,
      span: span(5000),
      gains: pga,
      amplifier: { outputReferenceVolts: 2.5, limits: { outputVolts: { min: 1, max: 4 } } },
    });
    expect(r.value.gain).toBe(64);
    expect(r.value.candidates[7]!.issues.map((i) => i.limit)).toEqual(['output-low', 'output-high']);
  });

  it('breaks ties toward the lower gain (same resolution, more headroom)', () => {
    // A converter noise that falls exactly as 1/G keeps the input-referred noise ≈ constant, so…
    // here the converter noise is constant and dominant, and no other term depends on the gain.
    const r = selectGain({
      ...base,
      span: span(1000),
      gains: [32, 16, 64],
      adc: { ...base.adc, noiseRmsVolts: 1e-6 },
    });
    expect(r.value.gain).toBe(16);
  });

  it('with no gain fitting, returns the lowest with ok: false and its issues', () => {
    const r = selectGain({
      ...base,
      span: span(1000),
      gains: [8, 4, 16],
      amplifier: { limits: { inputCommonModeVolts: { min: 0, max: 2 } } }, // the bridge sits at 2.5 V
    });
    expect(r.ok).toBe(false);
    expect(r.value.gain).toBe(4);
    expect(r.issues.map((i) => i.limit)).toEqual(['input-common-mode-high']);
  });
});

describe('selectGain over a continuous range', () => {
  it('takes the largest gain that keeps the converter off its rails, equal to the bound by hand', () => {
    const r = selectGain({ ...base, span: span(20000), gains: { min: 1, max: 1000 } });
    // The negative end binds: G·ratio(−ε)·2^23 ≥ −2^23 + ½ ⇒ G ≤ (1 − 2^−24)/|ratio(−ε)|.
    const bound = (1 - 2 ** -24) / (0.04 / 3.92);
    expect(r.ok).toBe(true);
    expect(r.value.gain).toBeNear(bound, { rel: 1e-12 });
    expect(r.value.feasibleGains!.max).toBeNear(bound, { rel: 1e-12 });
    expect(r.value.budget.points[0]!.adcCode.atRail).toBe(false);
    expect(r.value.budget.points[0]!.adcCode.code).toBe(-(2 ** 23) + 1);
    // A hair above the bound, the converter reads its rail.
    expect(
      resolutionBudget({ ...base, span: span(20000), gain: bound * (1 + 1e-9) }).issues.map((i) => i.limit),
    ).toEqual(['adc-low']);
  });

  it('a first-stage limit: G ≤ 2·G2·(max − Vcm)/|Vd| for the node rising with the signal', () => {
    const r = selectGain({
      ...base,
      span: span(3000),
      gains: { min: 1, max: 1000 },
      amplifier: { secondStageGain: 2, limits: { firstStageVolts: { min: 2, max: 3 } } },
    });
    const points = r.value.budget.points;
    // Each node Vcm ± (G/2)·Vd/2 must stay in 2–3 V at both ends of the span, well below the
    // converter's bound (1 − 2^−24)/(0.006/3.988) ≈ 664.7. By hand at −3000 µε: R1 = 347.9 Ω,
    // V(S−) = 5·350/697.9 = 2.50752 V, Vcm = 2.50376 V, |Vd| = 5·0.006/3.988 = 7.5226 mV, so the
    // rising node reaches 3 V at G = 4·(3 − 2.50376)/0.0075226 = 263.87.
    const bound = Math.min(
      ...points
        .filter((p) => p.differentialVolts !== 0)
        .flatMap((p) => [
          (4 * (3 - p.commonModeVolts)) / Math.abs(p.differentialVolts),
          (4 * (p.commonModeVolts - 2)) / Math.abs(p.differentialVolts),
        ]),
    );
    expect(bound).toBeNear(263.87, { abs: 0.01 });
    expect(bound).toBeLessThan((1 - 2 ** -24) / (0.006 / 3.988));
    expect(r.value.gain).toBeNear(bound, { rel: 1e-12 });
    expect(r.ok).toBe(true);
  });

  it('a range entirely above the feasible gains returns its minimum with ok: false', () => {
    const r = selectGain({ ...base, span: span(20000), gains: { min: 200, max: 400 } });
    expect(r.ok).toBe(false);
    expect(r.value.gain).toBe(200);
    expect(r.value.feasibleGains).toBeUndefined();
  });
});

describe('selectGain: bad inputs', () => {
  it.each([
    ['an empty list', [], 'invalid-shape', 'gains'],
    ['a zero gain', [1, 0], 'not-positive', 'gains[1]'],
    ['a NaN gain', [Number.NaN], 'not-finite', 'gains[0]'],
    ['an inverted range', { min: 10, max: 1 }, 'out-of-range', 'gains.max'],
    ['a range without min', { max: 10 }, 'missing-option', 'gains.min'],
    ['no gains', undefined, 'missing-option', 'options.gains'],
  ] as const)('%s → %s', (_name, gains, code, param) => {
    expect(() => selectGain({ ...base, span: span(1000), gains } as never)).toThrowBridgeworkError(code, {
      param,
    });
  });
});
