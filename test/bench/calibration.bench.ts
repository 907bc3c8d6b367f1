/**
 * Calibration package: the multi-component inverse per sample, six components from six bridges
 * (issue 20 targets: ≥ 5 million samples/s for the linear model, ≥ 1 million for the full
 * second-order model, nothing allocated per sample). Baseline: a hand-written 6×6 matrix–vector
 * product over the same interleaved buffers, which no inverse can beat.
 */
import { fitMultiComponent, type LoadingPoint } from '@bridgework/calibration';
import { compare, report, sinkValue } from './harness.js';

const FS = [500, 500, 1000, 20, 20, 15];
const names = ['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz'];
const bridges = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6'];
// An invented sensor: ~1 mV/V at full scale, 2 % cross-talk, 0.2 % second-order interactions.
const s = bridges.map((_, i) => FS.map((fs, j) => ((i === j ? 1 : 0.02 * Math.sin(i + 2 * j)) * 1e-3) / fs));
const q = bridges.map((_, i) =>
  FS.map((fj, j) => FS.map((fk, k) => (k >= j ? (2e-6 * Math.cos(i + j + k)) / (fj * fk) : 0))),
);
const readingsOf = (f: readonly number[], quadratic: boolean): number[] =>
  bridges.map((_, i) => {
    let r = 1e-5 * i;
    for (let j = 0; j < 6; j++) r += s[i]![j]! * f[j]!;
    if (quadratic) for (let j = 0; j < 6; j++) for (let k = j; k < 6; k++) r += q[i]![j]![k]! * f[j]! * f[k]!;
    return r;
  });
function schedule(quadratic: boolean): LoadingPoint[] {
  const points: LoadingPoint[] = [];
  for (let j = 0; j < 6; j++) {
    for (const l of [-1, -0.5, 0, 0.5, 1]) {
      const f = FS.map((fs, k) => (k === j ? l * fs : 0));
      points.push({ loads: f, readings: readingsOf(f, quadratic) });
    }
    for (let k = j + 1; k < 6; k++) {
      for (const [a, b] of [
        [1, 1],
        [1, -1],
        [-1, 1],
        [-1, -1],
      ]) {
        const f = FS.map((fs, c) => (c === j ? 0.6 * a! * fs : c === k ? 0.6 * b! * fs : 0));
        points.push({ loads: f, readings: readingsOf(f, quadratic) });
      }
    }
  }
  return points;
}
const linear = fitMultiComponent({ components: names, bridges, points: schedule(false) }).createInverse();
const secondOrder = fitMultiComponent({
  components: names,
  bridges,
  points: schedule(true),
  interactions: 'second-order',
}).createInverse();

const samples = 20_000;
const makeBuffer = (seed: number, quadratic: boolean): Float64Array => {
  const buffer = new Float64Array(samples * 6);
  for (let n = 0; n < samples; n++) {
    const f = FS.map((fs, j) => fs * Math.sin(seed + 0.37 * n + 1.3 * j));
    buffer.set(readingsOf(f, quadratic), n * 6);
  }
  return buffer;
};
const linA = makeBuffer(1, false);
const linB = makeBuffer(2, false);
const quadA = makeBuffer(3, true);
const quadB = makeBuffer(4, true);
const out = new Float64Array(samples * 6);
const c = Float64Array.from(
  fitMultiComponent({ components: names, bridges, points: schedule(false) }).loadMatrix.flat(),
);

const results = compare([
  {
    name: 'hand-written 6×6 product (baseline)',
    opsPerCall: samples,
    run(call) {
      const r = call % 2 === 0 ? linA : linB;
      for (let n = 0; n < samples; n++) {
        for (let j = 0; j < 6; j++) {
          let acc = 0;
          for (let i = 0; i < 6; i++) acc += c[j * 6 + i]! * r[n * 6 + i]!;
          out[n * 6 + j] = acc;
        }
      }
      return out[7]!;
    },
  },
  {
    name: 'linear inverse (convert)',
    opsPerCall: samples,
    run(call) {
      linear.convert(call % 2 === 0 ? linA : linB, out);
      return out[7]!;
    },
  },
  {
    name: 'second-order inverse (convert)',
    opsPerCall: samples,
    run(call) {
      secondOrder.convert(call % 2 === 0 ? quadA : quadB, out);
      return out[7]!;
    },
  },
]);
report('calibration: six-component inverse, per sample', results);
for (const r of results.slice(1)) {
  console.log(`  ${r.name}: ${(1e3 / r.nsPerOp).toFixed(2)} million samples/s`);
}
console.log(`sink ${sinkValue()}`);
