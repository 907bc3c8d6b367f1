import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { monteCarlo } from '@bridgework/uncertainty';
import { createMonteCarloPool } from '@bridgework/uncertainty/node';
import { digest, referenceCases } from './fixtures/monteCarlo/cases.js';
import { intervalRoutes } from '../src/node/counters.js';

// Digests written by the code before the pool's serial part shrank and before the trial record
// changed (fixtures/monteCarlo/record.ts, main at 087706c): the values and every reported
// figure must stay bit for bit what they were, in one thread and in the pool alike. The GUM
// comparison inside each result (gum, gumValidation) was re-recorded when the numerical
// sensitivities came to use at least four Ridders columns: changes of a few 1e-15 relative, the
// Monte Carlo figures untouched.
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/monteCarlo/reference.json', import.meta.url), 'utf8'),
) as Record<string, { result: unknown; values: string }>;
const module = new URL('./support/benchModel.ts', import.meta.url);

describe('Monte Carlo: bit for bit the results of the earlier code (fixed seeds)', () => {
  it('has a reference for every case', () => {
    expect(Object.keys(reference).sort()).toEqual(referenceCases.map((c) => c.name).sort());
  });

  for (const c of referenceCases) {
    it(`${c.name}: one thread and pools of 1, 2 and 3 workers`, async () => {
      const want = reference[c.name]!;
      const { values, ...rest } = monteCarlo({ ...c.options, model: c.model, returnValues: true });
      expect(digest(values!)).toBe(want.values);
      expect(JSON.parse(JSON.stringify(rest))).toEqual(want.result);
      for (const workers of [1, 2, 3]) {
        const pool = await createMonteCarloPool({ model: { module, exportName: c.exportName }, workers });
        try {
          const before = { ...intervalRoutes };
          const { values: pv, ...prest } = await pool.run({ ...c.options, returnValues: true });
          expect(digest(pv!)).toBe(want.values);
          expect(JSON.parse(JSON.stringify(prest))).toEqual(want.result);
          // A fixed run of 16·8192 trials or more reads its intervals from the workers' sorted
          // tails (always with one or two workers, who have room for every tail value; with three a
          // worker that ran most blocks on a loaded machine can overflow its room, and the main
          // thread takes the tails — the same values, checked above); an adaptive run computes them
          // on this thread.
          const fromWorkers = intervalRoutes.fromWorkers - before.fromWorkers;
          const onMainThread = intervalRoutes.onMainThread - before.onMainThread;
          if (c.options.adaptive !== undefined) {
            expect(fromWorkers).toBe(0);
            expect(onMainThread).toBeGreaterThan(0);
          } else if (workers <= 2) {
            expect([fromWorkers, onMainThread]).toEqual([1, 0]);
          } else {
            expect(fromWorkers + onMainThread).toBe(1);
          }
        } finally {
          await pool.close();
        }
      }
    }, 60_000);
  }
});
