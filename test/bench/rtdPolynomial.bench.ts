/**
 * RTD conversion (issue 19 item 4): the opt-in checked polynomial
 * (`@bridgework/channel/rtd-polynomial`; its WebAssembly loop, the default, and its JavaScript loop) against `channel.convert` (the exact loop, bit-identical
 * to the scalar path) and the plain affine loop a developer would write, on 10⁶ random codes of
 * the channel benchmark's Pt100 at gain 8, spread over every convertible code and, separately,
 * over codes above 0 °C only (where the exact loop needs no Newton step); °C and K. Built
 * packages, plain node (`pnpm bench rtdPolynomial`); the affine baseline is checked against a
 * standalone copy of its loop first, and the ratios are taken per round in one process.
 */
import { createChannel, type ChannelSpec } from '@bridgework/channel';
import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial';
import { checkBaseline, compare, report, reportBaselineCheck, sinkValue } from './harness.js';

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

// The baseline: the fastest plain affine conversion a developer would write.
function affine(input: Int32Array, out: Float64Array, a: number, b: number): number {
  const n = input.length;
  for (let i = 0; i < n; i++) out[i] = a * (input[i] as number) + b;
  return out[n >> 1] as number;
}

const every = [codes(3, -8_388_600, 16_777_200), codes(4, -8_388_600, 16_777_200)];
const outs = [new Float64Array(M), new Float64Array(M)];
const standaloneAffine = new Function(`return ${affine.toString()}`)() as typeof affine;
reportBaselineCheck(
  'affine loop (10⁶ codes)',
  checkBaseline(
    {
      name: 'plain affine loop',
      opsPerCall: M,
      run: (call) => affine(every[call % 2]!, outs[call % 2]!, 1.5e-5, 3),
    },
    (call) => standaloneAffine(every[call % 2]!, outs[call % 2]!, 1.5e-5, 3),
    { rounds: 9, minMillisPerRound: 200 },
  ),
);

for (const unit of ['°C', 'K'] as const) {
  const channel = createChannel({ ...pt100, output: { quantity: 'temperature', unit } });
  const polynomial = createRtdPolynomialConverter(channel);
  const javascript = createRtdPolynomialConverter(channel, { loop: 'javascript' });
  if (polynomial.loop !== 'webassembly') throw new Error('this runtime did not compile the WebAssembly loop');
  for (const [what, ins] of [
    ['every convertible code', every],
    ['codes above 0 °C only', [codes(5, 2_000_000, 6_000_000), codes(6, 2_000_000, 6_000_000)]],
  ] as const) {
    const t0 = performance.now();
    polynomial.convert(ins[0]!, outs[0]!); // checks every segment it meets, once
    polynomial.convert(ins[1]!, outs[1]!);
    const first = performance.now() - t0;
    javascript.convert(ins[0]!, outs[0]!); // its own table, checked the same way
    javascript.convert(ins[1]!, outs[1]!);
    const results = compare(
      [
        {
          name: 'plain affine loop',
          opsPerCall: M,
          run: (call) => affine(ins[call % 2]!, outs[call % 2]!, 1.5e-5, 3),
        },
        {
          name: 'RTD polynomial, WebAssembly loop',
          opsPerCall: M,
          run: (call) =>
            polynomial.convert(ins[call % 2]!, outs[call % 2]!).status.rejected + outs[call % 2]![7]!,
        },
        {
          name: 'RTD polynomial, JavaScript loop',
          opsPerCall: M,
          run: (call) =>
            javascript.convert(ins[call % 2]!, outs[call % 2]!).status.rejected + outs[call % 2]![7]!,
        },
        {
          name: 'channel.convert (exact loop)',
          opsPerCall: M,
          run: (call) =>
            channel.convert(ins[call % 2]!, outs[call % 2]!).status.rejected + outs[call % 2]![7]!,
        },
      ],
      { rounds: 7, minMillisPerRound: 200, warmupCalls: 2 },
    );
    report(`Pt100 in ${unit}, 10⁶ random codes, ${what}`, results);
    const s = polynomial.segments();
    console.log(
      `  polynomial ${(1e3 / results[1]!.nsPerOp).toFixed(1)} million samples/s (JavaScript loop ${(1e3 / results[2]!.nsPerOp).toFixed(1)}), channel.convert ${(1e3 / results[3]!.nsPerOp).toFixed(1)}; first calls (checks) ${first.toFixed(0)} ms; segments ${s.checked} checked, ${s.exact} exact of ${s.total}`,
    );
  }
}
console.log(`(sink ${sinkValue().toExponential(3)})`);
