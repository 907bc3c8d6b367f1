import { BridgeworkError } from './BridgeworkError.js';

/** The longest name {@link editDistance} compares (it takes time proportional to the product of the lengths). */
const MAX_NAME_LENGTH = 4096;
/** The most names {@link closestName} searches. */
const MAX_NAMES = 4096;

function checkName(param: string, value: unknown): string {
  if (typeof value !== 'string') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a string; got ${describe(value)}`, {
      param,
      value,
    });
  }
  if (value.length > MAX_NAME_LENGTH) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be at most ${MAX_NAME_LENGTH} characters long; got ${value.length}`,
      { param, value: value.length, limit: MAX_NAME_LENGTH },
    );
  }
  return value;
}

function describe(value: unknown): string {
  return Array.isArray(value) ? `an array of length ${value.length}` : value === null ? 'null' : typeof value;
}

/**
 * Levenshtein distance between two short strings (names of options, fields and commands).
 *
 * @param a - One name (a string of at most 4096 characters).
 * @param b - The other name (likewise).
 * @returns The least number of single-character insertions, deletions and substitutions.
 * @throws {@link BridgeworkError} `wrong-type` for a non-string; `out-of-range` for a longer one.
 * @example
 * ```ts
 * editDistance('whiteDensty', 'whiteDensity'); // 1
 * ```
 */
export function editDistance(a: string, b: string): number {
  checkName('a', a);
  checkName('b', b);
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      row.push(Math.min((prev[j] as number) + 1, (row[j - 1] as number) + 1, (prev[j - 1] as number) + cost));
    }
    prev = row;
  }
  return prev[b.length] as number;
}

/**
 * Like {@link editDistance}, but two adjacent letters swapped count as one edit (the optimal
 * string alignment distance): `ta` is one typo from `at`, `kidn` one from `kind`.
 */
function typoDistance(a: string, b: string): number {
  let before: number[] = [];
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min((prev[j] as number) + 1, (row[j - 1] as number) + 1, (prev[j - 1] as number) + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        d = Math.min(d, (before[j - 2] as number) + 1);
      }
      row.push(d);
    }
    before = prev;
    prev = row;
  }
  return prev[b.length] as number;
}

/**
 * The known name closest to a mistyped one, if it is close enough to be a likely typo.
 *
 * @remarks
 * A name counts as a likely typo when it differs only in letter case, or is at most two edits
 * away and fewer edits than half its length plus one (an edit: a letter inserted, deleted or
 * replaced, or two adjacent letters swapped). Names longer than 64 characters are not
 * compared (nobody mistypes those; it bounds the work).
 *
 * @param given - The name as written (a string).
 * @param known - The names that exist: an array of at most 4096 strings.
 * @returns The closest known name, or `undefined` when none is close.
 * @throws {@link BridgeworkError} `wrong-type` for a non-string name or a `known` that is not an
 *   array of strings; `out-of-range` for more than 4096 names.
 * @example
 * ```ts
 * closestName('whiteDensty', ['whiteDensity', 'cornerHertz']); // 'whiteDensity'
 * closestName('xyz', ['whiteDensity']); // undefined
 * ```
 */
export function closestName(given: string, known: readonly string[]): string | undefined {
  if (typeof given !== 'string') {
    throw new BridgeworkError('wrong-type', `\`given\` must be a string; got ${describe(given)}`, {
      param: 'given',
      value: given,
    });
  }
  if (!Array.isArray(known) || !known.every((k) => typeof k === 'string')) {
    throw new BridgeworkError('wrong-type', `\`known\` must be an array of strings; got ${describe(known)}`, {
      param: 'known',
      value: known,
    });
  }
  if (known.length > MAX_NAMES) {
    throw new BridgeworkError(
      'out-of-range',
      `\`known\` must hold at most ${MAX_NAMES} names; got ${known.length}`,
      { param: 'known', value: known.length, limit: MAX_NAMES },
    );
  }
  if (given.length > 64) return undefined;
  const lower = given.toLowerCase();
  const sameCase = known.find((k) => k.toLowerCase() === lower);
  if (sameCase !== undefined) return sameCase;
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const k of known) {
    if (k.length > 64) continue;
    const d = typoDistance(given, k);
    if (d < bestDistance) {
      best = k;
      bestDistance = d;
    }
  }
  return bestDistance <= 2 && bestDistance < Math.max(given.length, 2) / 2 + 1 ? best : undefined;
}
