/**
 * The integer impulse response of a sinc^k decimation filter with decimation N, built by brute
 * force: k successive convolutions with a length-N boxcar (exact, in BigInt). Independent of the
 * closed-form coefficient sums in src/internal/sinc.ts.
 */
export function sincKernel(k: number, n: number): bigint[] {
  let h: bigint[] = [1n];
  for (let s = 0; s < k; s++) {
    const next = new Array<bigint>(h.length + n - 1).fill(0n);
    h.forEach((v, i) => {
      for (let j = 0; j < n; j++) next[i + j]! += v;
    });
    h = next;
  }
  return h;
}
