/** Levenshtein distance between two short strings (names of options and commands). */
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
 * The known name closest to a mistyped one, if it is close enough to be a likely typo (at most
 * two edits, and fewer edits than half the name), else `undefined`.
 */
export function closestName(given: string, known: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const k of known) {
    const d = editDistance(given, k);
    if (d < bestDistance) {
      best = k;
      bestDistance = d;
    }
  }
  return bestDistance <= 2 && bestDistance < Math.max(given.length, 2) / 2 + 1 ? best : undefined;
}
