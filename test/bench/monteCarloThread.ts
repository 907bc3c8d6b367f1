/**
 * A worker for the uncertainty benchmark: runs `monteCarlo` of the twelve-input model in its own
 * thread (private memory, nothing shared with any other thread) and replies with the time it took
 * in that thread. Two of these at once against one alone give what the machine allows two copies
 * of the Monte Carlo kernel — the ceiling of any worker pool's speed-up.
 */
import { performance } from 'node:perf_hooks';
import { parentPort } from 'node:worker_threads';
import { monteCarlo, type InputQuantities } from '@bridgework/uncertainty';
import { twelveInputModel, twelveInputs } from '../../packages/uncertainty/test/support/benchModel.js';

parentPort?.on('message', (trials: number) => {
  const t0 = performance.now();
  const r = monteCarlo({
    model: twelveInputModel,
    inputs: twelveInputs as InputQuantities,
    trials,
    compareWithGum: false,
  });
  parentPort?.postMessage({ millis: performance.now() - t0, value: r.value });
});
