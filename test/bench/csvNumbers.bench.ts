/**
 * The CSV writer's number text, in one process, per CPU second (user + system, so that the figure
 * holds on a machine shared with other work): `String(x)` copied byte by byte into the output
 * buffer (what the writer did before) against the writer's own formatter (`writeShortest`, the
 * same text) and against `writeDigits` with 9 and 6 significant digits. The values are a converted
 * strain channel's (µε of a 24-bit converter), the bytes per value are printed beside each speed.
 * The formatter's exactness is tested in packages/cli/test/numberText.test.ts.
 */
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = fileURLToPath(new URL('../../../', import.meta.url)); // .bench-build/test/bench → repo
type Writer = (v: number, buffer: Uint8Array, pos: number) => number;
const text = (await import(pathToFileURL(join(root, 'packages/cli/dist/data/numberText.js')).href)) as {
  writeShortest: Writer;
  writeDigits: (v: number, digits: number, buffer: Uint8Array, pos: number) => number;
};

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
const cases: [string, () => number][] = [
  [
    'String(x), bytes copied',
    loop((v, pos) => {
      const s = String(v);
      for (let k = 0; k < s.length; k++) buffer[pos++] = s.charCodeAt(k);
      return pos;
    }),
  ],
  ['writeShortest (same text)', loop((v, pos) => text.writeShortest(v, buffer, pos))],
  ['writeDigits, 9 digits', loop((v, pos) => text.writeDigits(v, 9, buffer, pos))],
  ['writeDigits, 6 digits', loop((v, pos) => text.writeDigits(v, 6, buffer, pos))],
];
for (const [, run] of cases) run(); // warm up
const rounds = 5;
const best = cases.map(() => 0);
const bytes = cases.map(() => 0);
for (let r = 0; r < rounds; r++) {
  cases.forEach(([, run], k) => {
    const start = process.cpuUsage();
    bytes[k] = run();
    const used = process.cpuUsage(start);
    best[k] = Math.max(best[k] as number, n / ((used.user + used.system) / 1e6));
  });
}
console.log(`CSV number text: ${n} values, best of ${rounds} rounds, per CPU second`);
cases.forEach(([name], k) => {
  console.log(
    `${name.padEnd(28)}${((best[k] as number) / 1e6).toFixed(1).padStart(8)} M values/CPU s${(((bytes[k] as number) / n).toFixed(1) + ' B/value').padStart(16)}${`${((best[k] as number) / (best[0] as number)).toFixed(1)}×`.padStart(8)}`,
  );
});
