/**
 * The two RTD loops of the channel package against each other and the affine loop, in one process
 * (issue 19 item 4): the checked piecewise polynomial that integer codes take, and the exact loop
 * (createRtd's operations per sample) that served them before, on 10⁶ codes of a Pt100 channel
 * (the channel benchmark's) spread over every convertible code and, separately, over codes above
 * 0 °C only (where the exact loop needs no Newton step). Built packages, plain node.
 */
import { createChannel, type Channel, type ChannelSpec } from '@bridgework/channel';
import { compare, report } from './harness.js';

// The package's internal modules, from its built dist/ (this file runs from .bench-build/test/bench).
type Kernel = { readonly polynomial: unknown };
const dist = (path: string): string =>
  new URL(`../../../packages/channel/dist/${path}`, import.meta.url).href;
const { channelInternals } = (await import(dist('internal/makeChannel.js'))) as {
  channelInternals(channel: Channel): {
    mappingAt(t: undefined): { resistanceCurve?: { kernel?: Kernel } };
  };
};
const { convertCallendarVanDusen } = (await import(dist('convert/curveKernels.js'))) as {
  convertCallendarVanDusen(...args: unknown[]): void;
};
const { RejectTally } = (await import(dist('convert/kernel.js'))) as {
  RejectTally: new (max: number, low: number, high: number) => unknown;
};

const M = 1_000_000;
const pt100: ChannelSpec = {
  name: 'Pt100 three-wire (RTD)',
  sensor: { kind: 'rtd', r0Ohms: 100 },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
  excitation: { volts: 1 },
  amplifier: { gain: 8 },
  adc: { bits: 24, referenceVolts: 1, ratiometric: true },
  output: { quantity: 'temperature' },
};

function codes(seed: number, lo: number, width: number): Int32Array {
  const a = new Int32Array(M);
  let s = seed >>> 0;
  for (let i = 0; i < M; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    a[i] = lo + (s % width);
  }
  return a;
}

function affine(input: Int32Array, out: Float64Array, a: number, b: number): number {
  const n = input.length;
  for (let i = 0; i < n; i++) out[i] = a * (input[i] as number) + b;
  return out[n >> 1] as number;
}

for (const unit of ['°C', 'K'] as const) {
  const channel = createChannel({ ...pt100, output: { quantity: 'temperature', unit } });
  const kernel = channelInternals(channel).mappingAt(undefined).resistanceCurve!.kernel!;
  const exactLoop = { ...kernel, polynomial: undefined };
  for (const [what, lo, width] of [
    ['every convertible code', -8_388_600, 16_777_200],
    ['codes above 0 °C only', 2_000_000, 6_000_000],
  ] as const) {
    const ins = [codes(3, lo, width), codes(4, lo, width)];
    const outs = [new Float64Array(M), new Float64Array(M)];
    const run = (k: typeof kernel, call: number): number => {
      const out = outs[call % 2]!;
      convertCallendarVanDusen(
        ins[call % 2]!,
        out,
        k,
        new RejectTally(16, -(2 ** 23), 2 ** 23 - 1),
        0,
        1,
        M,
        0,
        1,
      );
      return out[M >> 1]!;
    };
    const t0 = performance.now();
    run(kernel, 0); // the polynomial checks every segment it meets, once
    const first = performance.now() - t0;
    const results = compare(
      [
        {
          name: 'plain affine loop',
          opsPerCall: M,
          run: (call) => affine(ins[call % 2]!, outs[call % 2]!, 1.5e-5, 3),
        },
        { name: 'RTD polynomial (integer codes)', opsPerCall: M, run: (call) => run(kernel, call) },
        { name: 'RTD exact loop', opsPerCall: M, run: (call) => run(exactLoop, call) },
      ],
      { rounds: 7, minMillisPerRound: 200, warmupCalls: 2 },
    );
    report(`Pt100 in ${unit}, 10⁶ codes, ${what}`, results);
    console.log(
      `  polynomial ${(1e3 / results[1]!.nsPerOp).toFixed(1)} million samples/s, exact loop ${(1e3 / results[2]!.nsPerOp).toFixed(1)}; first call (checks) ${first.toFixed(0)} ms`,
    );
  }
}
