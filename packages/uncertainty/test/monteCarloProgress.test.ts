import { describe, expect, it } from 'vitest';
import { monteCarlo, type InputQuantities, type MonteCarloProgress } from '@bridgework/uncertainty';

const inputs: InputQuantities = {
  a: { value: 1, standardUncertainty: 0.1 },
  b: { value: 2, distribution: 'rectangular', halfWidth: 0.5 },
};
const model = ({ a, b }: Readonly<Record<string, number>>): number => a! * b!;

describe('monteCarlo: onProgress (issue 13 item 5: progress in the uncertainty package)', () => {
  it('reports after every seeding block of 16 384 trials, ending at the run’s trials', () => {
    const seen: MonteCarloProgress[] = [];
    const trials = 100_000; // six blocks of 16 384 and one of 1 696
    monteCarlo({ model, inputs, trials, compareWithGum: false, onProgress: (p) => seen.push(p) });
    expect(seen.map((p) => p.trials)).toEqual([16384, 32768, 49152, 65536, 81920, 98304, 100000]);
    expect(seen.every((p) => p.plannedTrials === trials && p.maxTrials === trials)).toBe(true);
  });

  it('does not change the result', () => {
    const options = { model, inputs, trials: 50_000, seed: 11 } as const;
    expect(monteCarlo({ ...options, onProgress: () => undefined })).toEqual(monteCarlo(options));
  });

  it('reports an adaptive run sequence by sequence, planned trials growing, within maxTrials', () => {
    const seen: MonteCarloProgress[] = [];
    const r = monteCarlo({
      model,
      inputs,
      adaptive: { maxTrials: 5_000_000 },
      compareWithGum: false,
      onProgress: (p) => seen.push(p),
    });
    const last = seen[seen.length - 1]!;
    expect(last.trials).toBe(r.trials);
    expect(last.plannedTrials).toBe(r.trials);
    expect(seen.every((p) => p.maxTrials === 5_000_000)).toBe(true);
    for (let i = 1; i < seen.length; i++) {
      expect(seen[i]!.trials).toBeGreaterThan(seen[i - 1]!.trials); // strictly increasing
      expect(seen[i]!.plannedTrials).toBeGreaterThanOrEqual(seen[i - 1]!.plannedTrials);
      expect(seen[i]!.trials).toBeLessThanOrEqual(seen[i]!.plannedTrials);
    }
    // Sequences of 16 384 trials (10⁴ rounded up to a block) for p = 0.95: the planned counts step by one.
    expect(new Set(seen.map((p) => p.plannedTrials)).size).toBe(r.adaptive!.sequences);
  });

  it('abandons the run when it throws: the error is what the run throws', () => {
    let calls = 0;
    const stop = new Error('stopped by the caller');
    expect(() =>
      monteCarlo({
        model,
        inputs,
        trials: 1_000_000,
        onProgress: () => {
          if (++calls === 3) throw stop;
        },
      }),
    ).toThrow(stop);
    expect(calls).toBe(3);
    // The trial record was given back: the next run works and matches a fresh one.
    expect(monteCarlo({ model, inputs, trials: 2000 }).trials).toBe(2000);
  });

  it('must be a function', () => {
    expect(() => monteCarlo({ model, inputs, trials: 1000, onProgress: 3 as never })).toThrowBridgeworkError(
      'wrong-type',
      { param: 'onProgress' },
    );
  });
});

describe('monteCarlo: signal (cancellation)', () => {
  it('stops after the block during which the signal was aborted, throwing its reason', () => {
    const controller = new AbortController();
    const reason = new Error('stopped by the operator');
    const seen: number[] = [];
    let calls = 0;
    const counting = (x: Readonly<Record<string, number>>): number => {
      calls++;
      return model(x);
    };
    expect(() =>
      monteCarlo({
        model: counting,
        inputs,
        trials: 1_000_000,
        compareWithGum: false,
        signal: controller.signal,
        onProgress: (p) => {
          seen.push(p.trials);
          if (p.trials >= 3 * 16384) controller.abort(reason);
        },
      }),
    ).toThrow(reason);
    // Three blocks of 16 384 trials were drawn; no fourth was started.
    expect(seen).toEqual([16384, 32768, 49152]);
    expect(calls).toBe(3 * 16384);
  });

  it('does not start when the signal is already aborted, and a reasonless signal gives `closed`', () => {
    let calls = 0;
    const counting = (x: Readonly<Record<string, number>>): number => {
      calls++;
      return model(x);
    };
    const controller = new AbortController();
    controller.abort();
    expect(() => monteCarlo({ model: counting, inputs, trials: 1000, signal: controller.signal })).toThrow(
      expect.objectContaining({ name: 'AbortError' }),
    );
    expect(() =>
      monteCarlo({ model: counting, inputs, trials: 1000, signal: { aborted: true } }),
    ).toThrowBridgeworkError('closed', { param: 'signal' });
    expect(calls).toBe(0);
    // A signal that is never aborted changes nothing.
    const options = { model, inputs, trials: 50_000, seed: 3 } as const;
    expect(monteCarlo({ ...options, signal: new AbortController().signal })).toEqual(monteCarlo(options));
  });

  it('must be an object with a boolean `aborted`', () => {
    for (const bad of [true, 'abort', {}, { aborted: 1 }, null]) {
      expect(() => monteCarlo({ model, inputs, trials: 1000, signal: bad as never })).toThrowBridgeworkError(
        'wrong-type',
        { param: 'signal' },
      );
    }
  });
});
