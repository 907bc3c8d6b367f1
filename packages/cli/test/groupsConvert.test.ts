/**
 * `bridgework convert --groups`: a recording of the test rig's ten bridges
 * (examples/test-rig-coupling) converted to the coupling's six components and the stand's
 * weight, checked against the scenario's true loads (the independent forward model that generated
 * the calibration data) and, exactly, against the calibration's inverse applied by hand.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type MultiComponentGroup, type PlatformGroup } from '../src/groups/loadGroups.js';
import { cellOutputs, couplingReadings, fullScale } from '../../../examples/test-rig-coupling/scenario.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const example = fileURLToPath(new URL('../../../examples/test-rig-coupling/test-rig.yaml', import.meta.url));
const { file } = useTestFiles('groups-convert');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function parseCsv(text: string): { header: string[]; rows: number[][] } {
  const [head, ...lines] = text.trimEnd().split('\n');
  return { header: (head as string).split(','), rows: lines.map((l) => l.split(',').map(Number)) };
}

/** Load states: each component alone, pairs, all six at 40 %, and zero (fractions of full scale). */
const states: number[][] = [
  [0, 0, 0, 0, 0, 0],
  ...fullScale.map((_, j) => fullScale.map((fs, k) => (k === j ? 0.8 * fs : 0))),
  fullScale.map((fs, k) => (k % 2 === 0 ? 0.5 : -0.5) * fs),
  fullScale.map((fs) => 0.4 * fs),
];
/** Stand loads: kg on each cell (a 600 kg gearbox off centre). */
const standLoads = [160, 140, 170, 130];

describe('convert --groups on the test rig', async () => {
  const loaded = await loadChannels(example);
  const [coupling, stand] = (await loadGroups(loaded)) as [MultiComponentGroup, PlatformGroup];
  const channel = (name: string) => loaded.channels.find((c) => c.name === name)!.channel;
  // Codes of every frame: the true readings (mV/V) to the nearest code.
  const frames = states.map((f, s) => {
    const r = couplingReadings(f);
    const cells = standLoads.map((kg, i) => (cellOutputs[i]! * kg) / 300 + 0.0001 * s);
    return [
      ...r.map((x, i) => channel(`b${i + 1}`).codeFromQuantity(x)),
      ...cells.map((x, i) => channel(`cell-${i + 1}`).codeFromQuantity(x)),
    ];
  });
  const names = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6', 'cell-1', 'cell-2', 'cell-3', 'cell-4'];
  const csv = `${names.join(',')}\n${frames.map((f) => f.join(',')).join('\n')}\n`;
  const input = file('rig-codes.csv', csv);

  it('writes the components beside the bridges: equal to the inverse by hand, near the true loads', async () => {
    const r = await run('convert', example, input, '--groups', 'all');
    expect(r.code).toBe(exitCodes.ok);
    const { header, rows } = parseCsv(r.stdout);
    expect(header).toEqual([
      ...names.map((n) => `${n} (mV/V)`),
      'coupling.Fx (N)',
      'coupling.Fy (N)',
      'coupling.Fz (N)',
      'coupling.Mx (N·m)',
      'coupling.My (N·m)',
      'coupling.Mz (N·m)',
      'stand.W (kg)',
    ]);
    const inverse = coupling.calibration.createInverse();
    rows.forEach((row, s) => {
      // The bridge columns are the channels' own values (the channel's kernel; shortest round trip
      // in CSV), and the group reads exactly those.
      const readings = row.slice(0, 6);
      readings.forEach((x, i) =>
        expect(x).toBeNear(channel(names[i]!).quantityFromCode(frames[s]![i]!), { ulps: 4 }),
      );
      const byHand = inverse.loadsFromReadings(readings);
      for (let j = 0; j < 6; j++) {
        expect(row[10 + j]).toBe(byHand[j]);
        // The true load: within the calibration's error (residuals up to 0.03 % FS, report) plus
        // one code of quantization (9.3e-7 mV/V ≈ 0.0002 % FS): 0.06 % of full scale.
        expect(row[10 + j]!).toBeNear(states[s]![j]!, { abs: 6e-4 * fullScale[j]! });
      }
      const cells = row.slice(6, 10);
      const w = cells.reduce((a, x, i) => a + stand.factors.factors[i]! * x, 0);
      expect(row[16]).toBeNear(w, { ulps: 8 });
      // Each cell reads cellOutputs[i] mV/V per 300 kg, the factors are ≈ 300/cellOutputs[i]
      // (the eccentricity test's noise, 2e-5 mV/V), so W is the 600 kg on the cells plus the
      // 1e-4 mV/V per frame added above: within 0.05 kg.
      const added = cells.reduce((a, _, i) => a + (300 / cellOutputs[i]!) * 0.0001 * s, 0);
      expect(row[16]!).toBeNear(600 + added, { abs: 0.05 });
    });
  });

  it('with --drop-bridges writes the components instead of the bridges, in display units too', async () => {
    const r = await run(
      'convert',
      example,
      input,
      '--groups',
      'coupling',
      '--drop-bridges',
      '--unit',
      'display',
    );
    expect(r.code).toBe(exitCodes.ok);
    const { header, rows } = parseCsv(r.stdout);
    expect(header.slice(0, 4)).toEqual(['cell-1 (mV/V)', 'cell-2 (mV/V)', 'cell-3 (mV/V)', 'cell-4 (mV/V)']);
    expect(header.slice(4)).toHaveLength(6);
    const full = parseCsv((await run('convert', example, input, '--groups', 'coupling')).stdout);
    rows.forEach((row, s) => expect(row.slice(4)).toEqual(full.rows[s]!.slice(10, 16)));
  });

  it('writes NaN components for a frame whose bridge is at a rail, and counts them', async () => {
    const bad = frames.map((f) => [...f]);
    bad[3]![2] = 2 ** 23 - 1; // b3 at the converter's upper rail
    const railed = file('railed.csv', `${names.join(',')}\n${bad.map((f) => f.join(',')).join('\n')}\n`);
    const r = await run('convert', example, railed, '--groups', 'coupling', '--drop-bridges');
    expect(r.code).toBe(exitCodes.ok);
    const { rows } = parseCsv(r.stdout);
    expect(rows[3]!.slice(4).every((x) => Number.isNaN(x))).toBe(true);
    expect(rows[2]!.slice(4).every((x) => Number.isFinite(x))).toBe(true);
    expect(r.stderr).toContain('coupling.Fx 1');
    expect(r.stderr).toContain('b3 (mV/V): 1, frame 3');
  });

  it('refuses an unknown group, a group whose bridges are not recorded, and --drop-bridges alone', async () => {
    const a = await run('convert', example, input, '--groups', 'couplin');
    expect(a.code).toBe(exitCodes.badInput);
    expect(a.stderr).toContain(
      "--groups: 'couplin' is not a group of the channel file; did you mean 'coupling'?",
    );
    const few = file('few.csv', `b1,b2\n1,2\n`);
    const b = await run('convert', example, few, '--channels', 'b1,b2', '--groups', 'coupling');
    expect(b.code).toBe(exitCodes.badInput);
    expect(b.stderr).toContain(
      "group 'coupling' needs b3, b4, b5, b6, which are not among the recording's channels",
    );
    const c = await run('convert', example, input, '--drop-bridges');
    expect(c.code).toBe(exitCodes.badInput);
    expect(c.stderr).toContain('--drop-bridges needs --groups');
  });
});
