import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { uniformOpen } from '../src/internal/samplers.js';
import { jump64, jump96, nextUint32, stateFromSeed } from '../src/internal/xoshiro128.js';

const reference = JSON.parse(
  readFileSync(new URL('./fixtures/xoshiro128/reference.json', import.meta.url), 'utf8'),
) as {
  cases: {
    seed: number;
    state: number[];
    outputs: number[];
    afterJump64: number[];
    afterJump96: number[];
    uniforms: number[];
  }[];
};

/** The 128-bit state as a BigInt (word 0 in the low bits). */
const toBig = (s: Int32Array): bigint =>
  [3, 2, 1, 0].reduce((v, w) => (v << 32n) | BigInt((s[w] as number) >>> 0), 0n);
const fromBig = (v: bigint): Int32Array =>
  Int32Array.from([0, 1, 2, 3], (w) => Number((v >> BigInt(32 * w)) & 0xffffffffn) | 0);

describe('xoshiro128**', () => {
  it.each(reference.cases)('matches the independent C implementation bit for bit (seed $seed)', (c) => {
    // Fixture: packages/uncertainty/test/fixtures/xoshiro128 (gcc, Blackman & Vigna's reference code).
    const s = stateFromSeed(c.seed);
    expect(Array.from(s, (w) => w >>> 0)).toEqual(c.state);
    expect(Array.from({ length: 8 }, () => nextUint32(s))).toEqual(c.outputs);
    const j = stateFromSeed(c.seed);
    jump64(j);
    expect(Array.from({ length: 4 }, () => nextUint32(j))).toEqual(c.afterJump64);
    const k = stateFromSeed(c.seed);
    jump96(k);
    expect(Array.from({ length: 4 }, () => nextUint32(k))).toEqual(c.afterJump96);
    const u = stateFromSeed(c.seed);
    expect(Array.from({ length: 6 }, () => uniformOpen(u))).toEqual(c.uniforms);
  });

  it('seeds SplitMix64 as published: the first output for seed 0 is 0xe220a8397b1dcdaf', () => {
    // SplitMix64 (Steele, Lea and Flood 2014) from seed 0 — a widely quoted first value (from memory),
    // which is words 0 and 1 of the state.
    const s = stateFromSeed(0);
    expect(((BigInt((s[1] as number) >>> 0) << 32n) | BigInt((s[0] as number) >>> 0)).toString(16)).toBe(
      'e220a8397b1dcdaf',
    );
  });

  it('jumps by exactly 2^64 and 2^96 steps: the jumps equal powers of the GF(2) transition matrix', () => {
    // Independent check of the jump polynomials: the generator is linear over GF(2), so T (its
    // transition matrix, 128 columns = the images of the basis states) squared 64 and 96 times
    // must map any state to the jumped state.
    const columns: bigint[] = [];
    for (let i = 0; i < 128; i++) {
      const s = fromBig(1n << BigInt(i));
      nextUint32(s);
      columns.push(toBig(s));
    }
    const apply = (m: readonly bigint[], v: bigint): bigint => {
      let r = 0n;
      for (let j = 0; v !== 0n; j++, v >>= 1n) if (v & 1n) r ^= m[j] as bigint;
      return r;
    };
    let power = columns;
    const powers = new Map<number, bigint[]>();
    for (let k = 1; k <= 96; k++) {
      power = power.map((c) => apply(power, c));
      powers.set(k, power);
    }
    for (const seed of [3, 12345]) {
      const v = toBig(stateFromSeed(seed));
      const a = fromBig(v);
      jump64(a);
      expect(toBig(a)).toBe(apply(powers.get(64)!, v));
      const b = fromBig(v);
      jump96(b);
      expect(toBig(b)).toBe(apply(powers.get(96)!, v));
    }
    // T itself (one step), as a check of the matrix construction.
    const c = stateFromSeed(5);
    const v = toBig(c);
    nextUint32(c);
    expect(toBig(c)).toBe(apply(columns, v));
  });
});
