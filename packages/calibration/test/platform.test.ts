import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkEccentricity,
  fitCornerFactors,
  fitSummingTrims,
  summingNetworkRatio,
} from '@bridgework/calibration';
import { junctionRatio } from './support/summingJunction.js';

/**
 * An invented four-cell platform on a deck flexible enough that a load over one quarter goes
 * mostly to that quarter's cell: shares 70 % to it, 15 % to each neighbour, 0 to the opposite
 * cell, and 25 % each for a central load (invented). (A perfectly rigid deck on equal supports
 * makes the reactions planar in position, so four positions only span three combinations and no
 * test could separate the cells.)
 */
const quarters = [0, 1, 2, 3] as const;
function reactions(load: number, position: number | 'centre'): number[] {
  if (position === 'centre') return [0.25, 0.25, 0.25, 0.25].map((s) => s * load);
  return [0, 1, 2, 3].map((i) => load * ([0.7, 0.15, 0, 0.15][(i - position + 4) % 4] as number));
}

describe('fitCornerFactors (digital summing)', () => {
  const sensitivities = [2.013e-6, 1.994e-6, 2.005e-6, 1.987e-6]; // V/V per kg, cells differ by ±0.7 %
  const testLoad = 1000; // kg
  const readingsAt = (position: number | 'centre', load = testLoad): number[] =>
    reactions(load, position).map((f, i) => f * sensitivities[i]!);

  it('every corner reads the test load within 1e-12; the factors are 1/sensitivity', () => {
    const fit = fitCornerFactors({
      cellReadings: quarters.map((q) => readingsAt(q)),
      testLoad,
      checkReadings: [readingsAt('centre'), readingsAt(2, 400)],
    });
    fit.positions.forEach((p) => expect(p.indication).toBeNear(testLoad, { rel: 1e-12 }));
    fit.factors.forEach((k, i) => expect(k).toBeNear(1 / sensitivities[i]!, { rel: 1e-12 }));
    // Digital summing is linear: the centre and any other position read the load on the deck.
    expect(fit.checks[0]!.indication).toBeNear(testLoad, { rel: 1e-12 });
    expect(fit.checks[1]!.indication).toBeNear(400, { rel: 1e-12 });
    expect(fit.sum(readingsAt(1, 250))).toBeNear(250, { rel: 1e-12 });
    expect(fit.condition).toBeGreaterThan(1);
  });

  it('with five positions (corners and centre) and noisy readings: least squares, errors reported', () => {
    const noisy = [...quarters.map((q) => readingsAt(q)), readingsAt('centre')].map((r, p) =>
      r.map((v, i) => v * (1 + 2e-5 * Math.sin(3 * p + i))),
    );
    const fit = fitCornerFactors({ cellReadings: noisy, testLoad });
    const errors = fit.positions.map((p) => p.error);
    // The least-squares residuals are orthogonal to the columns: Σ_p r_pi·e_p = 0 for each cell.
    for (let i = 0; i < 4; i++) {
      expect(noisy.reduce((s, r, p) => s + r[i]! * errors[p]!, 0)).toBeNear(0, { abs: 1e-14 });
    }
    expect(Math.max(...errors.map(Math.abs))).toBeLessThan(0.1);
  });

  it('refuses a test that never loads a cell', () => {
    expect(() =>
      fitCornerFactors({
        cellReadings: [
          [1e-3, 0, 0, 0],
          [0, 1e-3, 0, 0],
          [0, 0, 1e-3, 0],
          [1e-3, 1e-3, 0, 0],
        ],
        testLoad: 1,
      }),
    ).toThrowBridgeworkError('singular', { param: 'cellReadings' });
    expect(() => fitCornerFactors({ cellReadings: [[1, 0, 0]], testLoad: 1 })).toThrowBridgeworkError(
      'too-few-points',
      {
        param: 'cellReadings',
      },
    );
    expect(() =>
      fitCornerFactors({ cellReadings: [[1]], testLoad: 1, tesLoad: 2 } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.tesLoad' });
  });
});

describe('summingNetworkRatio against an independent 40-digit MNA solve', () => {
  it('random junctions: both trim placements, summing resistors, meters (1e-12 relative or 1e-12 of the cell ratios)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 6 }),
        fc.constantFrom('positive-excitation', 'both-excitation'),
        fc.constantFrom(0, 0.5, 1000),
        fc.constantFrom(Infinity, 1e6, 5000),
        fc.integer({ min: 0, max: 1e6 }),
        (cells, trimPlacement, summingOhms, meterOhms, seed) => {
          const u = (k: number): number =>
            (((Math.sin(seed * 12.9898 + k * 78.233) * 43758.5453) % 1) + 1) % 1;
          const cellOhms = Array.from({ length: cells }, (_, i) => 300 + 800 * u(i));
          const trimsOhms = Array.from({ length: cells }, (_, i) => (u(10 + i) < 0.3 ? 0 : 50 * u(20 + i)));
          const cellRatios = Array.from({ length: cells }, (_, i) => (u(30 + i) - 0.3) * 4e-3);
          const options = { cellOhms, trimsOhms, cellRatios, trimPlacement, summingOhms, meterOhms } as const;
          const reference = junctionRatio(options);
          // The change is solved directly (no cancellation of bus voltages near ½ V): within 1e-12
          // relative, or 1e-12 of the largest cell ratio when the cells' outputs cancel in the sum.
          const largest = Math.max(...cellRatios.map(Math.abs));
          expect(summingNetworkRatio(options)).toBeNear(reference, { rel: 1e-12, abs: 1e-12 * largest });
        },
      ),
      { numRuns: 60 },
    );
  });

  it('two equal cells paralleled directly: the sum is not the mean at second order', () => {
    // Cell outputs x and 0 paralleled with no summing resistors: the loaded cell's output
    // resistance R(1 − x²) against the other's R, so the bus reads x·R/(R(1 − x²) + R)… plus the
    // excitation-current change; the independent MNA gives the exact figure.
    const options = {
      cellOhms: [350, 350],
      trimsOhms: [0, 0],
      cellRatios: [2e-3, 0],
      trimPlacement: 'both-excitation',
      summingOhms: 0,
      meterOhms: Infinity,
    } as const;
    const exact = summingNetworkRatio(options);
    expect(exact).toBeNear(junctionRatio(options), { rel: 1e-12 });
    expect(exact).not.toBe(1e-3);
    expect((exact - 1e-3) / 1e-3).toBeNear(2e-6, { rel: 0.01 }); // relative excess of order x²/2
  });
});

describe('fitSummingTrims (analog summing, corner adjustment)', () => {
  const cellOhms = [350, 352, 348, 351];
  const sensitivities = [1.004e-6, 0.998e-6, 1.002e-6, 0.993e-6]; // own ratio per kg on the cell
  const ratiosAt = (position: number | 'centre', load: number): number[] =>
    reactions(load, position).map((f, i) => f * sensitivities[i]!);

  for (const [trimPlacement, summingOhms] of [
    ['both-excitation', 0],
    ['positive-excitation', 1000],
  ] as const) {
    it(`equal corners within 1e-9 by the independent solve; the centre's second-order difference (${trimPlacement}, ${summingOhms} Ω)`, () => {
      const differences: number[] = [];
      for (const load of [2000, 1000]) {
        const trims = fitSummingTrims({
          cellOhms,
          trimPlacement,
          summingOhms,
          cellRatios: quarters.map((q) => ratiosAt(q, load)),
          checkRatios: [ratiosAt('centre', load)],
        });
        expect(trims.trimsOhms[trims.referenceCell]).toBe(0);
        expect(trims.trimsOhms.every((t) => t >= 0)).toBe(true);
        const exact = quarters.map((q) =>
          junctionRatio({
            cellOhms,
            trimsOhms: trims.trimsOhms,
            cellRatios: ratiosAt(q, load),
            trimPlacement,
            summingOhms,
            meterOhms: Infinity,
          }),
        );
        const mean = exact.reduce((s, v) => s + v, 0) / 4;
        exact.forEach((v) => expect(v).toBeNear(mean, { rel: 1e-9 }));
        const centre = junctionRatio({
          cellOhms,
          trimsOhms: trims.trimsOhms,
          cellRatios: ratiosAt('centre', load),
          trimPlacement,
          summingOhms,
          meterOhms: Infinity,
        });
        // The reported centre difference is the independent solve's.
        expect(trims.checks[0]!.differenceFraction).toBeNear((centre - mean) / mean, {
          rel: 1e-4,
          abs: 1e-12,
        });
        differences.push(trims.checks[0]!.differenceFraction);
      }
      // Non-zero, and it shrinks with the load squared: halving the load quarters it (±5 %).
      expect(Math.abs(differences[0]!)).toBeGreaterThan(1e-9);
      expect(differences[0]! / differences[1]!).toBeNear(4, { rel: 0.05 });
    });
  }

  // Issue 15 (fuzz): a cell of 1e-308 Ω gave positionSpreadFraction = NaN.
  it('refuses a cell resistance below 1 mΩ or above 1 TΩ, naming the cell', () => {
    for (const [ohms, code] of [
      [1e-308, 'out-of-range'],
      [1e-4, 'out-of-range'],
      [2e12, 'out-of-range'],
      [0, 'not-positive'],
    ] as const) {
      expect(() =>
        fitSummingTrims({
          cellOhms: [350, 352, ohms, 351],
          cellRatios: quarters.map((q) => ratiosAt(q, 1000)),
        }),
      ).toThrowBridgeworkError(code, { param: 'cellOhms[2]' });
    }
  });

  it('the least sensitive cell position is the untrimmed reference; refusals', () => {
    const trims = fitSummingTrims({ cellOhms, cellRatios: quarters.map((q) => ratiosAt(q, 1000)) });
    // Cell 3 has the lowest sensitivity per ohm of bridge: it gets no trim.
    expect(trims.referenceCell).toBe(3);
    expect(() =>
      fitSummingTrims({ cellOhms, cellRatios: [ratiosAt('centre', 1000)] }),
    ).toThrowBridgeworkError('too-few-points', {
      param: 'cellRatios',
    });
    expect(() =>
      fitSummingTrims({
        cellOhms: [350, 350],
        cellRatios: [
          [1e-3, 1e-3],
          [2e-3, 2e-3],
        ],
      }),
    ).toThrowBridgeworkError('singular', { param: 'cellRatios' });
  });
});

describe('checkEccentricity (OIML R 76-1:2006, 3.6.2 and 3.5.1 Table 6; values from memory)', () => {
  it('class III, Max 3000 kg, e = 1 kg, 1000 kg test load: mpe 1 e; in service 2 e', () => {
    // 1000 e lies in class III's 500 e – 2000 e band: mpe 1.0 e on initial verification (Table 6).
    const c = checkEccentricity({
      accuracyClass: 'III',
      maxCapacity: 3000,
      verificationInterval: 1,
      testLoad: 1000,
      indications: [1000.5, 999.6, 1000, 1001],
    });
    expect(c.value.mpe).toBe(1);
    expect(c.value.recommendedTestLoad).toBe(1000); // Max/3 with four supports (3.6.2.1)
    expect(c.ok).toBe(true); // an error equal to the mpe passes
    expect(c.value.largestFractionOfMpe).toBe(1);
    const failing = checkEccentricity({
      accuracyClass: 'III',
      maxCapacity: 3000,
      verificationInterval: 1,
      testLoad: 1000,
      indications: [1000.5, 999.6, 1000, 1001.2],
    });
    expect(failing.ok).toBe(false);
    expect(failing.issues[0]).toMatch(/position 3: error 1\.2/);
    const inService = checkEccentricity({
      accuracyClass: 'III',
      maxCapacity: 3000,
      verificationInterval: 1,
      testLoad: 1000,
      indications: [1001.2],
      verification: 'in-service',
    });
    expect(inService.value.mpe).toBe(2);
    expect(inService.ok).toBe(true);
  });

  it('refuses a verification interval so small that the mpe underflows, and an error that overflows in mpe (issue 15, a fuzz finding)', () => {
    const base = { accuracyClass: 'III', maxCapacity: 3000, testLoad: 1000, indications: [1000.5] } as const;
    // e = 5e-324 made the mpe a subnormal and |error|/mpe = Infinity.
    expect(() => checkEccentricity({ ...base, verificationInterval: 5e-324 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'verificationInterval',
      },
    );
    // 10⁹ intervals in Max is the limit, and accepted: every figure finite.
    const fine = checkEccentricity({ ...base, verificationInterval: 3000 / 1e9 });
    expect(Number.isFinite(fine.value.largestFractionOfMpe)).toBe(true);
    // A tiny Max with a huge indication: the error in mpe would overflow; refused at the indication.
    expect(() =>
      checkEccentricity({
        accuracyClass: 'III',
        maxCapacity: 1e-300,
        verificationInterval: 1e-301,
        testLoad: 3e-301,
        indications: [1e15],
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'indications[0]' });
  });

  it('band edges of every class (Table 6) and the test load for more supports (3.6.2.2)', () => {
    const mpeAt = (accuracyClass: 'I' | 'II' | 'III' | 'IIII', m: number): number =>
      checkEccentricity({
        accuracyClass,
        maxCapacity: 1e6,
        verificationInterval: 1,
        testLoad: m,
        indications: [m],
      }).value.mpeInIntervals;
    expect([mpeAt('I', 50_000), mpeAt('I', 50_001), mpeAt('I', 200_000), mpeAt('I', 200_001)]).toEqual([
      0.5, 1, 1, 1.5,
    ]);
    expect([mpeAt('II', 5_000), mpeAt('II', 5_001), mpeAt('II', 20_001)]).toEqual([0.5, 1, 1.5]);
    expect([mpeAt('III', 500), mpeAt('III', 501), mpeAt('III', 2_000), mpeAt('III', 2_001)]).toEqual([
      0.5, 1, 1, 1.5,
    ]);
    expect([mpeAt('IIII', 50), mpeAt('IIII', 51), mpeAt('IIII', 201)]).toEqual([0.5, 1, 1.5]);
    // A weighbridge on eight supports: (Max + T)/(n − 1) = 60 000/7 over each support.
    const eight = checkEccentricity({
      accuracyClass: 'III',
      maxCapacity: 60_000,
      verificationInterval: 20,
      testLoad: 20_000,
      indications: [20_000],
      supportPoints: 8,
    });
    expect(eight.value.recommendedTestLoad).toBeNear(60_000 / 7, { rel: 1e-15 });
    expect(eight.ok).toBe(false);
    expect(eight.issues[0]).toMatch(/3\.6\.2/);
  });

  it.each([
    [
      'options.accuracyClass',
      'missing-option',
      { maxCapacity: 1, verificationInterval: 1, testLoad: 1, indications: [1] },
    ],
    [
      'accuracyClass',
      'invalid-option',
      { accuracyClass: 'C', maxCapacity: 1, verificationInterval: 1, testLoad: 1, indications: [1] },
    ],
    [
      'testLoad',
      'out-of-range',
      { accuracyClass: 'III', maxCapacity: 1, verificationInterval: 0.1, testLoad: 2, indications: [1] },
    ],
    [
      'indications',
      'too-few-points',
      { accuracyClass: 'III', maxCapacity: 3, verificationInterval: 1, testLoad: 1, indications: [] },
    ],
  ] as const)('%s → %s', (param, code, options) => {
    expect(() => checkEccentricity(options as never)).toThrowBridgeworkError(code, { param });
  });
});
