/**
 * The attacks of issue 15, kept: every exported function of every library package (and every
 * method of the evaluators they create) is called with each field of a valid call set in turn to
 * NaN, ±Infinity, −1, 0, 1e308, 1e−308, a string, null, undefined, {}, [] and a long array, plus
 * seeded random values. Each outcome must be a `BridgeworkError` with a code from the closed list,
 * or a finite result of the documented shape, within a time box. The base calls are in calls/*.ts;
 * the engine in harness.ts; the calls run in a worker thread (worker.ts) so a call that never
 * returns is cut off and reported.
 *
 * More cases: `BRIDGEWORK_HEAVY=1` (100 000 random cases on top); another seed: `FUZZ_SEED=<n>`.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { baseCalls, constants, libraryPackages, notCalled, pending, type LibraryPackage } from './catalog.js';
import { allCalls } from './catalog.js';
import {
  caseText,
  casesOf,
  misspell,
  optionObjectsOf,
  pathText,
  run,
  withValue,
  type BaseCall,
  type Outcome,
  type Path,
} from './harness.js';
import type { SpecIssue } from '@bridgework/core';
import { isKnown, knownDefects, knownOptionDefects, type KnownDefect } from './knownDefects.js';
import type { FuzzFailure, FuzzJob, FuzzReport } from './worker.js';

/** Splits findings into known ones (by entry) and new ones; entries that match nothing are stale. */
function sortOut(found: readonly string[], known: readonly KnownDefect[]) {
  const fresh = found.filter((f) => !known.some((k) => isKnown(f, k)));
  const stale = known
    .filter((k) => k.random !== true && !found.some((f) => isKnown(f, k)))
    .map((k) => String(k.cases));
  return { fresh, stale };
}

const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';
const seed = Number(process.env['FUZZ_SEED'] ?? 20261215);
const extra = heavy ? 100_000 : 2_500;
/** A case whose progress counter does not move for this long is cut off as a hang. */
const HANG_MILLISECONDS = Number(process.env['FUZZ_HANG_MS'] ?? 30_000);
/** A single call slower than this is a failure (the machines are shared: generous). */
const SLOW_MILLISECONDS = 5_000;

const covered = libraryPackages.filter((p) => baseCalls[p] !== undefined);
const label = (c: BaseCall): string => `${c.name}${c.variant === undefined ? '' : ` [${c.variant}]`}`;

async function exportsOf(p: LibraryPackage): Promise<Record<string, unknown>> {
  return (await import(`@bridgework/${p}`)) as Record<string, unknown>;
}

describe('library fuzz: the table of base calls covers every export', () => {
  it('lists each library package as covered or pending (by name)', () => {
    expect([...covered, ...pending].sort()).toEqual([...libraryPackages].sort());
    for (const p of pending) expect(baseCalls[p], p).toBeUndefined();
  });

  it.each(covered)(
    '%s: every exported function has a base call, every other export is a listed constant',
    async (p) => {
      const exports = await exportsOf(p);
      const functions = Object.keys(exports).filter((k) => typeof exports[k] === 'function');
      const values = Object.keys(exports).filter((k) => typeof exports[k] !== 'function');
      const called = new Set(baseCalls[p]!.filter((c) => !c.name.includes('().')).map((c) => c.name));
      const skipped = Object.keys(notCalled[p] ?? {});
      expect([...called, ...skipped].sort(), `${p}: functions covered`).toEqual(functions.sort());
      expect([...(constants[p] ?? [])].sort(), `${p}: constants`).toEqual(values.sort());
      // Not vacuous: the counts add up to the whole export list.
      expect(called.size + skipped.length + values.length).toBe(Object.keys(exports).length);
    },
  );

  it.each(covered)('%s: every method of every evaluator has a base call', async (p) => {
    const calls = baseCalls[p]!;
    const methods = new Set(calls.filter((c) => c.name.includes('().')).map((c) => c.name));
    const expected = new Set<string>();
    for (const c of calls.filter((x) => !x.name.includes('().'))) {
      const outcome = await run(c, c.args());
      expect(outcome.kind, label(c)).toBe('result');
      const value = outcome.kind === 'result' ? outcome.value : undefined;
      if (typeof value !== 'object' || value === null) continue;
      for (const [key, v] of Object.entries(value)) {
        if (typeof v === 'function') expected.add(`${c.name}().${key}`);
      }
    }
    expect([...methods].sort()).toEqual([...expected].sort());
  });
});

describe('options rule: every options object refuses a misspelt key, naming the closest', () => {
  const allBroken: string[] = [];
  it.each(covered)('%s', async (p) => {
    let checked = 0;
    const broken: string[] = [];
    for (const c of baseCalls[p]!) {
      for (const field of optionObjectsOf(c)) {
        const obj = field.base as Record<string, unknown>;
        const key = Object.keys(obj)[0]!;
        const typo = misspell(key);
        if (Object.hasOwn(obj, typo)) continue;
        const outcome = await run(c, withValue(c.args(), field.path, { ...obj, [typo]: obj[key] }));
        checked++;
        const ok =
          c.spec === true && field.path[0] === 0
            ? specNamesTypo(outcome, field.path, typo)
            : outcome.kind === 'typed' &&
              outcome.code === 'unknown-option' &&
              outcome.param !== undefined &&
              outcome.param.endsWith(typo) &&
              outcome.message.includes(`\`${key}\``);
        if (!ok) {
          const got = outcome.kind === 'typed' ? `${outcome.code}: ${outcome.message}` : outcome.kind;
          broken.push(`${label(c)}: ${pathText(field.path)} + '${typo}' → ${got}`);
        }
      }
    }
    allBroken.push(...broken);
    expect(sortOut(broken, knownOptionDefects).fresh).toEqual([]);
    expect(checked).toBeGreaterThan(0);
  });

  it('lists no option defect that is already fixed (test/fuzz/knownDefects.ts)', () => {
    expect(sortOut(allBroken, knownOptionDefects).stale).toEqual([]);
  });
});

/**
 * A spec's misspelt field is an `unknown-option` issue at its own field path (`sensor.kidn`, or
 * `channels.0.sensor.kidn` under a validator's path prefix), whether thrown in an `invalid-spec`
 * error or returned by a validator, and it is the only problem.
 */
function specNamesTypo(outcome: Outcome, path: Path, typo: string): boolean {
  const fieldPath = [...path.slice(1), typo].join('.');
  let issues: readonly SpecIssue[] | undefined;
  if (outcome.kind === 'typed' && outcome.code === 'invalid-spec') issues = outcome.issues;
  if (outcome.kind === 'result' && typeof outcome.value === 'object' && outcome.value !== null) {
    const v = outcome.value as { ok?: unknown; issues?: readonly SpecIssue[] };
    if (v.ok === false) issues = v.issues;
  }
  return (
    issues?.length === 1 &&
    issues[0]!.code === 'unknown-option' &&
    (issues[0]!.path === fieldPath || issues[0]!.path.endsWith(`.${fieldPath}`))
  );
}

/** Starts the fuzz worker from TypeScript (tsx's loader registered first, as the uncertainty pool does). */
function startWorker(job: FuzzJob): Worker {
  const tsx = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const api = pathToFileURL(join(tsx, 'dist', 'esm', 'api', 'index.mjs')).href;
  const target = new URL('./worker.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); });`;
  return new Worker(code, { eval: true, workerData: job, execArgv: ['--conditions=@bridgework/source'] });
}

interface Run {
  readonly total: number;
  readonly calls: number;
  readonly failures: FuzzFailure[];
  readonly baseFailures: readonly string[];
}

/** The description of a case by its index (the worker builds the same list from the same seed). */
function describeCase(index: number): string {
  const c = casesOf(allCalls(), seed, extra)[index];
  return c === undefined ? `case #${index}` : caseText(c);
}

/** Runs every case, restarting the worker past a case that hangs (reported as a failure). */
async function fuzz(): Promise<Run> {
  const failures: FuzzFailure[] = [];
  let calls = 0;
  let start = 0;
  let total = Infinity;
  let baseFailures: readonly string[] = [];
  while (start < total) {
    const progress = new SharedArrayBuffer(8);
    const counters = new Int32Array(progress);
    Atomics.store(counters, 0, start);
    const worker = startWorker({ seed, extra, start, slowMilliseconds: SLOW_MILLISECONDS, progress });
    const outcome = await new Promise<FuzzReport | { hungAt: number } | { crashed: string }>((resolve) => {
      let last = -1;
      let since = Date.now();
      const timer = setInterval(() => {
        const now = Atomics.load(counters, 1);
        if (now !== last) {
          last = now;
          since = Date.now();
        } else if (Date.now() - since > HANG_MILLISECONDS) {
          clearInterval(timer);
          const hungAt = Atomics.load(counters, 0);
          void worker.terminate().then(() => resolve({ hungAt }));
        }
      }, 250);
      worker.once('message', (report: FuzzReport) => {
        clearInterval(timer);
        resolve(report);
      });
      worker.once('error', (e) => {
        clearInterval(timer);
        resolve({ crashed: `${e.name}: ${e.message}` });
      });
    });
    await worker.terminate();
    if ('hungAt' in outcome) {
      calls += Atomics.load(counters, 1) + 1;
      failures.push({
        index: outcome.hungAt,
        text: describeCase(outcome.hungAt),
        problem: `no answer within ${HANG_MILLISECONDS} ms`,
      });
      start = outcome.hungAt + 1;
      continue;
    }
    if ('crashed' in outcome) {
      const at = Atomics.load(counters, 0);
      failures.push({ index: at, text: describeCase(at), problem: `the worker died: ${outcome.crashed}` });
      calls += Atomics.load(counters, 1) + 1;
      start = at + 1;
      continue;
    }
    total = outcome.total;
    calls += outcome.calls;
    failures.push(...outcome.failures);
    baseFailures = outcome.baseFailures;
    start = total;
  }
  return { total, calls, failures, baseFailures };
}

describe('library fuzz: typed errors or finite documented results, within a time box', () => {
  it(
    `calls every covered function with attacked fields (${heavy ? 'heavy' : 'default'} run, seed ${seed})`,
    async () => {
      const r = await fuzz();
      expect(r.baseFailures, 'every base call succeeds with a finite result').toEqual([]);
      expect(r.calls).toBe(r.total);
      expect(r.calls).toBeGreaterThanOrEqual(heavy ? 100_000 : 10_000);
      const texts = r.failures.map((f) => `${f.text}: ${f.problem}`);
      const { fresh, stale } = sortOut(texts, knownDefects);
      expect(fresh, 'new defects (fix them, or list them with their owner in knownDefects.ts)').toEqual([]);
      expect(stale, 'listed defects that no longer occur: delete them from knownDefects.ts').toEqual([]);
    },
    heavy ? 3_600_000 : 600_000,
  );
});
