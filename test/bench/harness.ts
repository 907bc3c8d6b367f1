/**
 * A small, honest benchmark harness. Timings on a shared machine are noisy, so the figures that
 * matter are ratios between cases measured in the same process, round by round:
 * - every case is warmed up with small calls first (so the JIT has compiled it),
 * - each round runs every case once, in a rotating order (no case always runs first or last),
 * - each case's result is folded into a sink that is printed, so no work can be optimised away,
 * - the reported figure is the median over rounds of time per operation, and the ratio of each
 *   case to the baseline is computed per round and its median reported.
 */
import { performance } from 'node:perf_hooks';

export interface BenchCase {
  /** Short name printed in the table. */
  readonly name: string;
  /** Operations performed by one call of `run` (e.g. samples converted). */
  readonly opsPerCall: number;
  /** Performs the work once; `call` counts up from 0 (use it to alternate buffers). Returns a value for the sink. */
  run(call: number): number;
}

export interface BenchResult {
  readonly name: string;
  /** Median time per operation over the rounds, in ns. */
  readonly nsPerOp: number;
  /** Median over rounds of (this case's time per op) / (the baseline's time per op). */
  readonly ratioToBaseline: number;
}

export interface CompareOptions {
  /** Number of measured rounds. Default 9. */
  readonly rounds?: number;
  /** Minimum time each case runs in one round, in ms. Default 150. */
  readonly minMillisPerRound?: number;
  /** Calls made during warm-up of each case. Default 50. */
  readonly warmupCalls?: number;
}

let sink = 0;

/** The folded results of every case run so far (print it so the work is observable). */
export function sinkValue(): number {
  return sink;
}

function timeCase(c: BenchCase, calls: number, start: number): number {
  let acc = 0;
  const t0 = performance.now();
  for (let i = 0; i < calls; i++) acc += c.run(start + i);
  const t1 = performance.now();
  sink += Number.isFinite(acc) ? acc * 1e-30 : 1;
  return ((t1 - t0) * 1e6) / (calls * c.opsPerCall);
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

/** Measures the cases against the first one (the baseline) and returns per-case medians. */
export function compare(cases: readonly BenchCase[], options: CompareOptions = {}): BenchResult[] {
  const rounds = options.rounds ?? 9;
  const minMs = options.minMillisPerRound ?? 150;
  const warmup = options.warmupCalls ?? 50;
  // Warm-up with small calls, then size each case's call count to take about minMs.
  const callsPerRound = cases.map((c) => {
    for (let i = 0; i < warmup; i++) sink += c.run(i) * 1e-30;
    let calls = 1;
    for (;;) {
      const t0 = performance.now();
      timeCase(c, calls, 0);
      const ms = performance.now() - t0;
      if (ms >= minMs / 4 || calls > 1e9)
        return Math.max(1, Math.round((calls * minMs) / Math.max(ms, 1e-3)));
      calls *= 4;
    }
  });
  const perRound: number[][] = cases.map(() => []);
  let counter = 0;
  for (let r = 0; r < rounds; r++) {
    for (let k = 0; k < cases.length; k++) {
      const i = (k + r) % cases.length;
      perRound[i]!.push(timeCase(cases[i]!, callsPerRound[i]!, counter));
      counter += callsPerRound[i]!;
    }
  }
  const base = perRound[0]!;
  return cases.map((c, i) => ({
    name: c.name,
    nsPerOp: median(perRound[i]!),
    ratioToBaseline: median(perRound[i]!.map((t, r) => t / (base[r] as number))),
  }));
}

/** Prints a result table with a title. */
export function report(title: string, results: readonly BenchResult[]): void {
  console.log(`\n${title}`);
  const width = Math.max(...results.map((r) => r.name.length), 10);
  console.log(`  ${'case'.padEnd(width)}  ${'ns/op'.padStart(10)}  ${'× baseline'.padStart(10)}`);
  for (const r of results) {
    console.log(
      `  ${r.name.padEnd(width)}  ${r.nsPerOp.toFixed(2).padStart(10)}  ${r.ratioToBaseline.toFixed(3).padStart(10)}`,
    );
  }
}

/** The outcome of {@link checkBaseline}. */
export interface BaselineCheck {
  /** Median time per operation of the baseline as the harness runs it, ns. */
  readonly harnessNsPerOp: number;
  /** Median time per operation of the standalone copy timed by a bare loop, ns. */
  readonly standaloneNsPerOp: number;
  /** Median over rounds of harness time / standalone time. */
  readonly ratio: number;
  /** Whether the two agree within the tolerance. */
  readonly ok: boolean;
}

/**
 * The bench's honesty check: the baseline as the harness runs it must be as fast as a standalone
 * copy of the same loop timed by a bare `for` loop in the same process. A baseline slowed by the
 * harness (a polymorphic call site, constants read through closures, typed arrays of several
 * kinds through one function) would make every ratio flatter the code under test.
 *
 * @param baseline - The baseline case exactly as passed to {@link compare}.
 * @param standalone - The same work through a separate copy of the loop function (made with
 *   `new Function` from the same source, so it shares no JIT feedback), called directly.
 * @param options - Rounds and the tolerance (default 0.15: the two may differ by at most 15 %).
 * @returns The figures; `ok` false when they differ by more than the tolerance.
 */
export function checkBaseline(
  baseline: BenchCase,
  standalone: (call: number) => number,
  options: {
    readonly rounds?: number;
    readonly minMillisPerRound?: number;
    readonly tolerance?: number;
  } = {},
): BaselineCheck {
  const rounds = options.rounds ?? 9;
  const minMs = options.minMillisPerRound ?? 150;
  const tolerance = options.tolerance ?? 0.15;
  for (let i = 0; i < 3; i++) {
    sink += baseline.run(i) * 1e-30;
    sink += standalone(i) * 1e-30;
  }
  const t0 = performance.now();
  sink += baseline.run(0) * 1e-30;
  const calls = Math.max(1, Math.round(minMs / Math.max(performance.now() - t0, 1e-3)));
  const harness: number[] = [];
  const direct: number[] = [];
  for (let r = 0; r < rounds; r++) {
    // Alternate which runs first, so a drift of the machine's load favours neither.
    const first = r % 2 === 0;
    if (first) harness.push(timeCase(baseline, calls, r * calls));
    let acc = 0;
    const s0 = performance.now();
    for (let i = 0; i < calls; i++) acc += standalone(r * calls + i);
    direct.push(((performance.now() - s0) * 1e6) / (calls * baseline.opsPerCall));
    sink += Number.isFinite(acc) ? acc * 1e-30 : 1;
    if (!first) harness.push(timeCase(baseline, calls, r * calls));
  }
  const ratio = median(harness.map((h, i) => h / (direct[i] as number)));
  return {
    harnessNsPerOp: median(harness),
    standaloneNsPerOp: median(direct),
    ratio,
    ok: Math.abs(ratio - 1) <= tolerance,
  };
}

/** Prints a baseline check and sets a failing exit code when it is off. */
export function reportBaselineCheck(name: string, check: BaselineCheck): void {
  console.log(
    `\nbaseline self-check (${name}): harness ${check.harnessNsPerOp.toFixed(3)} ns/op, standalone copy ${check.standaloneNsPerOp.toFixed(3)} ns/op, ratio ${check.ratio.toFixed(3)} — ${check.ok ? 'ok' : 'OFF BY MORE THAN 15 %: the ratios of this benchmark would not be honest'}`,
  );
  if (!check.ok) process.exitCode = 1;
}
