/**
 * Levenshtein distance between two short strings (names of options, fields and commands).
 *
 * @param a - One name.
 * @param b - The other name.
 * @returns The least number of single-character insertions, deletions and substitutions.
 * @example
 * ```ts
 * editDistance('whiteDensty', 'whiteDensity'); // 1
 * ```
 */
export function editDistance(a: string, b: string): number {
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
 * The known name closest to a mistyped one, if it is close enough to be a likely typo.
 *
 * @remarks
 * A name counts as a likely typo when it differs only in letter case, or is at most two edits
 * away and fewer edits than half its length plus one. Names longer than 64 characters are not
 * compared (nobody mistypes those; it bounds the work).
 *
 * @param given - The name as written.
 * @param known - The names that exist.
 * @returns The closest known name, or `undefined` when none is close.
 * @example
 * ```ts
 * closestName('whiteDensty', ['whiteDensity', 'cornerHertz']); // 'whiteDensity'
 * closestName('xyz', ['whiteDensity']); // undefined
 * ```
 */
export function closestName(given: string, known: readonly string[]): string | undefined {
  if (given.length > 64) return undefined;
  const lower = given.toLowerCase();
  const sameCase = known.find((k) => k.toLowerCase() === lower);
  if (sameCase !== undefined) return sameCase;
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const k of known) {
    if (k.length > 64) continue;
    const d = editDistance(given, k);
    if (d < bestDistance) {
      best = k;
      bestDistance = d;
    }
  }
  return bestDistance <= 2 && bestDistance < Math.max(given.length, 2) / 2 + 1 ? best : undefined;
}
