/**
 * The record a model receives: one object per list of input names, whose properties are getters
 * reading the current trial of one Float64Array column each. Records are cached by their names,
 * so a model sees one object of one shape — in every Monte Carlo run and in the law of
 * propagation alike — and its property reads stay monomorphic, which the JIT inlines. A record
 * in use (a model that itself calls monteCarlo or propagate) is not shared.
 */
/** Trials generated at once inside a block (sized so the columns stay in cache). */
export const CHUNK_TRIALS = 2048;

/** A record whose properties read the current trial of each column, with the columns it reads. */
export interface TrialRecord {
  readonly record: Readonly<Record<string, number>>;
  readonly columns: readonly Float64Array[];
  readonly cursor: { index: number };
  inUse: boolean;
}

const records = new Map<string, TrialRecord>();

/**
 * The trial record for a list of input names (columns of CHUNK_TRIALS values), from the cache
 * unless that one is in use; give it back by setting `inUse = false`.
 */
export function acquireRecord(names: readonly string[]): TrialRecord {
  const key = JSON.stringify(names);
  const cached = records.get(key);
  if (cached !== undefined && !cached.inUse) {
    cached.inUse = true;
    return cached;
  }
  const columns = names.map(() => new Float64Array(CHUNK_TRIALS));
  const cursor = { index: 0 };
  const record: Record<string, number> = {};
  names.forEach((name, j) => {
    const column = columns[j] as Float64Array;
    Object.defineProperty(record, name, { get: () => column[cursor.index] as number, enumerable: true });
  });
  const fresh: TrialRecord = { record, columns, cursor, inUse: true };
  if (cached === undefined) {
    if (records.size >= 32) records.delete(records.keys().next().value as string);
    records.set(key, fresh);
  }
  return fresh;
}
