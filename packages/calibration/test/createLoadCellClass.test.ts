import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createLoadCellClass, loadCellAccuracyClasses } from '@bridgework/calibration';

// A C3 cell with v = 1 kg (Emax 3000 kg, nLC 3000), so loads in kg are loads in v.
const c3 = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 3000 });

describe('OIML R 60 mpe', () => {
  it('class C, pLC 0.7: 0.35 v up to 500 v, 0.70 v to 2000 v, 1.05 v above (issue values, R 60-1:2021 Table 4)', () => {
    // pLC × (0.5, 1.0, 1.5) v: 0.7·0.5 = 0.35, 0.7·1.0 = 0.70, 0.7·1.5 = 1.05 (products rounded once).
    for (const load of [0, 1, 250, 499.9, 500]) expect(c3.mpe(load)).toBeNear(0.35, { ulps: 1 });
    for (const load of [500.001, 1000, 2000]) expect(c3.mpe(load)).toBeNear(0.7, { ulps: 1 });
    for (const load of [2000.001, 2500, 3000]) expect(c3.mpe(load)).toBeNear(1.05, { ulps: 1 });
    expect(c3.mpeInIntervals(3000)).toBeNear(1.05, { ulps: 1 });
    expect(c3.pLC).toBe(0.7);
    expect(c3.verificationInterval).toBe(1);
  });

  it('scales with v and counts loads from Dmin: Emax 50 kg, C3, Dmin 5 kg, Dmax 50 kg', () => {
    // v = (50 − 5)/3000 = 0.015 kg. 500 v above Dmin is 5 + 7.5 = 12.5 kg; 2000 v is 35 kg.
    const cell = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 50, minLoad: 5 });
    expect(cell.verificationInterval).toBeNear(0.015, { ulps: 1 });
    expect(cell.mpe(12.5)).toBeNear(0.35 * 0.015, { rel: 1e-15 });
    expect(cell.mpe(12.6)).toBeNear(0.7 * 0.015, { rel: 1e-15 });
    expect(cell.mpe(35)).toBeNear(0.7 * 0.015, { rel: 1e-15 });
    expect(cell.mpe(35.01)).toBeNear(1.05 * 0.015, { rel: 1e-15 });
  });

  it('treats a load that rounds just past a band edge as on the edge', () => {
    // Emax 10 kg, nLC 3000: 500 v = 10/6 kg, which is not a double; both neighbours of the double
    // nearest 5/3 still get the lower band.
    const cell = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 10 });
    const edge = 10 / 6;
    for (const load of [edge, edge * (1 + Number.EPSILON), edge * (1 - Number.EPSILON)]) {
      expect(cell.mpeInIntervals(load)).toBeNear(0.35, { ulps: 1 });
    }
    expect(cell.mpeInIntervals(edge * (1 + 1e-9))).toBeNear(0.7, { ulps: 1 });
  });

  it('classes A, B, D with their recalled band edges (from memory; R 76 instrument bands)', () => {
    // A: 50 000 / 200 000 v; B: 5 000 / 20 000 v; D: 50 / 200 v. v = 1 by choosing Emax = nLC.
    const edges = { A: [50_000, 200_000, 300_000], B: [5_000, 20_000, 50_000], D: [50, 200, 1000] } as const;
    for (const [accuracyClass, [first, second, nLC]] of Object.entries(edges) as [
      'A' | 'B' | 'D',
      readonly [number, number, number],
    ][]) {
      const cell = createLoadCellClass({ accuracyClass, nLC, maxCapacity: nLC, pLC: 1 });
      expect(cell.mpe(first)).toBe(0.5);
      expect(cell.mpe(first + 1)).toBe(1);
      expect(cell.mpe(second)).toBe(1);
      expect(cell.mpe(second + 1)).toBe(1.5);
    }
  });

  it('is pLC times the pLC = 1 value at every load, for every class (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...loadCellAccuracyClasses),
        fc.integer({ min: 100, max: 200_000 }),
        fc.double({ min: 0.3, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (accuracyClass, nLC, pLC, fraction) => {
          const unit = createLoadCellClass({ accuracyClass, nLC, maxCapacity: 1000, pLC: 1 });
          const cell = createLoadCellClass({ accuracyClass, nLC, maxCapacity: 1000, pLC });
          const load = 1000 * fraction;
          expect(cell.mpe(load)).toBeNear(pLC * unit.mpe(load), { rel: 4 * Number.EPSILON });
          expect([0.5, 1, 1.5]).toContain(unit.mpeInIntervals(load));
          // Non-decreasing with load.
          expect(cell.mpe(Math.min(1000, load * 1.01))).toBeGreaterThanOrEqual(cell.mpe(load));
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('OIML R 60 creep', () => {
  it('C3, pLC 0.7 at Emax: 0.735 v over 30 min, 0.1575 v between 20 and 30 min (issue value; 0.7·mpe, 0.15·mpe)', () => {
    // mpe at 3000 v = 1.05 v; 0.7·1.05 = 0.735; 0.15·1.05 = 0.1575 (by hand).
    const limits = c3.creepLimits();
    expect(limits.load).toBe(3000);
    expect(limits.thirtyMinutes).toBeNear(0.735, { ulps: 2 });
    expect(limits.twentyToThirtyMinutes).toBeNear(0.1575, { ulps: 2 });
    expect(c3.creepLimits(400).thirtyMinutes).toBeNear(0.245, { ulps: 2 });
  });

  it('checks a creep record against both limits', () => {
    const pass = c3.checkCreep({
      minutes: [0, 5, 10, 20, 30],
      readings: [3000, 3000.3, 3000.5, 3000.6, 3000.7],
    });
    expect(pass.ok).toBe(true);
    expect(pass.issues).toEqual([]);
    expect(pass.value.thirtyMinuteChange).toBeNear(0.7, { rel: 1e-12 });
    expect(pass.value.twentyToThirtyMinuteChange).toBeNear(0.1, { rel: 1e-10 });
    const drift = c3.checkCreep({ minutes: [0, 20, 30], readings: [3000, 3000.5, 3000.7] });
    expect(drift.ok).toBe(false);
    expect(drift.issues).toHaveLength(1);
    expect(drift.issues[0]).toMatch(/between 20 and 30 min/);
    const far = c3.checkCreep({ minutes: [0, 20, 30], readings: [3000, 3000.74, 3000.74] });
    expect(far.ok).toBe(false);
    expect(far.issues[0]).toMatch(/over 30 min/);
    const light = c3.checkCreep({ load: 2000, minutes: [0, 20, 30], readings: [0, 0, 0] });
    expect(light.ok).toBe(false);
    expect(light.issues[0]).toMatch(/90 %/);
  });

  it.each([
    ['minutes[0]', { minutes: [1, 20, 30], readings: [0, 0, 0] }, 'out-of-range'],
    ['minutes[2]', { minutes: [0, 20, 20, 30], readings: [0, 0, 0, 0] }, 'out-of-range'],
    ['minutes[2]', { minutes: [0, 20, 31], readings: [0, 0, 0] }, 'out-of-range'],
    ['minutes', { minutes: [0, 10, 30], readings: [0, 0, 0] }, 'invalid-shape'],
    ['readings', { minutes: [0, 20, 30], readings: [0, 0] }, 'invalid-shape'],
    ['readings[1]', { minutes: [0, 20, 30], readings: [0, Number.NaN, 0] }, 'not-finite'],
    ['load', { load: 3001, minutes: [0, 20, 30], readings: [0, 0, 0] }, 'out-of-range'],
  ] as const)('creep %s: %j → %s', (param, options, code) => {
    expect(() => c3.checkCreep(options as never)).toThrowBridgeworkError(code, { param });
  });
});

describe('OIML R 60 error check, vmin and declaration', () => {
  it('flags each error beyond ±mpe and reports the largest fraction used', () => {
    const check = c3.checkErrors({ loads: [0, 500, 1500, 3000], errors: [0.1, -0.35, 0.71, -1] });
    expect(check.ok).toBe(false);
    expect(check.value.rows.map((r) => r.ok)).toEqual([true, true, false, true]);
    expect(check.value.largestFractionOfMpe).toBeNear(0.71 / 0.7, { rel: 1e-12 });
    expect(check.issues).toHaveLength(1);
    expect(check.issues[0]).toMatch(/1500/);
    expect(c3.checkErrors({ loads: [0, 3000], errors: [0, 1.05] }).ok).toBe(true);
  });

  it('vmin = Emax/Y, and v below vmin is a declaration issue', () => {
    // Emax 3000 kg, Y 15 000 → vmin = 0.2 kg; v = 3000/3000 = 1 kg ≥ vmin.
    const cell = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 3000, y: 15_000 });
    expect(cell.vmin).toBeNear(0.2, { ulps: 1 });
    expect(cell.specification.ok).toBe(true);
    // A measuring range of 100 kg over 3000 intervals gives v = 0.0333 kg < vmin = 0.2 kg.
    const narrow = createLoadCellClass({
      accuracyClass: 'C',
      nLC: 3000,
      maxCapacity: 3000,
      maxLoad: 100,
      y: 15_000,
    });
    expect(narrow.specification.ok).toBe(false);
    expect(narrow.specification.issues[0]).toMatch(/vmin/);
    expect(createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 3000 }).vmin).toBeUndefined();
  });

  it('flags an nLC outside its class and a pLC outside 0.3–0.8 (from memory)', () => {
    expect(
      createLoadCellClass({ accuracyClass: 'C', nLC: 12_000, maxCapacity: 100 }).specification.issues[0],
    ).toMatch(/500–10000/);
    expect(createLoadCellClass({ accuracyClass: 'D', nLC: 50, maxCapacity: 100 }).specification.ok).toBe(
      false,
    );
    expect(createLoadCellClass({ accuracyClass: 'A', nLC: 60_000, maxCapacity: 100 }).specification.ok).toBe(
      true,
    );
    const loose = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: 100, pLC: 0.9 });
    expect(loose.specification.ok).toBe(false);
    expect(loose.specification.issues[0]).toMatch(/pLC/);
  });

  const base = { accuracyClass: 'C', nLC: 3000, maxCapacity: 3000 } as const;
  it.each([
    ['accuracyClass', { ...base, accuracyClass: 'E' }, 'invalid-option'],
    ['nLC', { ...base, nLC: 2999.5 }, 'not-integer'],
    ['nLC', { ...base, nLC: 0 }, 'out-of-range'],
    ['maxCapacity', { ...base, maxCapacity: 0 }, 'not-positive'],
    ['maxCapacity', { ...base, maxCapacity: Number.NaN }, 'not-finite'],
    ['pLC', { ...base, pLC: 0 }, 'out-of-range'],
    ['pLC', { ...base, pLC: 1.1 }, 'out-of-range'],
    ['minLoad', { ...base, minLoad: -1 }, 'out-of-range'],
    ['minLoad', { ...base, minLoad: 3000 }, 'out-of-range'],
    ['maxLoad', { ...base, maxLoad: 3001 }, 'out-of-range'],
    ['maxLoad', { ...base, minLoad: 100, maxLoad: 100 }, 'out-of-range'],
    ['y', { ...base, y: -5 }, 'not-positive'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => createLoadCellClass(options as never)).toThrowBridgeworkError(code, { param });
  });

  // Issue 15 (fuzz): an error of 1e308 gave fractionOfMpe = Infinity.
  it('refuses an error whose share of the mpe lies beyond the double range, naming it', () => {
    expect(() => c3.checkErrors({ loads: [0, 1500], errors: [1e308, 0] })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'errors[0]' },
    );
    // A large but representable share is reported, not refused.
    const check = c3.checkErrors({ loads: [0, 1500], errors: [1e300, 0] });
    expect(check.ok).toBe(false);
    expect(check.value.largestFractionOfMpe).toBeNear(1e300 / c3.mpe(0), { rel: 1e-15 });
  });

  it('rejects loads outside the measuring range and bad error arrays', () => {
    expect(() => c3.mpe(-1)).toThrowBridgeworkError('out-of-range', { param: 'load' });
    expect(() => c3.mpe(3000.5)).toThrowBridgeworkError('out-of-range', { param: 'load' });
    expect(() => c3.mpe(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'load' });
    expect(() => c3.checkErrors({ loads: [0, 4000], errors: [0, 0] })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'loads[1]',
      },
    );
    expect(() => c3.checkErrors({ loads: [0, 1], errors: [0] })).toThrowBridgeworkError('invalid-shape', {
      param: 'errors',
    });
  });
});
