/**
 * xoshiro128** (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Trans. Math. Softw. 47(4), 2021): 128 bits of state, period 2^128 − 1, 32-bit outputs with
 * every bit of full quality, only 32-bit integer operations (so it is fast and exact in
 * JavaScript and identical on every machine).
 *
 * A state is an Int32Array of four words. The generator kernels in samplers.ts inline `next` with
 * the state in local variables; this module holds the reference step, the jumps and the seeding.
 */

/** A generator state: four 32-bit words, not all zero. */
export type GeneratorState = Int32Array;

/** One step: advances `s` and returns the next 32-bit output (as an unsigned number). */
export function nextUint32(s: GeneratorState): number {
  const s0 = s[0] as number;
  const s1 = s[1] as number;
  const s2 = s[2] as number;
  const s3 = s[3] as number;
  const m = Math.imul(s1, 5);
  const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
  const t = s1 << 9;
  const n2 = s2 ^ s0;
  const n3 = s3 ^ s1;
  s[1] = s1 ^ n2;
  s[0] = s0 ^ n3;
  s[2] = n2 ^ t;
  s[3] = (n3 << 11) | (n3 >>> 21);
  return result;
}

/** Applies the linear map "advance by the polynomial `poly`" to `s` in place. */
function applyJump(s: GeneratorState, poly: readonly number[]): void {
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  for (const word of poly) {
    for (let bit = 0; bit < 32; bit++) {
      if ((word >>> bit) & 1) {
        a ^= s[0] as number;
        b ^= s[1] as number;
        c ^= s[2] as number;
        d ^= s[3] as number;
      }
      nextUint32(s);
    }
  }
  s[0] = a;
  s[1] = b;
  s[2] = c;
  s[3] = d;
}

// Jump polynomials of xoshiro128** (Blackman & Vigna's reference code): advancing by 2^64 and by
// 2^96 steps. The test suite checks both against the 2^64th and 2^96th powers of the generator's
// transition matrix over GF(2).
const JUMP_64 = [0x8764000b, 0xf542d2d3, 0x6fa035c3, 0x77f2db5b];
const JUMP_96 = [0xb523952e, 0x0b6f099f, 0xccf5a0ef, 0x1c580662];

/** Advances `s` by 2^64 steps, in place. */
export function jump64(s: GeneratorState): void {
  applyJump(s, JUMP_64);
}

/** Advances `s` by 2^96 steps, in place. */
export function jump96(s: GeneratorState): void {
  applyJump(s, JUMP_96);
}

const MASK_64 = (1n << 64n) - 1n;

/**
 * The initial state for a seed: two outputs of SplitMix64 (the seeding generator recommended by
 * Blackman and Vigna), split into four 32-bit words.
 *
 * @param seed - A non-negative safe integer (checked by the caller).
 */
export function stateFromSeed(seed: number): GeneratorState {
  let x = BigInt(seed);
  const words: number[] = [];
  for (let i = 0; i < 2; i++) {
    x = (x + 0x9e3779b97f4a7c15n) & MASK_64;
    let z = x;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK_64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK_64;
    z ^= z >> 31n;
    words.push(Number(z & 0xffffffffn) | 0, Number(z >> 32n) | 0);
  }
  const s = Int32Array.from(words);
  if (s.every((w) => w === 0)) s[0] = 1; // the all-zero state is the one fixed point
  return s;
}
