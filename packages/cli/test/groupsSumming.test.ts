/**
 * A platform summed in an analog junction (the test rig's stand, examples/test-rig-coupling, with
 * a `summing` section added): the trims the channel file's eccentricity test sets, checked by an
 * independent 40-digit nodal solve of the trimmed junction written here (every corner reads the
 * test load within 1e-9 relative, the centre's remaining difference as reported), the R 76 check,
 * `report`, `convert` (the junction's indication per frame) and `constants` (nothing per cell to
 * write for a hardware sum).
 */
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { fitSummingTrims } from '@bridgework/calibration';
import { solveNetwork, type Resistor } from '../../../test/support/nodal.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type PlatformGroup } from '../src/groups/loadGroups.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-rig-coupling/', import.meta.url));
const tmp = useTempDir('groups-summing');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** The example with the stand summed in an analog junction (350 Ω cells, trims split, open meter). */
function analogCopy(summing: string): string {
  const dir = join(tmp(), `copy-${Math.random().toString(36).slice(2)}`);
  cpSync(exampleDir, dir, { recursive: true });
  const file = join(dir, 'test-rig.yaml');
  const text = readFileSync(file, 'utf8');
  const at = '    indication: { name: W, unit: kg }\n';
  expect(text).toContain(at);
  writeFileSync(file, text.replace(at, `${at}${summing}`));
  return file;
}

/** The test file's cell readings per position (mV/V), the zero row subtracted, parsed here. */
function testRows(): Map<string, number[]> {
  const lines = readFileSync(join(exampleDir, 'stand-eccentricity.csv'), 'utf8')
    .split('\n')
    .filter((l) => l.trim() !== '' && !l.startsWith('#'))
    .slice(1)
    .map((l) => l.split(','));
  const zero = lines
    .find((l) => l[0] === 'zero')!
    .slice(1)
    .map(Number);
  return new Map(
    lines.filter((l) => l[0] !== 'zero').map((l) => [l[0]!, l.slice(1).map((x, i) => Number(x) - zero[i]!)]),
  );
}

/**
 * The trimmed junction solved independently: a 1 V supply; per cell a trim split between its
 * +E and −E leads, a bridge of four arms R(1 ± x) (+E–S+ and −S–−E of R(1 + x), +E–S− and
 * S+–−E of R(1 − x), so the cell alone reads x), its S+ and S− wired to the buses; output
 * V(bus+) − V(bus−) per volt.
 */
function junctionOutput(cellOhms: number, trims: readonly number[], ratios: readonly number[]): number {
  const resistors: Resistor[] = [];
  ratios.forEach((x, i) => {
    const t = trims[i]! / 2;
    resistors.push(
      { a: 'supply+', b: `e+${i}`, ohms: t },
      { a: `e-${i}`, b: 'supply-', ohms: t },
      { a: `e+${i}`, b: `s+${i}`, ohms: cellOhms * (1 - x) },
      { a: `s+${i}`, b: `e-${i}`, ohms: cellOhms * (1 + x) },
      { a: `e+${i}`, b: `s-${i}`, ohms: cellOhms * (1 + x) },
      { a: `s-${i}`, b: `e-${i}`, ohms: cellOhms * (1 - x) },
      { a: `s+${i}`, b: 'bus+', ohms: 0 },
      { a: `s-${i}`, b: 'bus-', ohms: 0 },
    );
  });
  const solution = solveNetwork({
    resistors,
    sources: [{ plus: 'supply+', minus: 'supply-', volts: 1 }],
    ground: 'supply-',
  });
  return Number(solution.volts('bus+').minus(solution.volts('bus-')).toString());
}

describe('a platform with an analog summing junction', async () => {
  const file = analogCopy('    summing: { cellOhms: 350 Ω }\n');
  const stand = ((await loadGroups(await loadChannels(file))) as PlatformGroup[])[1]!;
  const rows = testRows();
  const corners = ['corner-1', 'corner-2', 'corner-3', 'corner-4'];

  it('solves the trims from the file’s test: the library’s fitSummingTrims on the same ratios', () => {
    expect(stand.summing).toBeDefined();
    const direct = fitSummingTrims({
      cellOhms: [350, 350, 350, 350],
      cellRatios: corners.map((c) => rows.get(c)!.map((x) => x / 1000)),
      checkRatios: [rows.get('centre')!.map((x) => x / 1000)],
    });
    // mV/V to V/V by the channel's unit table (×1e-3 there, ÷1000 here): equal within a few ulps.
    stand.summing!.trims.trimsOhms.forEach((t, i) =>
      expect(t).toBeNear(direct.trimsOhms[i]!, { rel: 1e-9, abs: 1e-9 }),
    );
    expect(stand.summing!.trims.referenceCell).toBe(direct.referenceCell);
  });

  it('the trimmed junction, solved by an independent 40-digit nodal analysis, reads every corner alike', () => {
    const trims = stand.summing!.trims.trimsOhms;
    const outputs = corners.map((c) =>
      junctionOutput(
        350,
        trims,
        rows.get(c)!.map((x) => x / 1000),
      ),
    );
    const mean = outputs.reduce((a, x) => a + x, 0) / outputs.length;
    // Issue 20: the trims make the corner readings equal to each other within 1e-9 relative.
    outputs.forEach((o) => expect(o).toBeNear(mean, { rel: 1e-9 }));
    // The indications the group reports are the span factor times those outputs: the test load.
    stand.indications.slice(0, 4).forEach((w, p) => {
      expect(w).toBeNear(200, { rel: 1e-9 });
      expect(w).toBeNear(stand.summing!.spanFactor * outputs[p]!, { rel: 1e-10 });
    });
    // The centre's remaining difference, computed by the nodal solve, is the one reported.
    const centre = junctionOutput(
      350,
      trims,
      rows.get('centre')!.map((x) => x / 1000),
    );
    expect(stand.summing!.trims.checks[0]!.differenceFraction).toBeNear((centre - mean) / mean, {
      abs: 1e-9,
    });
    expect(stand.indications[4]!).toBeNear(stand.summing!.spanFactor * centre, { rel: 1e-10 });
  });

  it('reports the junction: trims, the span factor, the centre’s difference, the R 76 check', async () => {
    const r = await run('report', file);
    expect(r.code).toBe(exitCodes.ok);
    const text = r.stdout.replace(/\n {2}(?=\S)/g, ' ');
    expect(text).toContain('summed in an analog junction');
    expect(text).toMatch(/trim resistors of the summing junction \(Ω\)/);
    expect(text).toMatch(
      /Remaining difference of the check positions from the corners' mean output: centre −?[\d.]+ %/,
    );
    expect(text).toContain('pass  eccentricity (OIML R 76)');
    const json = JSON.parse((await run('report', file, '--json')).stdout).groups.stand;
    expect(json.summing.trimsOhms).toEqual(stand.summing!.trims.trimsOhms);
    expect(json.summing.referenceCell).toBe(`cell-${stand.summing!.trims.referenceCell + 1}`);
    expect(json.summing.checks[0].position).toBe('centre');
    expect(json.eccentricity.ok).toBe(true);
  });

  it('convert writes the junction’s indication per frame; constants writes no per-cell map for it', async () => {
    const loaded = await loadChannels(file);
    const channel = (name: string) => loaded.channels.find((c) => c.name === name)!.channel;
    const cellMv = [
      [0.6, 0.55, 0.62, 0.5],
      [1.1, 0.05, 0.05, 0.07],
    ];
    const names = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6', 'cell-1', 'cell-2', 'cell-3', 'cell-4'];
    const frames = cellMv.map((cells) => [
      0,
      0,
      0,
      0,
      0,
      0,
      ...cells.map((x, i) => channel(`cell-${i + 1}`).codeFromQuantity(x)),
    ]);
    const input = join(tmp(), 'stand-codes.csv');
    writeFileSync(input, `${names.join(',')}\n${frames.map((f) => f.join(',')).join('\n')}\n`);
    const r = await run('convert', file, input, '--groups', 'stand', '--channels', names.join(','));
    expect(r.code).toBe(exitCodes.ok);
    const out = r.stdout.trimEnd().split('\n');
    expect(out[0]!.split(',').at(-1)).toBe('stand.W (kg)');
    out.slice(1).forEach((line, s) => {
      const values = line.split(',').map(Number);
      const cells = values.slice(6, 10).map((x) => x / 1000);
      const w = values.at(-1)!;
      expect(w).toBeNear(
        stand.summing!.spanFactor * junctionOutput(350, stand.summing!.trims.trimsOhms, cells),
        {
          rel: 1e-10,
        },
      );
    });
    const c = JSON.parse(
      (await run('constants', file, '--verification', 'sampled', '--format', 'json')).stdout,
    );
    expect(c.groups.map((g: { name: string }) => g.name)).toEqual(['coupling']);
  });

  it('refuses a junction the file cannot describe, naming the field', async () => {
    const bad = analogCopy('    summing: { cellOhms: [350 Ω, 350 Ω, 350 Ω], trimPlacement: middle }\n');
    const r = await run('report', bad);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toContain('groups.stand.summing.cellOhms: lists 3 resistances for 4 cells');
    expect(r.stderr).toContain(
      'groups.stand.summing.trimPlacement: must be one of both-excitation, positive-excitation',
    );
  });
});
