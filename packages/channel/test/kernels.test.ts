/**
 * The Möbius conversion loops against a plain one-sample-at-a-time reference written here: the
 * same expression (a·x + b)/(c·x + d) in the same order, the range test as the interval's
 * definition (lo < x < hi), so the unrolled and grouped loops must agree bit for bit, reject the
 * same samples and record them in the same order. Then the in-place contract (issue 15, item 1).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createChannel, createInterleavedConverter, type ChannelSpec } from '@bridgework/channel';
import {
  convertInterleavedLinearFractional,
  convertLinearFractional,
  RejectTally,
  type LinearFractionalKernel,
} from '../src/convert/kernel.js';

const RAIL_LOW = -(2 ** 23);
const RAIL_HIGH = 2 ** 23 - 1;

/** The reference: one sample at a time, range test first. */
function reference(
  codes: ArrayLike<number>,
  k: LinearFractionalKernel,
  start: number,
  stride: number,
  count: number,
): { values: number[]; rejected: number[] } {
  const values: number[] = [];
  const rejected: number[] = [];
  for (let n = 0; n < count; n++) {
    const x = codes[start + n * stride]!;
    if (x > k.lo && x < k.hi) values.push((k.a * x + k.b) / (k.c * x + k.d));
    else {
      values.push(Number.NaN);
      rejected.push(n);
    }
  }
  return { values, rejected };
}

/** Index of the first sample where `got` and `want` differ (Object.is: NaN equals NaN, 0 ≠ −0), or −1. */
function firstDifference(got: (n: number) => number, want: readonly number[]): number {
  for (let n = 0; n < want.length; n++) if (!Object.is(got(n), want[n])) return n;
  return -1;
}

const kernelArb = fc.record({
  a: fc.double({ min: -10, max: 10, noNaN: true }),
  b: fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  c: fc.double({ min: -1e-8, max: 1e-8, noNaN: true }),
  d: fc.double({ min: 0.5, max: 2, noNaN: true }),
  lo: fc.oneof(fc.constant(RAIL_LOW), fc.double({ min: -9e6, max: 0, noNaN: true })),
  hi: fc.oneof(fc.constant(RAIL_HIGH), fc.double({ min: 0, max: 9e6, noNaN: true })),
});
const codeArb = fc.oneof(
  fc.integer({ min: -4_000_000, max: 4_000_000 }),
  fc.constantFrom(RAIL_LOW, RAIL_HIGH, -(2 ** 31), 2 ** 31 - 1, 2 ** 30, -(2 ** 30)),
  fc.integer(),
);

describe('Möbius loops against the one-sample reference (bit for bit)', () => {
  it('contiguous and strided integer codes, any length and offset', () => {
    fc.assert(
      fc.property(
        kernelArb,
        fc.array(codeArb, { minLength: 0, maxLength: 700 }),
        fc.integer({ min: 1, max: 5 }),
        fc.integer({ min: 0, max: 4 }),
        (k, list, stride, start) => {
          const codes = Int32Array.from(list);
          const count = Math.max(0, Math.floor((codes.length - start + stride - 1) / stride));
          const out = new Float64Array(codes.length + 3).fill(42);
          const tally = new RejectTally(1e6, RAIL_LOW, RAIL_HIGH);
          convertLinearFractional(codes, out, k, tally, start, stride, count, start, stride);
          const want = reference(codes, k, start, stride, count);
          for (let n = 0; n < count; n++)
            expect(Object.is(out[start + n * stride], want.values[n])).toBe(true);
          expect(tally.rejected).toBe(want.rejected.length);
          expect(Array.from(tally.locations?.subarray(0, tally.located) ?? [])).toEqual(
            want.rejected.map((n) => start + n * stride),
          );
          // Slots the conversion does not own are untouched.
          const touched = Array.from(out.keys()).filter((i) => {
            const owned = i >= start && (i - start) % stride === 0 && (i - start) / stride < count;
            return !owned && out[i] !== 42;
          });
          expect(touched).toEqual([]);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('fractional codes in a Float64Array, into a separate buffer and in place', () => {
    fc.assert(
      fc.property(
        kernelArb,
        fc.array(
          fc.oneof(
            fc.double({ min: -9e6, max: 9e6, noNaN: true }),
            fc.constantFrom(Number.NaN, Infinity, -Infinity, 1e12, RAIL_LOW, RAIL_HIGH),
          ),
          { maxLength: 600 },
        ),
        (k, list) => {
          const codes = Float64Array.from(list);
          const want = reference(codes, k, 0, 1, codes.length);
          const out = new Float64Array(codes.length);
          const t1 = new RejectTally(1e6, RAIL_LOW, RAIL_HIGH);
          convertLinearFractional(codes, out, k, t1, 0, 1, codes.length, 0, 1);
          const inPlace = codes.slice();
          const t2 = new RejectTally(1e6, RAIL_LOW, RAIL_HIGH);
          convertLinearFractional(inPlace, inPlace, k, t2, 0, 1, codes.length, 0, 1);
          expect(firstDifference((n) => out[n]!, want.values)).toBe(-1);
          expect(firstDifference((n) => inPlace[n]!, want.values)).toBe(-1);
          for (const t of [t1, t2]) {
            expect(t.rejected).toBe(want.rejected.length);
            expect(Array.from(t.locations?.subarray(0, t.located) ?? [])).toEqual(want.rejected);
          }
          expect([t2.railLow, t2.railHigh, t2.outOfRange]).toEqual([t1.railLow, t1.railHigh, t1.outOfRange]);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('interleaved groups of 8, 4, 2 and 1 lanes equal each lane converted alone (1 to 19 channels)', () => {
    fc.assert(
      fc.property(
        fc.array(kernelArb, { minLength: 1, maxLength: 19 }),
        fc.integer({ min: 0, max: 300 }),
        fc.array(codeArb, { minLength: 1, maxLength: 50 }),
        (kernels, frames, pool) => {
          const n = kernels.length;
          const codes = Int32Array.from({ length: n * frames }, (_, i) => pool[(i * 7) % pool.length]!);
          const out = new Float64Array(codes.length);
          const tallies = kernels.map(() => new RejectTally(1e6, RAIL_LOW, RAIL_HIGH));
          convertInterleavedLinearFractional(codes, out, kernels, tallies, frames);
          kernels.forEach((k, j) => {
            const want = reference(codes, k, j, n, frames);
            expect(firstDifference((f) => out[f * n + j]!, want.values)).toBe(-1);
            expect(Array.from(tallies[j]!.locations?.subarray(0, tallies[j]!.located) ?? [])).toEqual(
              want.rejected.map((f) => f * n + j),
            );
          });
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('issue 15 item 1: conversion in place keeps rail codes rejected', () => {
  const quarter: ChannelSpec = {
    name: 'deck girder',
    sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
    bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
    excitation: { volts: 5 },
    amplifier: { gain: 128 },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true },
    output: { quantity: 'strain', unit: 'µε' },
  };
  const codes = [1000, RAIL_HIGH, RAIL_LOW, 1e12];

  it('convert(buf, buf) equals convert(buf, separate): NaN and counted for the rails and beyond', () => {
    const ch = createChannel(quarter);
    const separate = ch.convert(Float64Array.from(codes), new Float64Array(4));
    const buf = Float64Array.from(codes);
    const inPlace = ch.convert(buf, buf);
    expect(inPlace.values).toBe(buf);
    expect(Number.isNaN(buf[0]!)).toBe(false);
    expect(buf[0]).toBe(separate.values[0]);
    expect(buf[0]).toBeNear(ch.quantityFromCode(1000), { rel: 1e-12 });
    expect([buf[1], buf[2], buf[3]].every((v) => Number.isNaN(v))).toBe(true);
    expect(inPlace.status).toMatchObject({ rejected: 3, railHigh: 2, railLow: 1, converted: 1 });
    expect(inPlace.status).toEqual(separate.status);
  });

  it('a long buffer in place (every block size, a rejection in some blocks) equals the separate conversion', () => {
    const ch = createChannel(quarter);
    const n = 5000;
    const src = Float64Array.from({ length: n }, (_, i) => ((i * 7919) % 6_000_000) - 3_000_000 + 0.25);
    for (const i of [3, 700, 701, 4999]) src[i] = i % 2 === 0 ? RAIL_LOW - 1.5 : RAIL_HIGH + 10;
    const separate = ch.convert(src, new Float64Array(n));
    const buf = src.slice();
    const inPlace = ch.convert(buf, buf);
    expect(firstDifference((i) => buf[i]!, Array.from(separate.values))).toBe(-1);
    expect(inPlace.status).toEqual(separate.status);
    expect(Array.from(inPlace.status.locations)).toEqual([3, 700, 701, 4999]);
  });

  it('an interleaved buffer converted in place equals the separate conversion', () => {
    const a = createChannel(quarter);
    const b = createChannel({ ...quarter, name: 'other', amplifier: { gain: 64 } });
    const frames = Float64Array.from([1000, -2000, RAIL_HIGH, 5, RAIL_LOW, 1e12, 77.5, RAIL_HIGH]);
    const conv = createInterleavedConverter([a, b]);
    const separate = conv.convert(frames, new Float64Array(frames.length));
    const buf = frames.slice();
    const inPlace = conv.convert(buf, buf);
    expect(firstDifference((i) => buf[i]!, Array.from(separate.values))).toBe(-1);
    expect(inPlace.statuses).toEqual(separate.statuses);
    expect(inPlace.statuses.map((s) => s.rejected)).toEqual([2, 2]);
  });

  it('refuses an output that overlaps the codes at another element, or an Int32Array’s memory', () => {
    const ch = createChannel(quarter);
    const memory = new Float64Array(10);
    expect(() => ch.convert(memory.subarray(0, 8), memory.subarray(1, 9))).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'out' },
    );
    expect(() => ch.convert(memory.subarray(1, 9), memory.subarray(0, 9))).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'out' },
    );
    const shared = new ArrayBuffer(64);
    expect(() =>
      ch.convert(new Int32Array(shared, 0, 4), new Float64Array(shared, 0, 4)),
    ).toThrowBridgeworkError('invalid-shape', { param: 'out' });
    expect(() =>
      createInterleavedConverter([ch, ch]).convert(memory.subarray(0, 4), memory.subarray(2, 6)),
    ).toThrowBridgeworkError('invalid-shape', { param: 'out' });
    // Disjoint views of one buffer are fine.
    const r = ch.convert(memory.subarray(0, 4), memory.subarray(4, 8));
    expect(r.status.rejected).toBe(0);
  });
});
