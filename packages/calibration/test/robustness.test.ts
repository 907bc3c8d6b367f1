/**
 * The new calibration functions under hostile inputs (issue 15's rule): each field set in turn to
 * NaN, ±Infinity, −1, 0, 1e308, 1e−308, a string, null, {}, [] or a long array gives a typed
 * BridgeworkError or a finite result — never a TypeError, a NaN or an Infinity.
 */
import { describe, expect, it } from 'vitest';
import {
  checkEccentricity,
  fitCornerFactors,
  fitMultiComponent,
  nearestPreferredValue,
  spanCorrectionFromShunt,
  summingNetworkRatio,
} from '@bridgework/calibration';
import { errorCodes, isBridgeworkError } from '@bridgework/core';

const hostile: readonly unknown[] = [
  Number.NaN,
  Infinity,
  -Infinity,
  -1,
  0,
  1e308,
  1e-308,
  'x',
  null,
  {},
  [],
  new Array(5000).fill(1),
];

/** Every number in a result (deeply), functions skipped. */
function numbers(value: unknown, out: number[] = [], depth = 0): number[] {
  if (depth > 6) return out;
  if (typeof value === 'number') out.push(value);
  else if (value instanceof Float64Array) out.push(...value);
  else if (Array.isArray(value)) for (const v of value) numbers(v, out, depth + 1);
  else if (value !== null && typeof value === 'object')
    for (const v of Object.values(value)) numbers(v, out, depth + 1);
  return out;
}

function attack(
  name: string,
  call: (options: Record<string, unknown>) => unknown,
  base: Record<string, unknown>,
): void {
  it(`${name}: every field under every hostile value`, () => {
    let calls = 0;
    for (const key of Object.keys(base)) {
      for (const value of hostile) {
        calls++;
        try {
          const result = call({ ...base, [key]: value });
          // Accepted: every figure finite (undefined entries allowed; Infinity only as a stated meter resistance).
          const bad = numbers(result).filter((x) => !Number.isFinite(x));
          expect(bad, `${key} = ${String(value)}`).toEqual([]);
        } catch (error) {
          expect(isBridgeworkError(error), `${key} = ${String(value)}: ${String(error)}`).toBe(true);
          expect(errorCodes).toContain((error as { code: string }).code);
        }
      }
    }
    expect(calls).toBe(Object.keys(base).length * hostile.length);
  });
}

const points = [-1, -0.5, 0, 0.5, 1].flatMap((u) => [
  { loads: [u, 0], readings: [u * 1e-3, u * 2e-5] },
  { loads: [0, u], readings: [u * 3e-5, u * 1e-3] },
  { loads: [u, u], readings: [u * 1.03e-3, u * 1.02e-3] },
]);

describe('robustness of the multi-component and platform functions', () => {
  attack('fitMultiComponent', (o) => fitMultiComponent(o as never), {
    components: ['Fx', 'Fy'],
    bridges: ['A', 'B'],
    points,
    interactions: 'second-order',
    fullScale: [1, 1],
  });
  const cal = fitMultiComponent({
    components: ['Fx', 'Fy'],
    bridges: ['A', 'B'],
    points,
    interactions: 'second-order',
  });
  attack('uncertaintyAt', (o) => cal.uncertaintyAt(o as never), {
    loads: [0.5, -0.2],
    readingStandardUncertainties: [1e-7, 1e-7],
  });
  attack(
    'monteCarloAt',
    (o) => cal.monteCarloAt(o as never).map((r) => ({ v: r.value, u: r.standardUncertainty })),
    {
      readings: [5e-4, -2e-4],
      trials: 2000,
    },
  );
  attack('loadsFromReadings', (o) => cal.createInverse().loadsFromReadings([o['a'], o['b']] as never), {
    a: 5e-4,
    b: 1e-4,
  });
  attack('readingsAt', (o) => cal.readingsAt([o['a'], o['b']] as never), { a: 0.5, b: 0.1 });
  attack('fitCornerFactors', (o) => fitCornerFactors(o as never), {
    cellReadings: [
      [1e-3, 1e-4],
      [1e-4, 1e-3],
    ],
    testLoad: 100,
  });
  attack('summingNetworkRatio', (o) => summingNetworkRatio(o as never), {
    cellOhms: [350, 350],
    trimsOhms: [0, 5],
    cellRatios: [1e-3, 0],
    summingOhms: 10,
    meterOhms: 1e6,
  });
  attack('checkEccentricity', (o) => checkEccentricity(o as never), {
    accuracyClass: 'III',
    maxCapacity: 3000,
    verificationInterval: 1,
    testLoad: 1000,
    indications: [1000, 1000.4],
  });
  attack('spanCorrectionFromShunt', (o) => spanCorrectionFromShunt(o as never).value.factor, {
    expectedStep: 1e-3,
    measuredStep: 0.99e-3,
  });
  attack('nearestPreferredValue', (o) => nearestPreferredValue(o as never), { value: 1000, series: 'E96' });

  it('load states at the magnitude limit: finite figures or a typed refusal naming the loads', () => {
    // 1e100² stays finite in the readings; the leverage gᵀ(AᵀA)⁻¹g (about 1e400) does not.
    expect(cal.readingsAt([1e100, 1e100]).every(Number.isFinite)).toBe(true);
    expect(() => cal.uncertaintyAt({ loads: [1e100, -1e100] })).toThrowBridgeworkError('out-of-range', {
      param: 'loads',
    });
    expect(() => cal.monteCarloAt({ loads: [1e100, 1e100], trials: 2000 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'loads',
      },
    );
  });
});
