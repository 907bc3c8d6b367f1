/**
 * Uncertainty package: Monte Carlo throughput (issue 5, item 4). A model of 12 inputs (six normal,
 * six rectangular) with a handful of arithmetic operations, 10⁶ trials including both coverage
 * intervals, against
 *  - a straightforward implementation in the same process: Math.random, Box–Muller, one object
 *    per trial, a full sort for the intervals (two variants: a generic loop over the inputs, and
 *    one with the twelve inputs written out by hand, the fastest form of the naive approach);
 *  - the same run on two worker threads (bit-identical results, checked here).
 * Targets: ≥ 10⁷ trials/s on one core, ≥ 1.6× that with two workers, ≥ 6× the straightforward
 * implementation. Ratios are per round, medians; the machine is shared, so only ratios measured
 * in one run count. Also measured: what two threads get for this kernel at all (two one-thread
 * runs at once, nothing shared), the ceiling of the pool's speed-up on the machine.
 * `--workers` runs only the worker comparison: on a machine loaded by others,
 * `pnpm run build && tsc -p test/bench/tsconfig.json && chrt -f 10 node
 * .bench-build/test/bench/uncertainty.bench.js --workers` keeps their load off it for the
 * seconds it takes (real-time priority; as root).
 */
import { availableParallelism, loadavg } from 'node:os';
import { Worker } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import { monteCarlo, sampleCoverageIntervals, type InputQuantities } from '@bridgework/uncertainty';
import { createMonteCarloPool } from '@bridgework/uncertainty/node';
import {
  twelveInputModel,
  twelveInputPositional,
  twelveInputs,
} from '../../packages/uncertainty/test/support/benchModel.js';
import { compare, report, sinkValue } from './harness.js';

const trials = 1_000_000;
// The straightforward implementations get their own copy of the model (same source, a separate
// function object), so their calls with other object shapes do not change how the JIT compiles
// the model for monteCarlo (and vice versa) — as if each were its own program.
const naiveModel = new Function(`return ${twelveInputModel.toString()}`)() as typeof twelveInputModel;
const inputs = twelveInputs as InputQuantities;
const names = Object.keys(inputs);
const specs = names.map(
  (n) => inputs[n] as { value: number; standardUncertainty?: number; halfWidth?: number },
);

/** Box–Muller: one normal from two Math.random() calls. */
function boxMuller(): number {
  const u1 = 1 - Math.random();
  const u2 = Math.random();
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/** The JCGM 101 results from a sample by the straightforward route: mean, sd, full sort. */
function summarize(ys: Float64Array): number {
  let sum = 0;
  for (const y of ys) sum += y;
  const mean = sum / ys.length;
  let ss = 0;
  for (const y of ys) ss += (y - mean) ** 2;
  const sd = Math.sqrt(ss / (ys.length - 1));
  ys.sort();
  const q = Math.floor(0.95 * ys.length + 0.5);
  const r = Math.ceil((ys.length - q) / 2);
  let best = Infinity;
  for (let i = 0; i < ys.length - q; i++) best = Math.min(best, (ys[i + q] as number) - (ys[i] as number));
  return mean + sd + (ys[r - 1] as number) + (ys[r - 1 + q] as number) + best;
}

/** Straightforward, generic: a fresh object per trial filled by a loop over the inputs. */
function naiveGeneric(): number {
  const ys = new Float64Array(trials);
  for (let t = 0; t < trials; t++) {
    const x: Record<string, number> = {};
    for (let k = 0; k < names.length; k++) {
      const q = specs[k]!;
      x[names[k]!] =
        q.standardUncertainty !== undefined
          ? q.value + q.standardUncertainty * boxMuller()
          : q.value + q.halfWidth! * (2 * Math.random() - 1);
    }
    ys[t] = naiveModel(x);
  }
  return summarize(ys);
}

/** Straightforward, written out: the object literal per trial, the fastest naive form. */
function naiveByHand(): number {
  const ys = new Float64Array(trials);
  for (let t = 0; t < trials; t++) {
    const x = {
      a: 1 + 0.1 * boxMuller(),
      b: 3 + 0.2 * (2 * Math.random() - 1),
      c: 3 + 0.1 * boxMuller(),
      d: 5 + 0.2 * (2 * Math.random() - 1),
      e: 5 + 0.1 * boxMuller(),
      f: 7 + 0.2 * (2 * Math.random() - 1),
      g: 7 + 0.1 * boxMuller(),
      h: 9 + 0.2 * (2 * Math.random() - 1),
      i: 9 + 0.1 * boxMuller(),
      j: 11 + 0.2 * (2 * Math.random() - 1),
      k: 11 + 0.1 * boxMuller(),
      l: 13 + 0.2 * (2 * Math.random() - 1),
    };
    ys[t] = naiveModel(x);
  }
  return summarize(ys);
}

let seed = 0;
const ours = (): number => {
  const r = monteCarlo({ model: twelveInputModel, inputs, trials, seed: seed++ });
  return r.value + r.interval.min + r.shortestInterval.max;
};

console.log(
  `machine: ${availableParallelism()} cores, load average ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);

// `--workers`: only the worker-thread comparison below (a short run, e.g. under `chrt` on a shared machine).
const workersOnly = process.argv.includes('--workers');
if (!workersOnly) {
  const results = compare(
    [
      {
        name: 'naive generic (Math.random, Box–Muller, object per trial, full sort)',
        opsPerCall: trials,
        run: naiveGeneric,
      },
      { name: 'naive by hand (object literal per trial, full sort)', opsPerCall: trials, run: naiveByHand },
      { name: 'monteCarlo, one thread (incl. intervals and GUM)', opsPerCall: trials, run: ours },
    ],
    { rounds: 7, minMillisPerRound: 100, warmupCalls: 3 },
  );
  report('uncertainty: Monte Carlo, 12 inputs, 10⁶ trials, per trial', results);
  const single = results[2]!;
  const byHand = results[1]!;
  console.log(`  one thread: ${(1e3 / single.nsPerOp).toFixed(2)} million trials/s (target ≥ 10)`);
  console.log(
    `  speed-up over naive by hand: ${(byHand.ratioToBaseline / single.ratioToBaseline).toFixed(2)}× (target ≥ 6)`,
  );
  console.log(`  speed-up over naive generic: ${(1 / single.ratioToBaseline).toFixed(2)}×`);

  // Model forms (issue 13 item 5): named reads through the record, the positional form, and a
  // record read in a loop by computed keys (how a model over a parameter list written by name
  // tends to look). Same draws, same values; GUM comparison off so only the trials count.
  const orderOfInputs = twelveInputPositional.order;
  const parameters = new Float64Array(orderOfInputs.length);
  function recordReadInLoop(x: Readonly<Record<string, number>>): number {
    for (let i = 0; i < orderOfInputs.length; i++) parameters[i] = x[orderOfInputs[i]!]!;
    return twelveInputPositional.evaluate(parameters);
  }
  const formCases = [
    { name: 'record model, named reads', model: twelveInputModel },
    { name: 'positional model { order, evaluate }', model: twelveInputPositional },
    { name: 'record model read in a loop by key', model: recordReadInLoop },
  ] as const;
  const formResults = compare(
    formCases.map((c, k) => ({
      name: c.name,
      opsPerCall: trials,
      run: (call: number) =>
        monteCarlo({ model: c.model, inputs, trials, seed: call + 1000 * k, compareWithGum: false }).value,
    })),
    { rounds: 7, minMillisPerRound: 100, warmupCalls: 3 },
  );
  report(
    'uncertainty: model forms, 12 inputs, 10⁶ trials, per trial (ratio to the record form)',
    formResults,
  );

  // Selection of the tails against a full sort, on the same 10⁶ model values.
  const values = monteCarlo({
    model: twelveInputModel,
    inputs,
    trials,
    returnValues: true,
    compareWithGum: false,
  }).values!;
  const intervalResults = compare(
    [
      {
        name: 'full sort + JCGM 101 7.7',
        opsPerCall: trials,
        run: () => summarize(values.slice()),
      },
      {
        name: 'sampleCoverageIntervals (tails only)',
        opsPerCall: trials,
        run: () => {
          const r = sampleCoverageIntervals(values, 0.95);
          return r.interval.min + r.shortestInterval.max;
        },
      },
    ],
    { rounds: 7, minMillisPerRound: 100, warmupCalls: 3 },
  );
  report('uncertainty: coverage intervals of 10⁶ values, per value', intervalResults);
}

// Two worker threads against one thread, alternating, ratio per round (issue 19 item 5).
const pool = await createMonteCarloPool({
  model: {
    module: new URL('../../packages/uncertainty/test/support/benchModel.js', import.meta.url),
    exportName: 'twelveInputModel',
  },
  workers: 2,
});
const check = await pool.run({ inputs, trials, seed: 77, returnValues: true });
const reference = monteCarlo({ model: twelveInputModel, inputs, trials, seed: 77, returnValues: true });
const sameValues = check.values!.every((v, i) => Object.is(v, reference.values![i]));
const identical =
  sameValues && JSON.stringify({ ...check, values: 0 }) === JSON.stringify({ ...reference, values: 0 });
// Warm-up: a run reaches full speed only after about ten runs of 10⁶ trials (the optimizing
// compiler tiers up late), in each worker and on this thread alike.
for (let i = 0; i < 12; i++) {
  await pool.run({ inputs, trials, seed: i });
  monteCarlo({ model: twelveInputModel, inputs, trials, seed: i });
}
// The main thread's own work in a pooled run (planning, merges, intervals, the GUM comparison):
// the time its event loop is busy, against the time it waits for the workers.
const mainBusy: number[] = [];
const mainBusyNoGum: number[] = [];
for (let r = 0; r < 7; r++) {
  for (const compareWithGum of [true, false]) {
    const before = performance.eventLoopUtilization();
    await pool.run({ inputs, trials, seed: 100 + r, compareWithGum });
    (compareWithGum ? mainBusy : mainBusyNoGum).push(performance.eventLoopUtilization(before).active);
  }
}
const rounds = 11;
const single2: number[] = [];
const workers2: number[] = [];
let sink = 0;
for (let r = 0; r < rounds; r++) {
  const order = r % 2 === 0 ? ['one', 'two'] : ['two', 'one'];
  for (const which of order) {
    const t0 = performance.now();
    if (which === 'one') sink += monteCarlo({ model: twelveInputModel, inputs, trials, seed: r }).value;
    else sink += (await pool.run({ inputs, trials, seed: r })).value;
    (which === 'one' ? single2 : workers2).push(performance.now() - t0);
  }
}
await pool.close();
const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;
const fastest = (xs: number[]): number => Math.min(...xs);
const speedups = single2.map((t, i) => t / workers2[i]!);
// Amdahl: with a serial part s and the rest split perfectly, T₂ = s + (T₁ − s)/2, so s = 2T₂ − T₁.
const serial = single2.map((t, i) => 2 * workers2[i]! - t);

// The same comparison with the model in the positional form (what the channel budget uses): no
// getters per input read, so its speed does not hang on the optimizing compiler inlining them.
const positionalPool = await createMonteCarloPool({
  model: {
    module: new URL('../../packages/uncertainty/test/support/benchModel.js', import.meta.url),
    exportName: 'twelveInputPositional',
  },
  workers: 2,
});
for (let i = 0; i < 12; i++) {
  await positionalPool.run({ inputs, trials, seed: i });
  monteCarlo({ model: twelveInputPositional, inputs, trials, seed: i });
}
const singleP: number[] = [];
const workersP: number[] = [];
for (let r = 0; r < rounds; r++) {
  const order = r % 2 === 0 ? ['one', 'two'] : ['two', 'one'];
  for (const which of order) {
    const t0 = performance.now();
    if (which === 'one') sink += monteCarlo({ model: twelveInputPositional, inputs, trials, seed: r }).value;
    else sink += (await positionalPool.run({ inputs, trials, seed: r })).value;
    (which === 'one' ? singleP : workersP).push(performance.now() - t0);
  }
}
await positionalPool.close();
const speedupsP = singleP.map((t, i) => t / workersP[i]!);
const serialP = singleP.map((t, i) => 2 * workersP[i]! - t);

// What the machine gives two threads at all: the same fixed integer loop on two workers at once
// against twice on one (no shared data, no serial part). Two vCPUs that are hyperthreads of one
// core, or a host under load, give well below 2 here, and Monte Carlo cannot beat it.
const spin = `
  const { parentPort } = require('node:worker_threads');
  parentPort.on('message', (n) => {
    let a = 1, b = 2, c = 3, d = 4, s = 0;
    for (let i = 0; i < n; i++) {
      const t = b << 9; c ^= a; d ^= b; b ^= c; a ^= d; c ^= t; d = (d << 11) | (d >>> 21);
      s = (s + Math.imul(b, 5)) | 0;
    }
    parentPort.postMessage(s);
  });`;
const spinners = [0, 1].map(() => new Worker(spin, { eval: true }));
const spinOnce = (w: Worker, n: number): Promise<number> =>
  new Promise((resolve) => {
    w.once('message', resolve);
    w.postMessage(n);
  });
const spinN = 200_000_000;
await Promise.all(spinners.map((w) => spinOnce(w, spinN / 10))); // warm-up
const capacity: number[] = [];
for (let r = 0; r < 5; r++) {
  let t0 = performance.now();
  await spinOnce(spinners[0]!, spinN);
  await spinOnce(spinners[0]!, spinN);
  const serialSpin = performance.now() - t0;
  t0 = performance.now();
  await Promise.all(spinners.map((w) => spinOnce(w, spinN)));
  capacity.push(serialSpin / (performance.now() - t0));
}
await Promise.all(spinners.map((w) => w.terminate()));

// What two threads get for this kernel: the same one-thread monteCarlo (no pool, nothing shared)
// in two threads at once against one alone, timed inside each thread. A machine whose cores share
// what this kernel leans on gives less here than for the integer loop above, and no pool can
// beat this figure.
const kernelThreads = [0, 1].map(() => new Worker(new URL('./monteCarloThread.js', import.meta.url)));
const kernelOnce = (w: Worker): Promise<number> =>
  new Promise((resolve) => {
    w.once('message', (m: { millis: number }) => resolve(m.millis));
    w.postMessage(trials);
  });
// Warm-up one thread at a time, so each compiles its optimized code with a core to spare (a run
// reaches full speed only after about ten runs of 10⁶ trials).
for (const w of kernelThreads) for (let i = 0; i < 12; i++) await kernelOnce(w);
const kernelAlone: number[] = [];
const kernelTogether: number[] = [];
for (let r = 0; r < 7; r++) {
  kernelAlone.push(await kernelOnce(kernelThreads[0]!));
  kernelTogether.push(...(await Promise.all(kernelThreads.map(kernelOnce))));
}
await Promise.all(kernelThreads.map((w) => w.terminate()));
const kernelCapacity = (2 * median(kernelAlone)) / median(kernelTogether);

console.log('\nuncertainty: two worker threads against one thread, 10⁶ trials');
console.log(
  `  one thread   ${median(single2).toFixed(1).padStart(7)} ms  (${(trials / median(single2) / 1e3).toFixed(2)} million trials/s)`,
);
console.log(
  `  two workers  ${median(workers2).toFixed(1).padStart(7)} ms  (${(trials / median(workers2) / 1e3).toFixed(2)} million trials/s)`,
);
console.log(
  `  speed-up (median of per-round ratios): ${median(speedups).toFixed(2)}× (target ≥ 1.6); results bit-identical (values and result): ${identical}`,
);
console.log(
  `  serial part (Amdahl, 2·T₂ − T₁, median): ${median(serial).toFixed(1)} ms of ${median(workers2).toFixed(1)} ms`,
);
// On a machine shared with other work a round's time swings by up to 2× with what the other
// vCPU runs; the fastest round of each is what the code does with both vCPUs free.
console.log(
  `  fastest round: one thread ${fastest(single2).toFixed(1)} ms, two workers ${fastest(workers2).toFixed(1)} ms (${(fastest(single2) / fastest(workers2)).toFixed(2)}×); positional ${fastest(singleP).toFixed(1)} / ${fastest(workersP).toFixed(1)} ms (${(fastest(singleP) / fastest(workersP)).toFixed(2)}×)`,
);
console.log(
  `  positional model: one thread ${median(singleP).toFixed(1)} ms, two workers ${median(workersP).toFixed(1)} ms (${(trials / median(workersP) / 1e3).toFixed(2)} million trials/s), speed-up ${median(speedupsP).toFixed(2)}×, serial part ${median(serialP).toFixed(1)} ms`,
);
console.log(
  `  main thread busy during a pooled run (median): ${median(mainBusy).toFixed(1)} ms with the GUM comparison, ${median(mainBusyNoGum).toFixed(1)} ms without`,
);
console.log(
  `  what two threads get on this machine (a fixed loop, two at once against twice in one): ${median(capacity).toFixed(2)}×; Monte Carlo's share of it: ${(median(speedups) / median(capacity)).toFixed(2)}`,
);
console.log(
  `  what two threads get for this kernel (one-thread monteCarlo in two threads at once, nothing shared): ${kernelCapacity.toFixed(2)}× (${median(kernelAlone).toFixed(1)} ms alone, ${median(kernelTogether).toFixed(1)} ms each together); the pool's share of it: ${(median(speedups) / kernelCapacity).toFixed(2)}`,
);
console.log(
  `machine after: load average ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
console.log(`\n(sink ${(sinkValue() + sink * 1e-30).toExponential(3)})`);
