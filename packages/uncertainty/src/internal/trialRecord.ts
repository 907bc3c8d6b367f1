/**
 * The record a model receives: one object per list of input names, whose properties are getters
 * reading the current trial's row of a Float64Array of rows (one row of n input values per
 * trial). Records are cached by their names, so a model sees one object of one shape — in every
 * Monte Carlo run and in the law of propagation alike — and its property reads stay
 * monomorphic, which the JIT inlines. A record in use (a model that itself calls monteCarlo or
 * propagate) is not shared.
 */
/** Trials generated at once inside a block (sized so the rows stay in cache). */
export const CHUNK_TRIALS = 2048;

/** A record whose properties read the current row, with the rows it reads. */
export interface TrialRecord {
  readonly record: Readonly<Record<string, number>>;
  /** CHUNK_TRIALS rows of n values: input j of trial t at t·n + j. */
  readonly rows: Float64Array;
  /** `row` = t·n for trial t. */
  readonly cursor: { row: number };
  inUse: boolean;
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
  const cursor = { row: 0 };
  const record: Record<string, number> = {};
  names.forEach((name, j) => {
    Object.defineProperty(record, name, { get: () => rows[cursor.row + j] as number, enumerable: true });
  });
  const fresh: TrialRecord = { record, rows, cursor, inUse: true };
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
