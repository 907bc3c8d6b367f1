import { describe, expect, it } from 'vitest';
import { averagingGain, noiseBandwidth } from '@bridgework/chain';
import { sincKernel } from './support/sincKernel.js';

/** Var(average of M outputs)/Var(one output) for white input, from the averaged kernel itself. */
function bruteForceVarianceRatio(k: number, n: number, m: number): number {
  const h = sincKernel(k, n).map(Number); // small kernels: exact in doubles
  const avg = new Array<number>(h.length + (m - 1) * n).fill(0);
  for (let j = 0; j < m; j++) h.forEach((v, i) => (avg[i + j * n]! += v));
  const sumSq = (xs: number[]) => xs.reduce((s, v) => s + v * v, 0);
  return sumSq(avg) / (m * m * sumSq(h)); // both kernels normalised to DC gain 1
}

describe('averagingGain', () => {
  it('uncorrelated samples: √M noise reduction, ½·log2(M) bits (common practice: 4 samples per bit)', () => {
    const r = averagingGain({ samples: 16 });
    expect(r.noiseFactor).toBe(0.25);
    expect(r.bitsGained).toBe(2);
    expect(r.rateFactor).toBe(1 / 16);
    expect(r.noiseBandwidthHertz).toBeUndefined();
    expect(averagingGain({ samples: 4 }).bitsGained).toBe(1);
  });

  it('a sinc1 filter’s outputs are independent: averaging M of them is exactly √M', () => {
    const f = { kind: 'sinc', order: 1, dataRateHertz: 10 } as const;
    for (const m of [2, 7, 64]) {
      expect(averagingGain({ samples: m, filter: f }).noiseFactor).toBeNear(1 / Math.sqrt(m), { ulps: 2 });
      expect(averagingGain({ samples: m, filter: { ...f, decimation: 32 } }).noiseFactor).toBeNear(
        1 / Math.sqrt(m),
        {
          ulps: 2,
        },
      );
    }
  });

  it('sinc^k with a decimation: equals the brute-force variance of the averaged kernel', () => {
    for (const [k, n, m] of [
      [2, 8, 3],
      [3, 16, 5],
      [4, 5, 2],
      [5, 4, 9],
    ] as const) {
      const r = averagingGain({
        samples: m,
        filter: { kind: 'sinc', order: k, dataRateHertz: 1, decimation: n },
      });
      expect(r.noiseFactor ** 2).toBeNear(bruteForceVarianceRatio(k, n, m), { rel: 1e-14 });
    }
  });

  it('continuous sinc3: 16 samples gain 1.59 bits, not 2; many samples tend to √(0.55·M)', () => {
    const f = { kind: 'sinc', order: 3, dataRateHertz: 10 } as const;
    // By hand: Σ(16 − |l|)·M6(l) with M6(0) = 66/120, M6(±1) = 26/120, M6(±2) = 1/120 is 15.5333…;
    // its ratio to 16²·0.55 is 0.110322, so the noise factor is 0.332148 and the gain 1.59010 bits.
    const r = averagingGain({ samples: 16, filter: f });
    expect(r.noiseFactor).toBeNear(Math.sqrt((16 * 66 + 2 * 15 * 26 + 2 * 14 * 1) / (256 * 66)), { ulps: 2 });
    expect(r.bitsGained).toBeNear(1.5901, { abs: 1e-4 });
    expect(r.noiseBandwidthHertz).toBeNear(noiseBandwidth(f) * r.noiseFactor ** 2, { ulps: 4 });
    const many = averagingGain({ samples: 1e6, filter: f });
    expect(many.noiseFactor * Math.sqrt(0.55 * 1e6)).toBeNear(1, { rel: 1e-5 }); // O(1/M) approach
    expect(many.noiseBandwidthHertz).toBeNear(10 / (2 * 1e6), { rel: 1e-5 });
  });

  it.each([
    ['zero samples', { samples: 0 }, 'out-of-range', 'samples'],
    ['fractional samples', { samples: 2.5 }, 'not-integer', 'samples'],
    ['NaN samples', { samples: Number.NaN }, 'not-finite', 'samples'],
    [
      'an analog filter',
      { samples: 4, filter: { kind: 'single-pole', cutoffHertz: 1 } },
      'invalid-option',
      'filter.kind',
    ],
    [
      'a bad sinc order',
      { samples: 4, filter: { kind: 'sinc', order: 0, dataRateHertz: 1 } },
      'out-of-range',
      'filter.order',
    ],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => averagingGain(options as never)).toThrowBridgeworkError(code, { param });
  });
});
