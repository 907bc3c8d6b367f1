/**
 * Channel conversion speed (issues 9 and 19): converting 10⁷ 24-bit codes with the full exact map
 * against the plain affine loop a developer would write, over the same arrays, in the same process.
 *
 * Honest benchmarking: the packages are the built ones run by plain node (`pnpm bench`); two
 * buffer sets alternate between calls (so the JIT cannot fold constant arrays); small calls warm
 * every path up first; the order of the cases rotates every round; the ratio to the baseline is
 * taken per round; every output is folded into a printed sink; and the baseline is checked against
 * a standalone copy of its loop (it must not be slowed by the harness).
 */
import { compile } from 'mathjs';
import {
  createChannel,
  createInterleavedConverter,
  createWasmConverter,
  type Channel,
  type ChannelSpec,
} from '@bridgework/channel';
import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial';
import { checkBaseline, compare, report, reportBaselineCheck, sinkValue, type BenchCase } from './harness.js';

/** `--short`: only the baseline self-check, on 10⁶ codes (the suite runs it; see test/bench.test.ts). */
const short = process.argv.includes('--short');
const N = short ? 1_000_000 : 10_000_000;

/** The channels: the minimal quarter bridge, and the footbridge gusset of the demo file. */
const minimal: ChannelSpec = {
  name: 'minimal quarter three-wire',
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain' },
};
/** packages/cli/demo/footbridge-monitoring.yaml, channel gusset-g2 (zero reading, GF temperature coefficient, thermal output). */
const gusset: ChannelSpec = {
  name: 'gusset-g2',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.11,
    gaugeOhms: 350,
    gaugeFactorTemperatureCoefficientPerKelvin: 1.0e-4,
    thermalOutput: {
      coefficientsMicrostrain: [-32.5, 2.75, -0.063, 0.000345],
      gaugeFactor: 2.0,
      rangeCelsius: [-30, 120],
    },
  },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 26, lengthMeters: 22 } },
  excitation: { volts: 2.5 },
  amplifier: { gain: 64 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  zero: { code: -18433 },
  environment: { temperatureCelsius: 15, rangeCelsius: [5, 25] },
  output: { quantity: 'strain', unit: 'µε', range: [-300, 1200] },
};
/** Channels without a single Möbius kernel (issue 19 item 4). */
const others: readonly ChannelSpec[] = [
  {
    name: 'Pt100 three-wire (RTD)',
    sensor: { kind: 'rtd', r0Ohms: 100 },
    bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
    excitation: { volts: 1 },
    amplifier: { gain: 8 },
    adc: { bits: 24, referenceVolts: 1, ratiometric: true },
    output: { quantity: 'temperature' },
  },
  {
    ...minimal,
    name: 'full-bending-poisson',
    bridge: { arrangement: 'full-bending-poisson', poissonRatio: 0.3 },
  },
  { ...minimal, name: 'quarter at gain 1', amplifier: { gain: 1 } },
];

function codes(seed: number, n: number, lo: number, hi: number): Int32Array {
  const a = new Int32Array(n);
  let s = seed >>> 0;
  const width = hi - lo;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    a[i] = lo + (s % width); // inside the valid codes: every sample converts
  }
  return a;
}
const inA = codes(1, N, -4_000_000, 4_000_000);
const inB = codes(2, N, -4_000_000, 4_000_000);
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
const baseline: BenchCase = {
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

const rounds = { rounds: 9, minMillisPerRound: 300, warmupCalls: 3 };

/** How a channel's `convert` agrees with its `quantityFromCode` over `count` codes spread over the valid ones. */
function agreement(channel: Channel, count: number): string {
  const lo = Math.floor(channel.validCodes.min) + 1;
  const hi = Math.ceil(channel.validCodes.max) - 1;
  const sample = Int32Array.from({ length: count }, (_, i) => Math.round(lo + ((hi - lo) * i) / (count - 1)));
  const { values } = channel.convert(sample);
  let same = 0;
  let worst = 0;
  let largest = 0;
  for (let i = 0; i < count; i++) {
    const exact = channel.quantityFromCode(sample[i] as number);
    largest = Math.max(largest, Math.abs(exact));
    if (Object.is(values[i], exact)) same++;
    else worst = Math.max(worst, Math.abs((values[i] as number) - exact));
  }
  return `${((100 * same) / count).toFixed(1)} % bit-identical to quantityFromCode over ${count} codes; largest difference ${(worst / largest).toExponential(2)} of the largest value`;
}

for (const spec of [minimal, gusset]) {
  const channel = createChannel(spec);
  report(
    `channel '${spec.name}': ${N.toExponential(0)} codes, full exact map and rail detection (method ${channel.method})`,
    compare(
      [
        baseline,
        {
          name: 'channel.convert',
          opsPerCall: N,
          run(call) {
            const [input, out] = pick(call);
            const r = channel.convert(input, out);
            return (out[N >> 1] as number) + r.status.rejected;
          },
        },
      ],
      rounds,
    ),
  );
  console.log(`  ${agreement(channel, 200_001)}`);
}

// Eight interleaved channels in one buffer: the gusset and seven variants (other gains and zeros).
const eight = createInterleavedConverter(
  Array.from({ length: 8 }, (_, j) =>
    createChannel({
      ...gusset,
      name: `gusset ${j}`,
      amplifier: { gain: j % 2 === 0 ? 64 : 32 },
      zero: { code: -18433 + 1000 * j },
    }),
  ),
);
report(
  `eight interleaved channels: ${N.toExponential(0)} codes (${(N / 8).toExponential(2)} frames)`,
  compare(
    [
      baseline,
      {
        name: 'interleaved convert, 8 channels',
        opsPerCall: N,
        run(call) {
          const [input, out] = pick(call);
          const r = eight.convert(input, out);
          return (out[N >> 1] as number) + (r.statuses[0]?.rejected ?? 0);
        },
      },
    ],
    rounds,
  ),
);

// The optional WebAssembly SIMD kernel (issue 19 item 6) on the gusset channel: the codes already
// in WebAssembly memory (what it is for), and with a copy in from and out to JavaScript arrays.
{
  const channel = createChannel(gusset);
  const wasm = await createWasmConverter(channel, { pages: Math.ceil((12 * N) / 65536) + 1 });
  const wasmIn = new Int32Array(wasm.memory.buffer, 0, N);
  const wasmOut = new Float64Array(wasm.memory.buffer, 4 * N, N);
  wasmIn.set(inA);
  const check = wasm.convert(wasmIn, wasmOut);
  const js = channel.convert(inA, outA);
  let same = 0;
  for (let i = 0; i < N; i++) if (Object.is(wasmOut[i], js.values[i])) same++;
  report(
    `WebAssembly SIMD kernel, channel '${gusset.name}': ${N.toExponential(0)} codes`,
    compare(
      [
        baseline,
        {
          name: 'wasm convert, codes in wasm memory',
          opsPerCall: N,
          run() {
            const r = wasm.convert(wasmIn, wasmOut);
            return (wasmOut[N >> 1] as number) + r.status.rejected;
          },
        },
        {
          name: 'wasm convert, copy in and out',
          opsPerCall: N,
          run(call) {
            const [input, out] = pick(call);
            wasmIn.set(input);
            const r = wasm.convert(wasmIn, wasmOut);
            out.set(wasmOut);
            return (out[N >> 1] as number) + r.status.rejected;
          },
        },
        {
          name: 'channel.convert (JavaScript kernel)',
          opsPerCall: N,
          run(call) {
            const [input, out] = pick(call);
            const r = channel.convert(input, out);
            return (out[N >> 1] as number) + r.status.rejected;
          },
        },
      ],
      rounds,
    ),
  );
  console.log(
    `  ${((100 * same) / N).toFixed(1)} % of ${N.toExponential(0)} outputs bit-identical to channel.convert; statuses ${JSON.stringify(check.status) === JSON.stringify(js.status) ? 'equal' : 'DIFFER'}`,
  );
}

/** The codes of `channel` that convert to a value: its valid codes, narrowed at each end (bisection) to where quantityFromCode succeeds. */
function convertibleCodes(channel: Channel): [number, number] {
  const ok = (x: number) => {
    try {
      return Number.isFinite(channel.quantityFromCode(x));
    } catch {
      return false;
    }
  };
  const lo0 = Math.floor(channel.validCodes.min) + 1;
  const hi0 = Math.ceil(channel.validCodes.max) - 1;
  const mid = Math.round((lo0 + hi0) / 2);
  const edge = (bad: number, good: number): number => {
    if (ok(bad)) return bad;
    while (Math.abs(good - bad) > 1) {
      const m = Math.round((bad + good) / 2);
      if (ok(m)) good = m;
      else bad = m;
    }
    return good;
  };
  return [edge(lo0, mid), edge(hi0, mid)];
}

// Channels without a single Möbius map over every valid code: their speed in samples/s, on 10⁶
// codes spread over the codes that convert (an RTD's valid codes reach past its curve's −200 …
// 850 °C; those are rejected, not converted).
const M = 1_000_000;
for (const spec of others) {
  const channel = createChannel(spec);
  const [lo, hi] = convertibleCodes(channel);
  const ins = [codes(3, M, lo, hi), codes(4, M, lo, hi)];
  const outs = [new Float64Array(M), new Float64Array(M)];
  const polynomial =
    channel.map.form === 'resistance-curve'
      ? createRtdPolynomialConverter(channel, { checkAllSegments: true })
      : undefined;
  const results = compare(
    [
      {
        name: 'plain affine loop (10⁶ codes)',
        opsPerCall: M,
        run: (call) => affine(ins[call % 2]!, outs[call % 2]!, a, b),
      },
      {
        name: `channel.convert`,
        opsPerCall: M,
        run(call) {
          const r = channel.convert(ins[call % 2]!, outs[call % 2]!);
          return (outs[call % 2]![M >> 1] as number) + r.status.rejected;
        },
      },
      // RTD channels: the opt-in checked polynomial too (its segments checked before the rounds).
      ...(polynomial === undefined
        ? []
        : [
            {
              name: 'RTD polynomial (@bridgework/channel/rtd-polynomial)',
              opsPerCall: M,
              run(call: number) {
                const r = polynomial.convert(ins[call % 2]!, outs[call % 2]!);
                return (outs[call % 2]![M >> 1] as number) + r.status.rejected;
              },
            },
          ]),
    ],
    { rounds: 5, minMillisPerRound: 200, warmupCalls: 2 },
  );
  report(`channel '${spec.name}' (method ${channel.method}): ${M.toExponential(0)} codes`, results);
  console.log(`  ${(1e3 / results[1]!.nsPerOp).toFixed(1)} million samples/s; ${agreement(channel, 20_001)}`);
  if (polynomial !== undefined)
    console.log(`  RTD polynomial ${(1e3 / results[2]!.nsPerOp).toFixed(1)} million samples/s`);
}

// The same linear-fractional formula with the minimal channel's coefficients, compiled once by
// mathjs and evaluated per sample on a slice (issue 9's comparison).
const channel = createChannel(minimal);
const S = 20_000;
const small = inA.subarray(0, S);
const smallOut = new Float64Array(S);
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
        opsPerCall: S,
        run: () => channel.convert(small, smallOut).values[7] as number,
      },
      {
        name: 'mathjs compiled expression per sample',
        opsPerCall: S,
        run() {
          let acc = 0;
          const scope = { alpha, gamma, q0: q2, x: 0 };
          for (let i = 0; i < S; i += 1) {
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

// Steady state: no allocation per sample. Heap growth over 200 conversions into a given buffer.
globalThis.gc?.();
const before = process.memoryUsage().heapUsed;
for (let i = 0; i < 200; i++) channel.convert(inA.subarray(0, 1_000_000), outA);
const after = process.memoryUsage().heapUsed;
console.log(
  `\nheap growth over 200 conversions of 10⁶ codes into one buffer: ${((after - before) / 1024).toFixed(0)} KiB (status objects only)`,
);
console.log(`(sink ${sinkValue().toExponential(3)})`);
