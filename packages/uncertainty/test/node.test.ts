import { describe, expect, it } from 'vitest';
import { isBridgeworkError, type BridgeworkError } from '@bridgework/core';
import { monteCarlo, type MonteCarloProgress } from '@bridgework/uncertainty';
import { createMonteCarloPool, monteCarloInWorkers } from '@bridgework/uncertainty/node';
import {
  quantisedModel,
  rarelyFailingModel,
  scaledTwelveInputModel,
  throwingModel,
  twelveInputModel,
  twelveInputPositional,
  twelveInputs,
} from './support/benchModel.js';
import { intervalRoutes } from '../src/node/counters.js';

const module = new URL('./support/benchModel.ts', import.meta.url);

describe('@bridgework/uncertainty/node: worker threads', () => {
  it('give bit-identical results with 1 and 3 workers and in one thread (fixed and adaptive runs)', async () => {
    const options = { inputs: twelveInputs, trials: 150_000, seed: 42, returnValues: true } as const;
    const reference = monteCarlo({ model: twelveInputModel, ...options });
    const adaptiveReference = monteCarlo({
      model: twelveInputModel,
      inputs: twelveInputs,
      adaptive: true,
      seed: 5,
    });
    for (const workers of [1, 3]) {
      const pool = await createMonteCarloPool({ model: { module, exportName: 'twelveInputModel' }, workers });
      try {
        expect(pool.workers).toBe(workers);
        const r = await pool.run(options);
        expect(Array.from(r.values!)).toEqual(Array.from(reference.values!));
        expect({ ...r, values: undefined }).toEqual({ ...reference, values: undefined });
        const a = await pool.run({ inputs: twelveInputs, adaptive: true, seed: 5 });
        expect(a).toEqual(adaptiveReference);
      } finally {
        await pool.close();
      }
    }
  }, 60_000);

  it('reads the intervals from the tails the workers sorted (one side per worker), bit-identical to one thread', async () => {
    // The workers copy their tails into two combined arrays and sort one each; the main thread
    // only walks them. A fallback to the values on the main thread would give the same result, so
    // the route is counted too (src/node/counters.ts).
    const options = { inputs: twelveInputs, trials: 300_000, seed: 9 } as const;
    for (const workers of [1, 2, 3]) {
      const pool = await createMonteCarloPool({
        model: { module, exportName: 'twelveInputPositional' },
        workers,
      });
      try {
        const before = { ...intervalRoutes };
        for (const coverage of [0.95, 0.99]) {
          const r = await pool.run({ ...options, coverage });
          expect(r).toEqual(monteCarlo({ model: twelveInputPositional, ...options, coverage }));
        }
        const fromWorkers = intervalRoutes.fromWorkers - before.fromWorkers;
        const onMainThread = intervalRoutes.onMainThread - before.onMainThread;
        if (workers <= 2) {
          // Each worker has room for every tail value of the run: the workers' route always holds.
          expect(fromWorkers, `${workers} workers`).toBe(2);
          expect(onMainThread, `${workers} workers`).toBe(0);
        } else {
          // Three workers have room for twice their share each: a worker that ran most blocks (the
          // others starved of a core on a loaded machine) overflows it, and the main thread takes
          // the tails instead — the same values, checked above.
          expect(fromWorkers + onMainThread, `${workers} workers`).toBe(2);
        }
      } finally {
        await pool.close();
      }
    }
  }, 60_000);

  it('sorts the tails right with heavy ties and with workers that ran no block; a failed, stopped or aborted run leaves the next one exact', async () => {
    const one = { a: { value: 1, standardUncertainty: 0.1 }, b: { value: 0, standardUncertainty: 0.02 } };
    const quantised = { inputs: one, trials: 16 * 8192, seed: 4, coverage: 0.99 } as const;
    // Five workers for eight blocks: some workers run none (or only blocks after block 0).
    const pool = await createMonteCarloPool({ model: { module, exportName: 'quantisedModel' }, workers: 5 });
    try {
      const before = { ...intervalRoutes };
      for (const seed of [4, 5, 6]) {
        const r = await pool.run({ ...quantised, seed });
        expect(r).toEqual(monteCarlo({ model: quantisedModel, ...quantised, seed }));
      }
      expect(intervalRoutes.fromWorkers - before.fromWorkers).toBe(3);
      expect(intervalRoutes.onMainThread - before.onMainThread).toBe(0);
    } finally {
      await pool.close();
    }

    const rare = await createMonteCarloPool({
      model: { module, exportName: 'rarelyFailingModel' },
      workers: 2,
    });
    const safe = {
      inputs: { a: { value: 1, standardUncertainty: 0.01 } },
      trials: 300_000,
      seed: 8,
    } as const;
    const expected = monteCarlo({ model: rarelyFailingModel, ...safe });
    const exact = async (): Promise<void> => {
      const before = { ...intervalRoutes };
      expect(await rare.run(safe)).toEqual(expected);
      expect(intervalRoutes.fromWorkers - before.fromWorkers).toBe(1);
      expect(intervalRoutes.onMainThread - before.onMainThread).toBe(0);
    };
    try {
      // A model failing in some blocks (a > 1.4, four standard deviations out), then in block 0
      // (a > 1.4 at half the trials): the run throws, the next one's tails are exact again.
      await expect(
        rare.run({
          inputs: { a: { value: 1, standardUncertainty: 0.1 } },
          trials: 1_000_000,
          compareWithGum: false,
        }),
      ).rejects.toMatchObject({ code: 'model-not-finite' });
      await exact();
      await expect(
        rare.run({
          inputs: { a: { value: 1.4, standardUncertainty: 0.1 } },
          trials: 1_000_000,
          compareWithGum: false,
        }),
      ).rejects.toMatchObject({ code: 'model-not-finite', message: expect.stringMatching(/at trial \d+ /) });
      await exact();
      // Stopped by onProgress and aborted by a signal while the workers draw.
      const stop = new Error('stopped');
      await expect(
        rare.run({
          ...safe,
          trials: 5_000_000,
          onProgress: () => {
            throw stop;
          },
        }),
      ).rejects.toBe(stop);
      await exact();
      const controller = new AbortController();
      const reason = new Error('aborted');
      const timer = setTimeout(() => controller.abort(reason), 30);
      await expect(rare.run({ ...safe, trials: 20_000_000, signal: controller.signal })).rejects.toBe(reason);
      clearTimeout(timer);
      await exact();
    } finally {
      await rare.close();
    }

    // A worker thread that ends (the model calls process.exit) breaks the pool with a typed error;
    // the other worker does not wait for its tails (close() returns).
    const exiting = await createMonteCarloPool({
      model: { module, exportName: 'exitingModel', argument: { code: 7 } },
      workers: 2,
    });
    try {
      await expect(
        exiting.run({
          inputs: { a: { value: 1, standardUncertainty: 0.1 } },
          trials: 1_000_000,
          compareWithGum: false,
        }),
      ).rejects.toMatchObject({
        code: 'model-failed',
        param: 'model',
        message: expect.stringContaining('exit code 7'),
      });
      await expect(exiting.run(safe)).rejects.toMatchObject({ code: 'model-failed' });
    } finally {
      await exiting.close();
    }
  }, 120_000);

  it('monteCarloInWorkers runs once and stops its workers; errors from a worker keep their code', async () => {
    const r = await monteCarloInWorkers({
      model: { module, exportName: 'twelveInputModel' },
      inputs: twelveInputs,
      trials: 40_000,
      workers: 2,
    });
    expect(r).toEqual(monteCarlo({ model: twelveInputModel, inputs: twelveInputs, trials: 40_000 }));
    await expect(
      monteCarloInWorkers({
        model: { module, exportName: 'failingModel' },
        inputs: { a: { value: 1, standardUncertainty: 0.1 } },
        trials: 40_000,
        workers: 1,
        compareWithGum: false,
      }),
    ).rejects.toMatchObject({ code: 'model-not-finite', param: 'model' });
    await expect(
      createMonteCarloPool({ model: { module, exportName: 'notAModel' }, workers: 1 }),
    ).rejects.toMatchObject({
      code: 'wrong-type',
      param: 'model.exportName',
    });
    await expect(createMonteCarloPool({ model: { module: 3 as never }, workers: 1 })).rejects.toMatchObject({
      code: 'wrong-type',
      param: 'model.module',
    });
    await expect(createMonteCarloPool({ model: { module }, workers: 0 })).rejects.toMatchObject({
      code: 'out-of-range',
      param: 'workers',
    });
  }, 60_000);
});

describe('@bridgework/uncertainty/node: models, progress and failures', () => {
  const one = { a: { value: 1, standardUncertainty: 0.1 } } as const;

  it('runs positional models and models made by a factory from `argument`, bit-identical to one thread', async () => {
    const options = { inputs: twelveInputs, trials: 60_000, seed: 8, returnValues: true } as const;
    const reference = monteCarlo({ model: twelveInputPositional, ...options });
    const positional = await monteCarloInWorkers({
      model: { module, exportName: 'twelveInputPositional' },
      workers: 2,
      ...options,
    });
    expect(positional).toEqual(reference);
    const scaled = await monteCarloInWorkers({
      model: { module, exportName: 'scaledTwelveInputModel', argument: { factor: 3 } },
      workers: 2,
      ...options,
    });
    expect(scaled).toEqual(monteCarlo({ model: scaledTwelveInputModel({ factor: 3 }), ...options }));
  }, 60_000);

  it('reports progress from the workers up to the run’s trials; a throw abandons the run, the pool stays usable', async () => {
    const pool = await createMonteCarloPool({
      model: { module, exportName: 'twelveInputModel' },
      workers: 2,
    });
    try {
      const seen: MonteCarloProgress[] = [];
      const trials = 3_000_000;
      const r = await pool.run({ inputs: twelveInputs, trials, onProgress: (p) => seen.push(p) });
      expect(r.trials).toBe(trials);
      expect(seen.length).toBeGreaterThan(0);
      expect(seen[seen.length - 1]).toEqual({ trials, plannedTrials: trials, maxTrials: trials });
      for (let i = 1; i < seen.length; i++) expect(seen[i]!.trials).toBeGreaterThan(seen[i - 1]!.trials);
      const stop = new Error('stopped by the caller');
      await expect(
        pool.run({
          inputs: twelveInputs,
          trials,
          onProgress: () => {
            throw stop;
          },
        }),
      ).rejects.toBe(stop);
      const again = await pool.run({ inputs: twelveInputs, trials: 40_000, seed: 2 });
      expect(again).toEqual(
        monteCarlo({ model: twelveInputModel, inputs: twelveInputs, trials: 40_000, seed: 2 }),
      );
    } finally {
      await pool.close();
    }
  }, 60_000);

  it('stops a run when its signal is aborted (no further block started), and a run in progress on close()', async () => {
    const pool = await createMonteCarloPool({
      model: { module, exportName: 'twelveInputModel' },
      workers: 2,
    });
    const trials = 20_000_000; // seconds of work: the stop must come long before the end
    try {
      const controller = new AbortController();
      const reason = new Error('stopped by the operator');
      let last = 0;
      const started = performance.now();
      const run = pool.run({
        inputs: twelveInputs,
        trials,
        compareWithGum: false,
        signal: controller.signal,
        onProgress: (p) => {
          last = p.trials;
          if (p.trials > 0) controller.abort(reason);
        },
      });
      await expect(run).rejects.toBe(reason);
      expect(last).toBeGreaterThan(0);
      expect(last).toBeLessThan(trials);
      // The workers stop within a block each: the pool is free at once for the next run.
      const next = await pool.run({ inputs: twelveInputs, trials: 40_000, seed: 5 });
      expect(performance.now() - started).toBeLessThan(30_000); // far below the 20 M trials' run
      expect(next).toEqual(
        monteCarlo({ model: twelveInputModel, inputs: twelveInputs, trials: 40_000, seed: 5 }),
      );
      // An aborted signal stops a run before it starts; a reasonless one gives `closed`.
      const aborted = new AbortController();
      aborted.abort();
      await expect(
        pool.run({ inputs: twelveInputs, trials: 40_000, signal: aborted.signal }),
      ).rejects.toMatchObject({ name: 'AbortError' });
      await expect(
        pool.run({ inputs: twelveInputs, trials: 40_000, signal: { aborted: true } }),
      ).rejects.toMatchObject({ code: 'closed', param: 'signal' });
      // A signal aborted by a timer while the workers draw (the main thread is free: it is read every 10 ms).
      const timed = new AbortController();
      const timer = setTimeout(() => timed.abort(new Error('time is up')), 50);
      await expect(
        pool.run({ inputs: twelveInputs, trials, compareWithGum: false, signal: timed.signal }),
      ).rejects.toThrow('time is up');
      clearTimeout(timer);
      // close() during a run ends it with `closed`, not a worker failure.
      const inFlight = pool.run({ inputs: twelveInputs, trials, compareWithGum: false });
      await new Promise((resolve) => setTimeout(resolve, 50));
      await pool.close();
      await expect(inFlight).rejects.toMatchObject({ code: 'closed' });
    } finally {
      await pool.close();
    }
  }, 120_000);

  // Issue 15 item 14: the worker path reported another failing trial than one thread (16706 vs 779).
  it('reports the same failing trial as one thread, for a model returning NaN and one that throws', async () => {
    for (const [exportName, fn, code] of [
      ['rarelyFailingModel', rarelyFailingModel, 'model-not-finite'],
      ['throwingModel', throwingModel, 'model-failed'],
    ] as const) {
      let expected: BridgeworkError | undefined;
      try {
        monteCarlo({ model: fn, inputs: one, trials: 1_000_000, compareWithGum: false });
      } catch (e) {
        expected = e as BridgeworkError;
      }
      expect(expected?.code).toBe(code);
      expect(expected?.message).toMatch(/at trial \d+ \(a = 1\.4/);
      for (const workers of [1, 2, 3]) {
        const failure = monteCarloInWorkers({
          model: { module, exportName },
          inputs: one,
          trials: 1_000_000,
          compareWithGum: false,
          workers,
        });
        await expect(failure).rejects.toMatchObject({ code, param: 'model', message: expected!.message });
        await failure.catch((e: unknown) => expect(isBridgeworkError(e)).toBe(true));
      }
    }
  }, 120_000);

  // Issue 15 item 11: untyped errors from the pool.
  it('gives typed errors: a run after close, a module that cannot be found or fails to load, a throwing model', async () => {
    const pool = await createMonteCarloPool({
      model: { module, exportName: 'twelveInputModel' },
      workers: 1,
    });
    await pool.close();
    await expect(pool.run({ inputs: twelveInputs, trials: 1000 })).rejects.toMatchObject({ code: 'closed' });
    await expect(
      createMonteCarloPool({
        model: { module: new URL('./support/noSuchModel.ts', import.meta.url) },
        workers: 1,
      }),
    ).rejects.toMatchObject({ code: 'io-error', param: 'model.module' });
    await expect(
      createMonteCarloPool({
        model: { module: new URL('./support/brokenModel.ts', import.meta.url) },
        workers: 1,
      }),
    ).rejects.toMatchObject({ code: 'model-failed', param: 'model.module' });
    const thrown = await monteCarloInWorkers({
      model: { module, exportName: 'throwingModel' },
      inputs: one,
      trials: 200_000,
      workers: 1,
    }).catch((e: unknown) => e);
    expect(isBridgeworkError(thrown, 'model-failed')).toBe(true);
    expect((thrown as BridgeworkError).cause).toMatchObject({ name: 'RangeError' });
    await expect(
      createMonteCarloPool({ model: { module, exportName: 'twelveInputModel', argument: { f: () => 1 } } }),
    ).rejects.toMatchObject({ code: 'wrong-type', param: 'model.argument' });
    await expect(
      createMonteCarloPool({ model: { module, exportNam: 'twelveInputModel' } as never }),
    ).rejects.toMatchObject({ code: 'unknown-option', param: 'model.exportNam' });
    // An adaptive run that cannot stabilise stops at maxTrials in the pool as in one thread, though
    // the pool computes sequences ahead.
    const unstable = {
      inputs: twelveInputs,
      adaptive: { maxTrials: 5 * 16384 },
      significantDigits: 6,
    } as const;
    expect(() => monteCarlo({ model: twelveInputModel, ...unstable })).toThrowBridgeworkError(
      'not-converged',
      {
        param: 'adaptive.maxTrials',
      },
    );
    await expect(
      monteCarloInWorkers({ model: { module, exportName: 'twelveInputModel' }, workers: 2, ...unstable }),
    ).rejects.toMatchObject({ code: 'not-converged', param: 'adaptive.maxTrials' });
    await expect(createMonteCarloPool({ model: { module }, worker: 2 } as never)).rejects.toMatchObject({
      code: 'unknown-option',
      param: 'options.worker',
    });
  }, 60_000);
});
