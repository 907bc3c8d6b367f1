/**
 * The test-rig scenario (invented) behind examples/test-rig-coupling/test-rig.yaml: the forward
 * models that generated its loading schedule and its eccentricity test, shared with the tests that
 * check what bridgework recovers from those files.
 *
 * A gearbox test rig measures the forces and moments on its input shaft with a six-bridge coupling
 * (Fx, Fy ±2 kN, Fz ±5 kN, Mx, My ±100 N·m, Mz ±200 N·m): about 1 mV/V per bridge at full scale,
 * 1–3 % linear cross-talk, second-order terms up to 0.1 % of output, offsets of tens of µV/V, and
 * 0.1 µV/V rms noise on every logged reading. The rig's gearbox sits on a four-cell stand
 * (class III, Max 600 kg, e = 0.2 kg) whose cells give 1.989–2.011 mV/V per 300 kg.
 *
 * Regenerate the data files (they are committed; the seed makes them repeatable):
 * pnpm exec tsx --conditions=@bridgework/source examples/test-rig-coupling/scenario.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** Component names, in the order of the schedule's columns. */
export const components = ['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz'] as const;
/** The units the components are written in. */
export const componentUnits = ['N', 'N', 'N', 'N·m', 'N·m', 'N·m'] as const;
/** Full scale of each component, in its unit. */
export const fullScale = [2000, 2000, 5000, 100, 100, 200] as const;
/** The coupling's bridges (channels of test-rig.yaml). */
export const bridges = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6'] as const;

/** The true sensitivity S_ij, mV/V per component unit. */
export const trueSensitivity: readonly (readonly number[])[] = bridges.map((_, i) =>
  fullScale.map((fs, j) => (i === j ? 1 + 0.01 * i : 0.02 * Math.sin(3 * i + j)) / fs),
);
/** The true second-order coefficient of F_j·F_k (j ≤ k) on bridge i, mV/V per unit². */
export const trueInteraction = (i: number, j: number, k: number): number =>
  (1e-3 * Math.cos(i + 2 * j + 3 * k)) / ((fullScale[j] as number) * (fullScale[k] as number));
/** The true zero offset of bridge i, mV/V. */
export const trueOffset = (i: number): number => 0.02 * (i - 2.5);
/** The schedule's reading noise, mV/V rms. */
export const readingNoise = 1e-4;

let seed = 20261205;
function gaussian(): number {
  // The sum of 12 uniforms from a linear congruential generator: repeatable, unit variance.
  let s = -6;
  for (let n = 0; n < 12; n++) {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    s += seed / 2147483648;
  }
  return s;
}

/** The coupling's readings (mV/V) at a load state, without noise. */
export function couplingReadings(f: readonly number[]): number[] {
  return bridges.map((_, i) => {
    let r = trueOffset(i);
    for (let j = 0; j < 6; j++) r += (trueSensitivity[i] as number[])[j]! * f[j]!;
    for (let j = 0; j < 6; j++) for (let k = j; k < 6; k++) r += trueInteraction(i, j, k) * f[j]! * f[k]!;
    return r;
  });
}

/** The stand's cells (channels of test-rig.yaml). */
export const cells = ['cell-1', 'cell-2', 'cell-3', 'cell-4'] as const;
/** Each cell's output, mV/V per 300 kg. */
export const cellOutputs = [2.006, 1.994, 2.011, 1.989] as const;
/** The eccentricity test load, kg. */
export const testLoad = 200;

/** The share of a load over cell p carried by cell i (rigid stand: mostly the cell below it). */
const share = (p: number, i: number): number => (p === i ? 0.85 : (p + 2) % 4 === i ? 0.03 : 0.06);

function main(): void {
  const lines = [
    '# Loading schedule of the test-rig coupling (invented; examples/test-rig-coupling/scenario.ts).',
    '# Each component alone at nine levels up and down, then the pairs at (±60 %, ±60 %).',
    `${components.map((c, j) => `${c} [${componentUnits[j]}]`).join(',')},${bridges.map((b) => `${b} [mV/V]`).join(',')},direction`,
  ];
  const levels = [-1, -0.75, -0.5, -0.25, 0, 0.25, 0.5, 0.75, 1];
  const row = (f: number[], direction: string): void => {
    const r = couplingReadings(f).map((x) => (x + readingNoise * gaussian()).toFixed(7));
    lines.push(`${f.join(',')},${r.join(',')},${direction}`);
  };
  for (let j = 0; j < 6; j++) {
    for (const l of levels)
      row(
        fullScale.map((fs, k) => (k === j ? l * fs : 0)),
        'ascending',
      );
    for (const l of [...levels].reverse().slice(1))
      row(
        fullScale.map((fs, k) => (k === j ? l * fs : 0)),
        'descending',
      );
    for (let k = j + 1; k < 6; k++) {
      for (const [a, b] of [
        [1, 1],
        [1, -1],
        [-1, 1],
        [-1, -1],
      ] as const) {
        row(
          fullScale.map((fs, c) => (c === j ? 0.6 * a * fs : c === k ? 0.6 * b * fs : 0)),
          '',
        );
      }
    }
  }
  writeFileSync(new URL('./coupling-schedule.csv', import.meta.url), `${lines.join('\n')}\n`);

  const zero = [0.0123, -0.0087, 0.0041, 0.0065];
  const test = [
    '# Eccentricity test of the gearbox stand (invented; examples/test-rig-coupling/scenario.ts):',
    '# the stand unloaded, then 200 kg over each cell in turn and at the centre. Readings in mV/V.',
    `position,${cells.map((c) => `${c} [mV/V]`).join(',')}`,
    `zero,${zero.map((z) => z.toFixed(5)).join(',')}`,
  ];
  const reading = (loads: number[]): string =>
    loads.map((l, i) => (zero[i]! + (cellOutputs[i]! * l) / 300 + 2e-5 * gaussian()).toFixed(5)).join(',');
  for (let p = 0; p < 4; p++)
    test.push(`corner-${p + 1},${reading(cells.map((_, i) => share(p, i) * testLoad))}`);
  test.push(`centre,${reading(cells.map(() => testLoad / 4))}`);
  writeFileSync(new URL('./stand-eccentricity.csv', import.meta.url), `${test.join('\n')}\n`);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) main();
