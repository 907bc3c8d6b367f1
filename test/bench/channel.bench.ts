/**
 * Channel conversion speed (issue #9): converting 10⁷ 24-bit codes with the full exact map against
 * a plain hand-written affine loop over the same arrays, in the same process.
 *
 * Honest benchmarking: two buffer sets alternate between calls (so the JIT cannot fold constant
 * arrays), small calls warm every path up first, the order of the cases rotates every round, the
 * ratio to the baseline is taken per round, and every output is folded into a printed sink.
 */
import { compile } from 'mathjs';
import {
  createChannel,
  createInterleavedConverter,
  type Channel,
  type ChannelSpec,
} from '@bridgework/channel';
import { checkBaseline, compare, report, reportBaselineCheck, sinkValue } from './harness.js';

/** `--short`: only the baseline self-check, on 10⁶ codes (the suite runs it; see test/bench.test.ts). */
const short = process.argv.includes('--short');
const N = short ? 1_000_000 : 10_000_000;
const spec = {
  name: 'footbridge hanger',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.09,
    gaugeOhms: 350,
    gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
  },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 24, lengthMeters: 35 } },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  zero: { code: 1234 },
  environment: { temperatureCelsius: 12, zeroTemperatureCelsius: 18 },
  output: { quantity: 'strain', unit: 'µε' },
} as const satisfies ChannelSpec;
const channel: Channel = createChannel(spec);

function codes(seed: number, n: number): Int32Array {
  const a = new Int32Array(n);
  let s = seed >>> 0;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    a[i] = (s % 8_000_000) - 4_000_000; // inside the rails: every sample converts
  }
  return a;
}
const inA = codes(1, N);
const inB = codes(2, N);
const outA = new Float64Array(N);
const outB = new Float64Array(N);
const pick = (call: number) => (call % 2 === 0 ? ([inA, outA] as const) : ([inB, outB] as const));

// The baseline: the fastest plain affine conversion a developer would write — the constants as
// parameters, the length in a local, one function that only ever sees Int32Array → Float64Array.
function affine(input: Int32Array, out: Float64Array, a: number, b: number): number {
  const n = input.length;
  for (let i = 0; i < n; i++) out[i] = a * (input[i] as number) + b;
  return out[n >> 1] as number;
}
const a = 1.1e-3;
const b = -2.5;
const baseline = {
  name: 'plain affine loop out[i] = a*in[i] + b',
  opsPerCall: N,
  run: (call: number) => {
    const [input, out] = pick(call);
    return affine(input, out, a, b);
  },
};
// The self-check: the same loop as a separate function object (no shared JIT feedback), timed by
// a bare loop. If the harness slowed the baseline, every ratio below would flatter the channel.
const standaloneAffine = new Function(`return ${affine.toString()}`)() as typeof affine;
reportBaselineCheck(
  'affine loop',
  checkBaseline(
    baseline,
    (call) => {
      const [input, out] = pick(call);
      return standaloneAffine(input, out, a, b);
    },
    short ? { rounds: 7, minMillisPerRound: 60 } : { rounds: 9, minMillisPerRound: 200 },
  ),
);
if (short) {
  console.log(`(sink ${sinkValue().toExponential(3)})`);
  process.exit();
}

report(
  `channel: ${N.toExponential(0)} codes, full exact map (quarter three-wire, cable leads, zero reading, GF temperature coefficient)`,
  compare(
    [
      baseline,
      {
        name: 'channel.convert (exact map, rail detection)',
        opsPerCall: N,
        run(call) {
          const [input, out] = pick(call);
          const r = channel.convert(input, out);
          return (out[N >> 1] as number) + r.status.rejected;
        },
      },
    ],
    { rounds: 7, minMillisPerRound: 300, warmupCalls: 3 },
  ),
);

// The same linear-fractional formula, with this channel's coefficients (fixed by three exact
// values of its map), compiled once by mathjs and evaluated per sample on a slice.
const M = 20_000;
const small = inA.subarray(0, M);
const smallOut = new Float64Array(M);
const [x1, x2, x3] = [-3_000_000, 0, 3_000_000];
const [q1, q2, q3] = [x1, x2, x3].map((x) => channel.quantityFromCode(x)) as [number, number, number];
// q = (α·t + q2)/(γ·t + 1), t = x/3e6: γ = (q1 + q3 − 2q2)/(q1 − q3), α = (q3 − q2) + γ·q3.
const gamma = (q1 + q3 - 2 * q2) / (q1 - q3);
const alpha = q3 - q2 + gamma * q3;
const expression = compile('(alpha * x / 3e6 + q0) / (gamma * x / 3e6 + 1)');
report(
  'channel vs the same formula compiled once by mathjs and evaluated per sample (20 000 codes)',
  compare(
    [
      {
        name: 'channel.convert',
        opsPerCall: M,
        run: () => channel.convert(small, smallOut).values[7] as number,
      },
      {
        name: 'mathjs compiled expression per sample',
        opsPerCall: M,
        run() {
          let acc = 0;
          const scope = { alpha, gamma, q0: q2, x: 0 };
          for (let i = 0; i < M; i += 1) {
            scope.x = small[i] as number;
            acc += expression.evaluate(scope) as number;
          }
          return acc;
        },
      },
    ],
    { rounds: 3, minMillisPerRound: 200, warmupCalls: 2 },
  ),
);
const check = channel.quantityFromCode(small[7] as number);
console.log(
  `  (mathjs formula agrees with the channel to ${Math.abs((expression.evaluate({ alpha, gamma, q0: q2, x: small[7] }) as number) - check).toExponential(2)} µε)`,
);

// Eight interleaved channels in one buffer.
const eight = createInterleavedConverter(Array.from({ length: 8 }, () => channel));
report(
  `channel: ${N.toExponential(0)} codes as 8 interleaved channels`,
  compare(
    [
      baseline,
      {
        name: 'interleaved convert, 8 channels',
        opsPerCall: N,
        run(call) {
          const [input, out] = pick(call);
          eight.convert(input, out);
          return out[N >> 1] as number;
        },
      },
    ],
    { rounds: 7, minMillisPerRound: 300, warmupCalls: 3 },
  ),
);
// Steady state: no allocation per sample. Heap growth over 200 conversions into a given buffer.
globalThis.gc?.();
const before = process.memoryUsage().heapUsed;
for (let i = 0; i < 200; i++) channel.convert(inA.subarray(0, 1_000_000), outA);
const after = process.memoryUsage().heapUsed;
console.log(
  `\nheap growth over 200 conversions of 10⁶ codes into one buffer: ${((after - before) / 1024).toFixed(0)} KiB (status objects only)`,
);
console.log(`method: ${channel.method}; (sink ${sinkValue().toExponential(3)})`);
