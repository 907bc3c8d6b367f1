/**
 * The CSV writer's number text, in one process, per CPU second (user + system, so that the figure
 * holds on a machine shared with other work): `String(x)` copied byte by byte into the output
 * buffer (what the writer did before) against the writer's own formatter (`writeShortest`, the
 * same text) and against `writeDigits` with 9 and 6 significant digits; then the writer's row loop
 * (`formatCsvRows`: 8 channels a row, shortest and 6 digits). The values are a converted strain
 * channel's (µε of a 24-bit converter), the bytes per value are printed beside each speed. The
 * formatter's exactness is tested in packages/cli/test/numberText.test.ts.
 *
 * `--against=<other build>/packages/cli/dist/data/numberText.js` runs another build's formatter
 * and row loop (its sibling `csvRows.js`) in the same rounds, case by case, and prints the ratio
 * of each case's speed to the other build's.
 */
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = fileURLToPath(new URL('../../../', import.meta.url)); // .bench-build/test/bench → repo
interface Build {
  writeShortest: (v: number, buffer: Uint8Array, pos: number) => number;
  writeDigits: (v: number, digits: number, buffer: Uint8Array, pos: number) => number;
  formatCsvRows: (
    values: Float64Array,
    laneStride: number,
    channels: number,
    timeStamps: undefined,
    digits: number | undefined,
    from: number,
    to: number,
    buffer: Uint8Array,
    pos: number,
    limit: number,
  ) => { row: number; pos: number };
}
async function load(numberText: string): Promise<Build> {
  const text = (await import(pathToFileURL(numberText).href)) as Build;
  const rows = (await import(pathToFileURL(join(dirname(numberText), 'csvRows.js')).href)) as Build;
  return {
    writeShortest: text.writeShortest,
    writeDigits: text.writeDigits,
    formatCsvRows: rows.formatCsvRows,
  };
}
const against = process.argv.find((a) => a.startsWith('--against='))?.slice('--against='.length);
const builds: [string, Build][] = [['', await load(join(root, 'packages/cli/dist/data/numberText.js'))]];
if (against !== undefined) builds.push([' (against)', await load(against)]);

const n = 1_000_000;
const values = new Float64Array(n);
for (let i = 0; i < n; i++) {
  const code = Math.round(Math.sin(i / 1000) * 2e6) + (i % 7);
  values[i] = ((code * 1.1920928955078125e-7) / 2.09) * 2.01e3;
}
const buffer = new Uint8Array(32 * n);
const loop = (write: (v: number, pos: number) => number) => (): number => {
  let pos = 0;
  for (let i = 0; i < n; i++) {
    pos = write(values[i] as number, pos);
    buffer[pos++] = 44;
  }
  return pos;
};
// The row loop: the same values as 8 lanes of n/8 frames.
const channels = 8;
const frames = n / channels;
const rows = (build: Build, digits: number | undefined) => (): number =>
  build.formatCsvRows(values, frames, channels, undefined, digits, 0, frames, buffer, 0, buffer.length - 1024)
    .pos;
const cases: [string, () => number][] = [
  [
    'String(x), bytes copied',
    loop((v, pos) => {
      const s = String(v);
      for (let k = 0; k < s.length; k++) buffer[pos++] = s.charCodeAt(k);
      return pos;
    }),
  ],
];
for (const [tag, build] of builds) {
  cases.push(
    [`writeShortest (same text)${tag}`, loop((v, pos) => build.writeShortest(v, buffer, pos))],
    [`writeDigits, 9 digits${tag}`, loop((v, pos) => build.writeDigits(v, 9, buffer, pos))],
    [`writeDigits, 6 digits${tag}`, loop((v, pos) => build.writeDigits(v, 6, buffer, pos))],
    [`formatCsvRows, shortest${tag}`, rows(build, undefined)],
    [`formatCsvRows, 6 digits${tag}`, rows(build, 6)],
  );
}
for (const [, run] of cases) run(); // warm up
const rounds = 5;
const best = cases.map(() => 0);
const bytes = cases.map(() => 0);
for (let r = 0; r < rounds; r++) {
  // Rotating order, so that no case always runs first or after the same one.
  for (let c = 0; c < cases.length; c++) {
    const k = (c + r) % cases.length;
    const run = (cases[k] as [string, () => number])[1];
    const start = process.cpuUsage();
    bytes[k] = run();
    const used = process.cpuUsage(start);
    best[k] = Math.max(best[k] as number, n / ((used.user + used.system) / 1e6));
  }
}
console.log(`CSV number text: ${n} values, best of ${rounds} rounds, per CPU second`);
const width = 38;
cases.forEach(([name], k) => {
  // Against the other build's same case, when there is one; else against String(x).
  const twin = cases.findIndex(([other]) => other === `${name} (against)`);
  const ratio =
    twin >= 0
      ? `${((best[k] as number) / (best[twin] as number)).toFixed(2)}× the other build`
      : `${((best[k] as number) / (best[0] as number)).toFixed(1)}× String(x)`;
  console.log(
    `${name.padEnd(width)}${((best[k] as number) / 1e6).toFixed(1).padStart(8)} M values/CPU s${(((bytes[k] as number) / n).toFixed(1) + ' B/value').padStart(16)}   ${ratio}`,
  );
});
