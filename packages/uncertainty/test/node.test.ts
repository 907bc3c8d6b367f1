import { describe, expect, it } from 'vitest';
import { monteCarlo } from '@bridgework/uncertainty';
import { createMonteCarloPool, monteCarloInWorkers } from '@bridgework/uncertainty/node';
import { twelveInputModel, twelveInputs } from './support/benchModel.js';

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
