/**
 * designFirmwareConstants: the cheapest function per type whose total error against the exact map
 * meets the target, the total checked here against the exact map computed independently in
 * decimal.js at every code, the refusal of targets no form meets, and "proved" only where every
 * code was evaluated.
 */
import { describe, expect, it } from 'vitest';
import {
  designFirmwareConstants,
  emitCHeader,
  firmwareCost,
  type DesignFirmwareConstantsOptions,
  type EvaluatorType,
  type FirmwareChannel,
} from '@bridgework/firmware';
import { exactDecimalString } from '@bridgework/core';
import { D } from './support/reference.js';

/**
 * A linear-fractional map with 8 % curvature over 2^16 codes (the shape of a quarter bridge read
 * ratiometrically): q(c) = 3000·x/(1 + 0.08·x), x = c/2^15.
 */
const SPAN = { codeMin: -(2 ** 15), codeMax: 2 ** 15 - 1 };
const q64 = (c: number) => (3000 * (c / 32768)) / (1 + 0.08 * (c / 32768));
const qExact = (c: number) => new D(3000).times(c).div(new D(32768).plus(new D('0.08').times(c)));
/**
 * The binary64 reference's own error: c/2^15 and 3000·x are exact; 0.08 (stored with relative
 * error u), the product, the sum and the quotient add at most 4u relative to a denominator ≥ 0.92,
 * so |q64 − q| ≤ 5u·|q|/0.92 < 8u·3300 (u = 2^−53): an a priori bound, in the style of Higham §3.
 */
const R = 8 * 2 ** -53 * 3300;
const reference = { bound: R, source: 'an a priori bound of the binary64 formula (test)' };

const exactOf = (x: number) => new D(exactDecimalString(x));

let exactValues: InstanceType<typeof D>[] | undefined;

/** Largest |function − exact| over every code, in decimal.js. */
function observed(ch: FirmwareChannel, type: EvaluatorType, unit = 1): number {
  const map = ch[type]!;
  exactValues ??= Array.from({ length: SPAN.codeMax - SPAN.codeMin + 1 }, (_, i) => qExact(SPAN.codeMin + i));
  let worst = 0;
  for (let c = SPAN.codeMin; c <= SPAN.codeMax; c++) {
    const y = type === 'fixed' ? new D(map.evaluate(c)).times(unit) : exactOf(map.evaluate(c));
    const e = y
      .minus(exactValues[c - SPAN.codeMin]!)
      .abs()
      .toNumber();
    if (e > worst) worst = e;
  }
  return worst;
}

const base: DesignFirmwareConstantsOptions = {
  name: 'curve',
  exact: q64,
  referenceError: reference,
  ...SPAN,
  quantityUnit: 'N',
  targetError: 0.02,
  outputUnit: '0.01',
};

describe('designFirmwareConstants: the cheapest form meeting the target, total error against the exact map', () => {
  const design = designFirmwareConstants(base);

  it('meets 0.02 N in every type with a nonlinear form (the best line is off by 121 N)', () => {
    for (const t of ['fixed', 'float32', 'float64'] as const) {
      const total = design.totals![t]!;
      expect(total.bound).toBeLessThanOrEqual(0.02);
      expect(total.proved).toBe(true);
      expect(total.method).toBe('exhaustive');
      expect(total.codesChecked).toBe(2 ** 16);
      expect(design[t]!.kind).toBe('piecewise-polynomial');
      // The stated total is what was measured against the reference plus the reference's own error.
      expect(total.bound).toBeNear(total.againstReference + R, { rel: 1e-12 });
      expect(total.referenceError).toBe(R);
    }
  });

  it('states bounds that hold against the exact map at every code (decimal.js) and are tight: ≤ 2× observed', () => {
    for (const t of ['fixed', 'float32', 'float64'] as const) {
      const seen = observed(design, t, 0.01);
      const total = design.totals![t]!;
      expect(seen, t).toBeLessThanOrEqual(total.bound);
      expect(total.bound, t).toBeLessThanOrEqual(2 * seen);
      // The parts: each part bounds its own difference; their sum bounds the total.
      expect(total.bound).toBeLessThanOrEqual(total.approximation + total.arithmetic + R + 1e-9);
    }
  });

  it('returns test vectors at both rails, the worst codes and segment edges, with each function’s result', () => {
    const v = design.testVectors!;
    const codes = v.map((x) => x.code);
    expect(codes).toContain(SPAN.codeMin);
    expect(codes).toContain(SPAN.codeMax);
    for (const t of ['fixed', 'float32', 'float64'] as const)
      expect(codes).toContain(design.totals![t]!.worstCode);
    expect(v.some((x) => x.reason === 'segment-edge')).toBe(true);
    for (const x of v) {
      expect(x.exact).toBe(q64(x.code));
      expect(x.fixed).toBe(design.fixed!.evaluate(x.code));
      expect(x.float32).toBe(design.float32!.evaluate(x.code));
      expect(x.float64).toBe(design.float64!.evaluate(x.code));
    }
  });

  it('chooses the affine form whenever it meets the target, and a nonlinear one only when it must', () => {
    // q is concave (q'' = −480·3000/(2^15·(1 + 0.08x))^3·… < 0), so the best uniform line misses it
    // by half the largest gap between q and its chord (Chebyshev equioscillation at both ends and
    // one interior point; common practice).
    const chord = (c: number) =>
      q64(SPAN.codeMin) +
      ((q64(SPAN.codeMax) - q64(SPAN.codeMin)) * (c - SPAN.codeMin)) / (SPAN.codeMax - SPAN.codeMin);
    let gap = 0;
    for (let c = SPAN.codeMin; c <= SPAN.codeMax; c++) gap = Math.max(gap, Math.abs(q64(c) - chord(c)));
    const loose = designFirmwareConstants({ ...base, targetError: 200, outputUnit: '1' });
    for (const t of ['fixed', 'float32', 'float64'] as const) expect(loose[t]!.kind).toBe('affine');
    const lineError = loose.totals!.float64!.approximation;
    expect(lineError).toBeNear(gap / 2, { rel: 1e-6 });
    const tight = designFirmwareConstants({
      ...base,
      targetError: lineError * 0.9,
      outputUnit: '1',
      types: ['float64'],
    });
    expect(tight.float64!.kind).not.toBe('affine');
  });

  it('uses the Möbius form where the target divides in hardware and it is cheapest', () => {
    const d = designFirmwareConstants({
      ...base,
      targetError: 1e-6,
      types: ['float64'],
      hardwareDivide: true,
    });
    expect(d.float64!.kind).toBe('mobius');
    expect(firmwareCost(d.float64!).divisions).toBe(1);
    const seen = observed(d, 'float64');
    expect(seen).toBeLessThanOrEqual(d.totals!.float64!.bound);
    // Without a divider a piecewise polynomial meets the same target, at a larger cost.
    const noDivide = designFirmwareConstants({ ...base, targetError: 1e-6, types: ['float64'] });
    expect(noDivide.float64!.kind).toBe('piecewise-polynomial');
    expect(firmwareCost(noDivide.float64!).cost).toBeGreaterThan(firmwareCost(d.float64!).cost);
  });

  it('calls a sampled bound measured, never proved, and states it as approximation plus arithmetic', () => {
    const d = designFirmwareConstants({ ...base, verification: 'sampled', types: ['float32'] });
    const total = d.totals!.float32!;
    expect(total.proved).toBe(false);
    expect(total.method).toBe('sampled');
    expect(total.bound).toBeGreaterThanOrEqual(total.approximation + total.arithmetic);
    const unwrap = (text: string) => text.replace(/\n \* /g, ' ');
    const header = unwrap(emitCHeader({ channels: [d], prefix: 'sampled' }));
    expect(header).toContain('measured, not proved');
    expect(header).not.toMatch(/(?<!not )proved:/);
    const proved = unwrap(emitCHeader({ channels: [design], prefix: 'proved' }));
    expect(proved).toContain('proved: every one of the 65536 codes was evaluated');
    expect(proved).not.toContain('measured, not proved');
  });

  it('refuses a target no form meets, naming the best bound reached (1e-9 N in 16-bit coefficients)', () => {
    const attempt = () =>
      designFirmwareConstants({
        ...base,
        targetError: 1e-9,
        coefficientBits: 16,
        outputUnit: '1e-10',
        types: ['fixed'],
      });
    expect(attempt).toThrowBridgeworkError('out-of-range', { param: 'targetError' });
    try {
      attempt();
    } catch (e) {
      const err = e as { message: string; limit: number };
      expect(err.message).toMatch(
        /cannot be met by a fixed function: (the best bound reached is \d|no fixed function can do better than \d|no candidate form fits 16-bit coefficients and int32 outputs at an output step of 1e-10 N)/,
      );
      expect(err.limit).toBeGreaterThan(1e-9);
    }
    // A float32 function cannot reach 1e-9 N either: half an ulp of 3000 N is 1.2e-4 N.
    try {
      designFirmwareConstants({ ...base, targetError: 1e-9, types: ['float32'] });
      expect.unreachable();
    } catch (e) {
      const err = e as { message: string; limit: number; code: string };
      expect(err.code).toBe('out-of-range');
      expect(err.message).toMatch(/the best bound reached is [\d.e-]+ N \(/);
      expect(err.limit).toBeGreaterThan(6e-5);
    }
    // Fixed point cannot beat half an output step.
    expect(() =>
      designFirmwareConstants({ ...base, targetError: 0.004, outputUnit: '0.01', types: ['fixed'] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'targetError' });
  });

  it('keeps within the table limit and a 32-bit accumulator when asked', () => {
    const d = designFirmwareConstants({
      ...base,
      maxTableBytes: 256,
      accumulatorBits: 32,
      types: ['fixed', 'float32'],
    });
    expect(firmwareCost(d.fixed!).tableBytes).toBeLessThanOrEqual(256);
    expect(firmwareCost(d.float32!).tableBytes).toBeLessThanOrEqual(256);
    expect(firmwareCost(d.fixed!).libraryCalls).toBe('none');
    // Not a map, or an edited one: a typed error, never a NaN count (issue 15 fuzz).
    expect(() => firmwareCost(null as never)).toThrowBridgeworkError('wrong-type', { param: 'map' });
    expect(() => firmwareCost({ ...d.fixed!, degree: Number.NaN } as never)).toThrowBridgeworkError(
      'not-finite',
      { param: 'map.degree' },
    );
  });

  it.each([
    ['options.targetErorr', { targetErorr: 1 }, 'unknown-option'],
    ['targetError', { targetError: undefined }, 'missing-option'],
    ['targetError', { targetError: 0 }, 'not-positive'],
    ['targetError', { targetError: Number.NaN }, 'not-finite'],
    ['outputUnit', { outputUnit: undefined, types: ['fixed'] }, 'missing-option'],
    ['exact', { exact: 3 }, 'wrong-type'],
    ['exact', { exact: () => Number.NaN }, 'model-not-finite'],
    ['referenceError.bound', { referenceError: { bound: -1, source: 'x' } }, 'negative'],
    ['referenceError.source', { referenceError: { bound: 0 } }, 'missing-option'],
    ['types[0]', { types: ['double'] }, 'invalid-option'],
    ['accumulatorBits', { accumulatorBits: 48 }, 'invalid-option'],
    ['hardwareDivide', { hardwareDivide: 'yes' }, 'wrong-type'],
    ['maxTableBytes', { maxTableBytes: 8 }, 'out-of-range'],
    ['codeMax', { codeMax: -(2 ** 16) }, 'out-of-range'],
  ] as const)('%s: %o → %s', (param, patch, code) => {
    expect(() =>
      designFirmwareConstants({
        ...base,
        types: ['float64'],
        verification: 'sampled',
        ...patch,
      } as unknown as DesignFirmwareConstantsOptions),
    ).toThrowBridgeworkError(code, { param });
  });
});
