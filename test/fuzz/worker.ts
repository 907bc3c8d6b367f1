/**
 * The fuzz worker: runs the cases of the library fuzz test in a worker thread, so that a call that
 * never returns can be detected (by the progress counter it stops moving) and cut off by the test,
 * instead of hanging the suite.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { allCalls } from './catalog.js';
import { caseText, casesOf, judge, run, withValue, type BaseCall } from './harness.js';

/** What the test hands the worker. */
export interface FuzzJob {
  readonly seed: number;
  readonly extra: number;
  /** The first case to run (after a cut-off worker, the test restarts past the hung case). */
  readonly start: number;
  /** A call taking longer than this is reported as too slow, in ms. */
  readonly slowMilliseconds: number;
  /** Progress: [index of the case running, cases done]. */
  readonly progress: SharedArrayBuffer;
}

/** One broken rule. */
export interface FuzzFailure {
  readonly index: number;
  readonly text: string;
  readonly problem: string;
}

/** What the worker reports when it has run every case from `start`. */
export interface FuzzReport {
  readonly total: number;
  readonly calls: number;
  readonly failures: readonly FuzzFailure[];
  readonly baseFailures: readonly string[];
}

const job = workerData as FuzzJob;
const progress = new Int32Array(job.progress);
const calls = allCalls();

// Each base call must itself succeed with a finite result, or the mutations around it prove nothing.
const bases = new Map<BaseCall, unknown>();
const baseFailures: string[] = [];
for (const call of calls) {
  const outcome = await run(call, call.args());
  const problem = judge(call, outcome, undefined);
  if (outcome.kind !== 'result' || problem !== undefined) {
    baseFailures.push(
      `${call.name}${call.variant === undefined ? '' : ` [${call.variant}]`}: ${problem ?? outcome.kind}`,
    );
  }
  bases.set(call, outcome.kind === 'result' ? outcome.value : undefined);
}

const cases = casesOf(calls, job.seed, job.extra);
const failures: FuzzFailure[] = [];
let done = 0;
for (let index = job.start; index < cases.length; index++) {
  Atomics.store(progress, 0, index);
  const c = cases[index]!;
  const value = c.attack.value();
  const started = performance.now();
  const outcome = await run(c.call, withValue(c.call.args(), c.path, value));
  const elapsed = performance.now() - started;
  const problem = judge(c.call, outcome, bases.get(c.call), value);
  if (problem !== undefined) failures.push({ index, text: caseText(c), problem });
  else if (elapsed > job.slowMilliseconds) {
    failures.push({
      index,
      text: caseText(c),
      problem: `took ${elapsed.toFixed(0)} ms (limit ${job.slowMilliseconds} ms)`,
    });
  }
  done++;
  Atomics.store(progress, 1, done);
}

const report: FuzzReport = { total: cases.length, calls: done, failures, baseFailures };
parentPort?.postMessage(report);
