import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { exactDecimalString } from '@bridgework/core';
import {
  coverageFactor,
  normalQuantile,
  studentTQuantile,
  welchSatterthwaite,
} from '@bridgework/uncertainty';
import { erfc, logGamma, studentUpperQuantile, studentUpperTail } from '../src/internal/special.js';

const D = Decimal.clone({ precision: 50, rounding: Decimal.ROUND_HALF_EVEN });
const X = (x: number) => new D(exactDecimalString(x));
const pi = D.acos(-1);
const math = create(all as NonNullable<typeof all>, {});

/**
 * erfc(z) to 50 significant digits: below z = 5 from the Maclaurin series of erf (A&S 7.1.5),
 * with 0.87·z² extra digits to absorb the series' cancellation (terms grow to e^(z²) while erfc
 * shrinks like e^(−z²)); from z = 5 the continued fraction of A&S 7.1.14, evaluated bottom-up
 * over 400 levels (ample: at z ≥ 5 it converges to 50 digits in far fewer).
 */
function erfcRef(zIn: Decimal): Decimal {
  if (zIn.gte(5)) {
    let k = new D(0);
    for (let n = 400; n >= 1; n--) k = new D(n).div(2).div(zIn.plus(k));
    return zIn
      .pow(2)
      .neg()
      .exp()
      .div(pi.sqrt().times(zIn.plus(k)));
  }
  const Dz = Decimal.clone({
    precision: 50 + Math.ceil(0.87 * zIn.toNumber() ** 2),
    rounding: Decimal.ROUND_HALF_EVEN,
  });
  const z = new Dz(zIn);
  let sum = new Dz(0);
  let term = z;
  for (let n = 0; n < 5000; n++) {
    const t = term.div(2 * n + 1);
    sum = sum.plus(t);
    if (t.abs().lt(new Dz(10).pow(-Dz.precision))) break;
    term = term
      .times(z.pow(2))
      .div(n + 1)
      .neg();
  }
  return new D(new Dz(1).minus(sum.times(2).div(Dz.acos(-1).sqrt())));
}

/**
 * A(t|ν) = P(|T| ≤ t) for integer ν by the exact finite series of Abramowitz & Stegun 26.7.3
 * (odd ν) and 26.7.4 (even ν), at 50 digits, with θ = atan(t/√ν).
 */
function studentTwoSided(t: number, nu: number): Decimal {
  const theta = X(t).div(new D(nu).sqrt()).atan();
  const c = theta.cos();
  const s = theta.sin();
  if (nu % 2 === 0) {
    let term = new D(1);
    let sum = new D(1);
    for (let k = 2; k <= nu - 2; k += 2) {
      term = term
        .times(c.pow(2))
        .times(k - 1)
        .div(k);
      sum = sum.plus(term);
    }
    return s.times(sum);
  }
  if (nu === 1) return theta.times(2).div(pi);
  let term = c;
  let sum = c;
  for (let k = 3; k <= nu - 2; k += 2) {
    term = term
      .times(c.pow(2))
      .times(k - 1)
      .div(k);
    sum = sum.plus(term);
  }
  return theta.plus(s.times(sum)).times(2).div(pi);
}

describe('special functions', () => {
  it('logGamma matches exact factorials and Γ(n + ½) = (2n)!√π/(4ⁿn!)', () => {
    let factorial = new D(1);
    for (let n = 1; n <= 60; n++) {
      if (n > 1) factorial = factorial.times(n - 1);
      expect(logGamma(n)).toBeNear(factorial.ln().toNumber(), { rel: 1e-15, abs: 4e-15 });
    }
    for (let n = 0; n <= 40; n++) {
      let f2n = new D(1);
      for (let k = 2; k <= 2 * n; k++) f2n = f2n.times(k);
      let fn = new D(1);
      for (let k = 2; k <= n; k++) fn = fn.times(k);
      const exact = f2n.times(pi.sqrt()).div(new D(4).pow(n).times(fn));
      expect(logGamma(n + 0.5)).toBeNear(exact.ln().toNumber(), { rel: 1e-15, abs: 4e-15 });
    }
  });

  it('erfc is within 4e-15 relative of 50-digit references from 0 to 26', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 26, noNaN: true }), (z) => {
        expect(erfc(z)).toBeNear(erfcRef(X(z)).toNumber(), { rel: 4e-15 });
      }),
      { numRuns: 150 },
    );
  });
});

describe('normalQuantile', () => {
  it('gives the familiar quantiles', () => {
    // Φ⁻¹(0.975) = 1.959963984540054…, Φ⁻¹(0.995) = 2.575829303548901… (tables, from memory).
    expect(normalQuantile(0.975)).toBeNear(1.959963984540054, { ulps: 2 });
    expect(normalQuantile(0.995)).toBeNear(2.575829303548901, { ulps: 4 });
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(0.25)).toBe(-normalQuantile(0.75)); // 1 − 0.75 is exact, so the tails are the same
  });

  it('inverts Φ: the 50-digit Φ(z) at the returned z equals p, deep into the tail', () => {
    // d(ln Φ)/dz ≈ |z| in the tail, so a z within 2 ulps (2·2.2e-16·|z|) moves Φ by up to
    // 4.4e-16·z² relative: that floor is added to 1e-14.
    const tol = (z: number) => ({ rel: 1e-14 + 4.4e-16 * z * z });
    fc.assert(
      fc.property(fc.double({ min: 1e-40, max: 0.5, noNaN: true }), (p) => {
        const z = normalQuantile(p);
        expect(
          erfcRef(X(-z).div(new D(2).sqrt()))
            .div(2)
            .toNumber(),
        ).toBeNear(p, tol(z));
      }),
      { numRuns: 100 },
    );
    for (const p of [1e-100, 1e-300]) {
      const z = normalQuantile(p);
      expect(
        erfcRef(X(-z).div(new D(2).sqrt()))
          .div(2)
          .toNumber(),
      ).toBeNear(p, tol(z));
    }
    // Upper probabilities: Φ(z) = p ⇔ the upper tail is 1 − p (exact in doubles for p ≥ ½).
    for (const p of [0.6, 0.9, 0.975, 0.999999]) {
      const z = normalQuantile(p);
      expect(
        erfcRef(X(z).div(new D(2).sqrt()))
          .div(2)
          .toNumber(),
      ).toBeNear(1 - p, { rel: 1e-13 });
    }
  });

  it('rejects probabilities outside (0, 1)', () => {
    expect(() => normalQuantile(0)).toThrowBridgeworkError('out-of-range', { param: 'probability' });
    expect(() => normalQuantile(1)).toThrowBridgeworkError('out-of-range', { param: 'probability' });
    expect(() => normalQuantile(NaN)).toThrowBridgeworkError('not-finite', { param: 'probability' });
    expect(() => normalQuantile('0.5' as unknown as number)).toThrowBridgeworkError('wrong-type', {
      param: 'probability',
    });
  });
});

describe('studentTQuantile and coverageFactor', () => {
  it('solve the exact finite series of A&S 26.7.3/26.7.4 to 1e-12 for ν = 1 … 30 and beyond', () => {
    for (const nu of [...Array.from({ length: 30 }, (_, i) => i + 1), 40, 61, 100, 250, 999]) {
      for (const coverage of nu <= 30 ? [0.6827, 0.9, 0.95, 0.99, 0.9973] : [0.95, 0.99]) {
        const k = coverageFactor(coverage, nu);
        // 1 − A(k|ν) is the two-sided tail 1 − p; compare it relatively.
        const tail = new D(1).minus(studentTwoSided(k, nu)).toNumber();
        expect(tail).toBeNear(1 - coverage, { rel: 1e-12 });
      }
    }
  });

  it('reproduces JCGM 100 Table G.2 (t_p(ν) to the printed digits)', () => {
    // JCGM 100:2008 Table G.2 (from memory), columns p = 68.27, 90, 95, 95.45, 99, 99.73 %.
    const table: [number, number[]][] = [
      [1, [1.84, 6.31, 12.71, 13.97, 63.66, 235.8]],
      [2, [1.32, 2.92, 4.3, 4.53, 9.92, 19.21]],
      [3, [1.2, 2.35, 3.18, 3.31, 5.84, 9.22]],
      [4, [1.14, 2.13, 2.78, 2.87, 4.6, 6.62]],
      [5, [1.11, 2.02, 2.57, 2.65, 4.03, 5.51]],
      [6, [1.09, 1.94, 2.45, 2.52, 3.71, 4.9]],
      [7, [1.08, 1.89, 2.36, 2.43, 3.5, 4.53]],
      [8, [1.07, 1.86, 2.31, 2.37, 3.36, 4.28]],
      [9, [1.06, 1.83, 2.26, 2.32, 3.25, 4.09]],
      [10, [1.05, 1.81, 2.23, 2.28, 3.17, 3.96]],
      [20, [1.03, 1.72, 2.09, 2.13, 2.85, 3.42]],
      [50, [1.01, 1.68, 2.01, 2.05, 2.68, 3.16]],
    ];
    const ps = [0.6827, 0.9, 0.95, 0.9545, 0.99, 0.9973];
    for (const [nu, row] of table) {
      row.forEach((printed, j) =>
        expect(coverageFactor(ps[j]!, nu)).toBeNear(printed, { abs: nu === 1 && j === 5 ? 0.05 : 0.005 }),
      );
    }
    // ν = 100 and ∞ are printed to three decimals.
    [1.005, 1.66, 1.984, 2.025, 2.626, 3.077].forEach((printed, j) =>
      expect(coverageFactor(ps[j]!, 100)).toBeNear(printed, { abs: 5e-4 }),
    );
    [1.0, 1.645, 1.96, 2.0, 2.576, 3.0].forEach((printed, j) =>
      expect(coverageFactor(ps[j]!)).toBeNear(printed, { abs: 5e-4 }),
    );
  });

  it('handles non-integer ν: the tail integrates the density (Simpson, 1e-11) and k decreases with ν', () => {
    // Density with mathjs's gamma function: Γ((ν+1)/2)/(√(νπ)Γ(ν/2))·(1 + t²/ν)^(−(ν+1)/2).
    for (const nu of [0.5, 2.5, 7.3, 33.3]) {
      const c =
        (math.gamma((nu + 1) / 2) as number) / (Math.sqrt(nu * Math.PI) * (math.gamma(nu / 2) as number));
      const pdf = (t: number): number => c * (1 + (t * t) / nu) ** (-(nu + 1) / 2);
      const t = nu < 1 ? 3 : studentTQuantile(0.975, nu);
      const n = 20000;
      const h = t / n;
      let integral = pdf(0) + pdf(t);
      for (let i = 1; i < n; i++) integral += (i % 2 === 1 ? 4 : 2) * pdf(i * h);
      integral *= h / 3;
      expect(0.5 - studentUpperTail(t, nu)).toBeNear(integral, { abs: 1e-11 });
    }
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 500, noNaN: true }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (nu, dnu) => {
          expect(coverageFactor(0.95, nu)).toBeGreaterThan(coverageFactor(0.95, nu + dnu));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('joins the Cornish–Fisher expansion above ν = 1000: its quantile solves the beta tail to 1e-11', () => {
    for (const alpha of [0.025, 0.005, 0.1587]) {
      const byExpansion = studentUpperQuantile(alpha, 1000.5);
      expect(studentUpperTail(byExpansion, 1000.5)).toBeNear(alpha, { rel: 1e-11 });
      expect(studentUpperQuantile(alpha, 1000)).toBeNear(byExpansion, { rel: 1e-6 }); // neighbouring ν
    }
    // Far out the quantile approaches z + (z³ + z)/(4ν) (the first Cornish–Fisher term).
    const z = coverageFactor(0.95);
    expect(coverageFactor(0.95, 1e12) - z).toBeNear((z ** 3 + z) / 4e12, { rel: 1e-3 });
  });

  it('gives the quantile, not just the coverage factor, and rejects bad arguments', () => {
    // t₀.₉₇₅(9) = 2.26215716280 (the exact series A&S 26.7.3 at this t gives a tail of 0.025, above).
    expect(studentTQuantile(0.975, 9)).toBeNear(2.2621571628, { abs: 1e-10 });
    expect(studentTQuantile(0.975, 9)).toBe(coverageFactor(0.95, 9));
    expect(studentTQuantile(0.25, 9)).toBe(-studentTQuantile(0.75, 9));
    expect(studentTQuantile(0.75, 1)).toBeNear(1, { ulps: 2 }); // Cauchy: tan(π/4)
    expect(studentTQuantile(0.975, 2)).toBeNear(0.95 / Math.sqrt(2 * 0.975 * 0.025), { ulps: 4 }); // closed form
    expect(() => studentTQuantile(0.9, 0)).toThrowBridgeworkError('not-positive', {
      param: 'degreesOfFreedom',
    });
    expect(() => studentTQuantile(1.5, 3)).toThrowBridgeworkError('out-of-range', { param: 'probability' });
    expect(() => coverageFactor(0.95, -1)).toThrowBridgeworkError('not-positive', {
      param: 'degreesOfFreedom',
    });
    expect(() => coverageFactor(0, 3)).toThrowBridgeworkError('out-of-range', { param: 'coverage' });
    expect(() => coverageFactor(Infinity)).toThrowBridgeworkError('not-finite', { param: 'coverage' });
  });
});

describe('welchSatterthwaite', () => {
  it('computes ν_eff = u_c⁴/Σ uᵢ⁴/νᵢ (by hand: 0.5⁴/(0.3⁴/4) = 30.864…)', () => {
    const components = [
      { contribution: 0.3, degreesOfFreedom: 4 },
      { contribution: 0.4, degreesOfFreedom: Infinity },
    ];
    expect(welchSatterthwaite({ components })).toBeNear(0.0625 / (0.0081 / 4), { rel: 1e-15 });
    // With a combined uncertainty that includes a correlation term:
    expect(welchSatterthwaite({ components, combinedStandardUncertainty: 0.6 })).toBeNear(
      0.1296 / (0.0081 / 4),
      { rel: 1e-15 },
    );
    expect(welchSatterthwaite({ components: [{ contribution: 1, degreesOfFreedom: Infinity }] })).toBe(
      Infinity,
    );
    expect(welchSatterthwaite({ components: [] })).toBe(Infinity);
  });

  it('lies between min νᵢ and Σ νᵢ for uncorrelated components (properties of the formula)', () => {
    const component = fc.record({
      contribution: fc.double({ min: 1e-6, max: 1e3, noNaN: true }),
      degreesOfFreedom: fc.double({ min: 1, max: 1e4, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(component, { minLength: 1, maxLength: 8 }), (components) => {
        const nu = welchSatterthwaite({ components });
        expect(nu).toBeGreaterThanOrEqual(
          Math.min(...components.map((c) => c.degreesOfFreedom)) * (1 - 1e-12),
        );
        expect(nu).toBeLessThanOrEqual(components.reduce((a, c) => a + c.degreesOfFreedom, 0) * (1 + 1e-12));
      }),
      { numRuns: 300 },
    );
  });

  it('rejects bad components', () => {
    expect(() => welchSatterthwaite({ components: 3 as never })).toThrowBridgeworkError('wrong-type', {
      param: 'components',
    });
    expect(() =>
      welchSatterthwaite({ components: [{ contribution: -1, degreesOfFreedom: 3 }] }),
    ).toThrowBridgeworkError('negative', {
      param: 'components[0].contribution',
    });
    expect(() =>
      welchSatterthwaite({ components: [{ contribution: 1, degreesOfFreedom: 0 }] }),
    ).toThrowBridgeworkError('not-positive', {
      param: 'components[0].degreesOfFreedom',
    });
    expect(() =>
      welchSatterthwaite({ components: [{ contribution: NaN, degreesOfFreedom: 2 }] }),
    ).toThrowBridgeworkError('not-finite', {
      param: 'components[0].contribution',
    });
    expect(() =>
      welchSatterthwaite({
        components: [{ contribution: 1, degreesOfFreedom: 2 }],
        combinedStandardUncertainty: -1,
      }),
    ).toThrowBridgeworkError('negative', { param: 'combinedStandardUncertainty' });
  });
});
