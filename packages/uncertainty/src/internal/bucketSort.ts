/**
 * Stable ascending sort of a Float64Array of finite values by distribution counting: each value
 * goes to one of n buckets by its position between the minimum and the maximum (a monotone map,
 * so the buckets are in order), buckets are laid out by counting, and each bucket is finished by
 * insertion sort. Linear time for the smooth, dense samples of a Monte Carlo tail (about one
 * value per bucket); a bucket that gathers many values (ties, a spike) is finished by a stable
 * merge sort instead, so the worst case is n·log n. Equal values keep their input order, −0 and
 * +0 included, so the same input order always gives the same output.
 */

/** Sorts `a` in place; returns false (leaving `a` unchanged) if a value is not finite. */
export function bucketSortInPlace(a: Float64Array): boolean {
  const n = a.length;
  if (n < 2) return true;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = a[i] as number;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(Number.isFinite(lo) && Number.isFinite(hi))) return false;
  if (lo === hi) return true;
  const buckets = n;
  const range = hi - lo;
  const scale = buckets / range;
  // A range that overflows, or one so narrow that the scale does: no bucketing.
  if (!Number.isFinite(range) || !Number.isFinite(scale) || scale === 0) {
    mergeSort(a, 0, n);
    return true;
  }
  const counts = new Int32Array(buckets + 1);
  const scratch = new Float64Array(n);
  const top = buckets - 1;
  for (let i = 0; i < n; i++) {
    const b = Math.min(top, Math.floor(((a[i] as number) - lo) * scale));
    counts[b + 1] = (counts[b + 1] as number) + 1;
  }
  for (let b = 0; b < buckets; b++) counts[b + 1] = (counts[b + 1] as number) + (counts[b] as number);
  // counts[b] is now the start of bucket b; scatter in input order (stable).
  for (let i = 0; i < n; i++) {
    const v = a[i] as number;
    const b = Math.min(top, Math.floor((v - lo) * scale));
    const at = counts[b] as number;
    counts[b] = at + 1;
    scratch[at] = v;
  }
  // Bucket b now ends at counts[b]; it starts at counts[b − 1] (0 for the first).
  let start = 0;
  for (let b = 0; b < buckets; b++) {
    const end = counts[b] as number;
    const size = end - start;
    if (size > 32) mergeSort(scratch, start, end);
    else if (size > 1) stableInsertion(scratch, start, end);
    start = end;
  }
  a.set(scratch);
  return true;
}

function stableInsertion(a: Float64Array, from: number, to: number): void {
  for (let i = from + 1; i < to; i++) {
    const v = a[i] as number;
    let j = i - 1;
    while (j >= from && (a[j] as number) > v) {
      a[j + 1] = a[j] as number;
      j--;
    }
    a[j + 1] = v;
  }
}

/** Stable bottom-up merge sort of a[from…to) (runs of 16 by insertion, then merges). */
function mergeSort(a: Float64Array, from: number, to: number): void {
  const n = to - from;
  const merge = new Float64Array(n);
  for (let i = from; i < to; i += 16) stableInsertion(a, i, Math.min(i + 16, to));
  let source: Float64Array = a.subarray(from, to);
  let target: Float64Array = merge.subarray(0, n);
  let inPlace = true;
  for (let width = 16; width < n; width *= 2) {
    for (let left = 0; left < n; left += 2 * width) {
      const mid = Math.min(left + width, n);
      const right = Math.min(left + 2 * width, n);
      let i = left;
      let j = mid;
      for (let k = left; k < right; k++) {
        // Take from the left run on ties: stable.
        if (i < mid && (j >= right || (source[i] as number) <= (source[j] as number)))
          target[k] = source[i++] as number;
        else target[k] = source[j++] as number;
      }
    }
    const t = source;
    source = target;
    target = t;
    inPlace = !inPlace;
  }
  if (!inPlace) a.set(source, from);
}
