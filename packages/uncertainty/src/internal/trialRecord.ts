/**
 * The record a model receives: one plain object per list of input names, whose own data
 * properties hold the current trial's input values, copied from a Float64Array of rows (one row
 * of n input values per trial) before each model call. Records are cached by their names, so a
 * model sees one object of one shape — in every Monte Carlo run and in the law of propagation
 * alike — and its property reads are monomorphic field loads, whatever the optimizing compiler
 * decides to inline (reads through getters ran at one of two speeds, 2× apart, depending on
 * that). The record is sealed: a model cannot add properties to it. A record in use (a model
 * that itself calls monteCarlo or propagate) is not shared.
 */
/** Trials generated at once inside a block (sized so the rows stay in cache). */
export const CHUNK_TRIALS = 2048;

/** A record of plain data properties, with the rows it is filled from. */
export interface TrialRecord {
  readonly record: Readonly<Record<string, number>>;
  /** CHUNK_TRIALS rows of n values: input j of trial t at t·n + j. */
  readonly rows: Float64Array;
  /** Copies the row starting at `at` (= t·n for trial t) into the record's properties. */
  readonly load: (at: number) => void;
  /** `row` = t·n for the trial last loaded. */
  readonly cursor: { row: number };
  inUse: boolean;
}

/** A record of the given names and its loader, over the given rows. */
export interface RecordAndLoader {
  readonly record: Readonly<Record<string, number>>;
  readonly load: (at: number) => void;
}

/**
 * Compiles the maker of the record and its loader for these names: an object literal (so the
 * properties are in-object fields of one fixed shape, doubles from the start) and one named store
 * per input. Names are written as JSON string literals (any string is safe); `__proto__` as a
 * computed key, which makes an own property. Undefined where code cannot be compiled (a content
 * security policy without 'unsafe-eval').
 */
function compiledMaker(names: readonly string[]): ((rows: Float64Array) => RecordAndLoader) | undefined {
  const key = (name: string): string =>
    name === '__proto__' ? `[${JSON.stringify(name)}]` : JSON.stringify(name);
  const fields = names.map((name) => `${key(name)}: 0.5`).join(', ');
  const stores = names.map((name, j) => `record[${JSON.stringify(name)}] = rows[at + ${j}];`).join('\n');
  const body = `"use strict";
const record = Object.seal({ ${fields} });
return { record, load(at) {\n${stores}\n} };`;
  try {
    return new Function('rows', body) as (rows: Float64Array) => RecordAndLoader;
  } catch {
    return undefined;
  }
}

/** The same record and loader without compiled code: defined properties and keyed stores. */
function plainRecord(names: readonly string[], rows: Float64Array): RecordAndLoader {
  const record: Record<string, number> = {};
  for (const name of names) {
    Object.defineProperty(record, name, { value: 0.5, writable: true, enumerable: true, configurable: true });
  }
  Object.seal(record);
  return {
    record,
    load(at) {
      for (let j = 0; j < names.length; j++) record[names[j] as string] = rows[at + j] as number;
    },
  };
}

/**
 * A sealed record of plain data properties named `names` (in that order), and `load(at)`, which
 * copies `rows[at + j]` into property j. Compiled code (one named store per input) unless
 * `compiled` is false or code cannot be compiled; both give the same record.
 */
export function recordOver(names: readonly string[], rows: Float64Array, compiled = true): RecordAndLoader {
  const maker = compiled ? compiledMaker(names) : undefined;
  return maker === undefined ? plainRecord(names, rows) : maker(rows);
}

const records = new Map<string, TrialRecord>();

/**
 * The trial record for a list of input names, from the cache unless that one is in use; give it
 * back by setting `inUse = false`.
 */
export function acquireRecord(names: readonly string[]): TrialRecord {
  const key = JSON.stringify(names);
  const cached = records.get(key);
  if (cached !== undefined && !cached.inUse) {
    cached.inUse = true;
    return cached;
  }
  const rows = new Float64Array(CHUNK_TRIALS * names.length);
  const { record, load } = recordOver(names, rows);
  const fresh: TrialRecord = { record, rows, load, cursor: { row: 0 }, inUse: true };
  if (cached === undefined) {
    if (records.size >= 32) records.delete(records.keys().next().value as string);
    records.set(key, fresh);
  }
  return fresh;
}

/** Rows for a positional model, with one view per trial (input j of trial t at view t, place j). */
export interface TrialRows {
  /** CHUNK_TRIALS rows of n values. */
  readonly rows: Float64Array;
  /** `views[t]` = rows t·n … t·n + n − 1. */
  readonly views: readonly Float64Array[];
  inUse: boolean;
}

const rowSets = new Map<number, TrialRows>();

/**
 * Rows and per-trial views for n inputs, from the cache unless that one is in use (so a run does
 * not allocate 2048 views and 16n KB again); give it back by setting `inUse = false`.
 */
export function acquireRows(n: number): TrialRows {
  const cached = rowSets.get(n);
  if (cached !== undefined && !cached.inUse) {
    cached.inUse = true;
    return cached;
  }
  const rows = new Float64Array(CHUNK_TRIALS * n);
  const views = Array.from({ length: CHUNK_TRIALS }, (_, t) => rows.subarray(t * n, t * n + n));
  const fresh: TrialRows = { rows, views, inUse: true };
  if (cached === undefined) {
    if (rowSets.size >= 32) rowSets.delete(rowSets.keys().next().value as number);
    rowSets.set(n, fresh);
  }
  return fresh;
}
