/**
 * A group's calibration stored in the channel file: `bridgework fit-group` fits the test rig's
 * coupling (examples/test-rig-coupling) to its loading schedule and, with --write, stores the
 * coefficients, their covariance and the schedule's provenance in the file; `report`, `convert`
 * and `constants` on the written file must give what they give on the original (which fits the
 * schedule as it is read), bit for bit; stored coefficients in another reading unit are converted;
 * and the stored form's problems are refused with their field paths.
 */
import { createHash } from 'node:crypto';
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse, stringify } from 'yaml';
import { describe, expect, it } from 'vitest';
import { interactionTermChoices } from '@bridgework/calibration';
import { fitGroupOptions } from '../src/commands/fitGroup/fitGroupOptions.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type MultiComponentGroup } from '../src/groups/loadGroups.js';
import { couplingReadings, fullScale } from '../../../examples/test-rig-coupling/scenario.js';
import { schemaPath } from './support/channelFileDocs.js';
import { schemaErrors } from './support/jsonSchemaSubset.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-rig-coupling/', import.meta.url));
const example = join(exampleDir, 'test-rig.yaml');
const tmp = useTempDir('groups-stored');

async function run(...argv: string[]) {
  const io = memoryIo({ env: { SOURCE_DATE_EPOCH: '1796428800' } });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** A copy of the example folder; returns the channel file's path in it. */
function copy(name: string): string {
  const dir = join(tmp(), name);
  cpSync(exampleDir, dir, { recursive: true });
  return join(dir, 'test-rig.yaml');
}

async function coupling(file: string): Promise<MultiComponentGroup> {
  return ((await loadGroups(await loadChannels(file))) as MultiComponentGroup[])[0]!;
}

describe('fit-group and the stored form', async () => {
  const written = copy('written');
  const schedule = join(exampleDir, 'coupling-schedule.csv');
  const w = await run(
    'fit-group',
    written,
    schedule,
    '--group',
    'coupling',
    '--write',
    '--date',
    '2026-12-05',
  );

  it('fits and writes the coefficients, their covariance and the schedule’s provenance, keeping the rest', () => {
    expect(w.code).toBe(exitCodes.ok);
    expect(w.stdout).toContain('coupling: 6-component group');
    expect(w.stdout).toContain("wrote the coefficients of 'coupling' (28 terms, 6 bridges)");
    expect(w.stdout).toContain('do not replace, qualified engineering judgement');
    const text = readFileSync(written, 'utf8');
    expect(text).toContain('# multi-component calibration fitted to');
    const before = readFileSync(example, 'utf8');
    // Everything outside the group's calibration is kept byte for byte (the channels come first).
    expect(text.slice(0, before.indexOf('    calibration:\n      schedule:'))).toBe(
      before.slice(0, before.indexOf('    calibration:\n      schedule:')),
    );
    const cal = (parse(text) as { groups: { coupling: { calibration: Record<string, any> } } }).groups
      .coupling.calibration;
    expect(cal['schedule']).toBeUndefined();
    expect(cal['readingUnit']).toBe('mV/V');
    expect(cal['terms']).toHaveLength(28);
    expect(Object.keys(cal['coefficients'])).toEqual(['b1', 'b2', 'b3', 'b4', 'b5', 'b6']);
    expect(cal['covariance'].terms).toHaveLength(28);
    expect(cal['covariance'].readings).toHaveLength(6);
    // The provenance: the schedule's SHA-256 computed here from its bytes, its rows, the date.
    const source = cal['source'];
    expect(source.schedule).toMatch(/coupling-schedule\.csv$/);
    expect(source.scheduleSha256).toBe(createHash('sha256').update(readFileSync(schedule)).digest('hex'));
    expect(source.points).toBe(
      readFileSync(schedule, 'utf8')
        .split('\n')
        .filter((l) => l.trim() !== '' && !l.startsWith('#')).length - 1,
    );
    expect(source.interactions).toBe('second-order');
    expect(source.date).toBe('2026-12-05');
  });

  it('the written file (and the original) pass the channel file’s JSON Schema, which refuses a misspelt field', () => {
    const schema = JSON.parse(readFileSync(schemaPath, 'utf8')) as Record<string, unknown>;
    expect(schemaErrors(schema, parse(readFileSync(example, 'utf8')))).toEqual([]);
    const data = parse(readFileSync(written, 'utf8')) as any;
    expect(schemaErrors(schema, data)).toEqual([]);
    data.groups.coupling.calibration.covariance.degreesOfFreedon = 3;
    expect(schemaErrors(schema, data)).not.toEqual([]);
  });

  it('offers the calibration package’s interaction choices', () => {
    expect(fitGroupOptions.find((o) => o.name === 'interactions')!.choices).toEqual([
      ...interactionTermChoices,
    ]);
  });

  it('without --write nothing is written', async () => {
    const file = copy('dry');
    const r = await run('fit-group', file, schedule);
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toContain('not written (give --write');
    expect(readFileSync(file, 'utf8')).toBe(readFileSync(example, 'utf8'));
  });

  it('the stored model is the fitted one bit for bit: matrices, inverse, uncertainty', async () => {
    const fitted = await coupling(example);
    const stored = await coupling(written);
    expect(stored.fit).toBeUndefined();
    expect(stored.calibration.uncertaintySource).toBe('stored');
    expect(stored.calibration.coefficients).toEqual(fitted.calibration.coefficients);
    expect(stored.calibration.loadMatrix).toEqual(fitted.calibration.loadMatrix);
    expect(stored.calibration.crossTalk).toEqual(fitted.calibration.crossTalk);
    const a = fitted.calibration.createInverse();
    const b = stored.calibration.createInverse();
    for (const f of [
      fullScale.map(() => 0),
      fullScale.map((x) => 0.7 * x),
      fullScale.map((x, j) => (j % 2 ? x : -x)),
    ]) {
      const r = couplingReadings(f);
      const x = a.loadsFromReadings(r);
      const y = b.loadsFromReadings(r);
      x.forEach((v, j) => expect(Object.is(v, y[j])).toBe(true));
    }
    const state = {
      loads: fullScale.map((x) => 0.3 * x),
      readingStandardUncertainties: fullScale.map(() => 1e-6),
    };
    expect(stored.calibration.uncertaintyAt(state)).toEqual(fitted.calibration.uncertaintyAt(state));
  });

  it('report, convert and constants on the written file give the original’s figures', async () => {
    const ra = JSON.parse((await run('report', example, '--json')).stdout).groups.coupling;
    const rb = JSON.parse((await run('report', written, '--json')).stdout).groups.coupling;
    expect(rb.calibration).toBe('stored');
    expect(rb.source.scheduleSha256).toMatch(/^[0-9a-f]{64}$/);
    for (const key of [
      'sensitivity',
      'loadMatrix',
      'crossTalk',
      'termFractions',
      'standardUncertaintyAtZero',
      'standardUncertaintyAtFullScale',
      'monteCarlo',
    ])
      expect(rb[key]).toEqual(ra[key]);
    // One line per paragraph: the terminal text wraps at 100 columns.
    const text = (await run('report', written)).stdout.replace(/\n {2}(?=\S)/g, ' ');
    expect(text).toMatch(
      /stored coefficients \(fitted to \d+ points of .*coupling-schedule\.csv \(sha256 [0-9a-f]{16}…\) on 2026-12-05\), with the fit's covariance stored \(134 degrees of freedom\)/,
    );
    expect(text).not.toContain('largest residual');

    const ca = JSON.parse(
      (await run('constants', example, '--verification', 'sampled', '--format', 'json')).stdout,
    );
    const cb = JSON.parse(
      (await run('constants', written, '--verification', 'sampled', '--format', 'json')).stdout,
    );
    expect(cb.groups).toEqual(ca.groups);

    const loaded = await loadChannels(example);
    const codes = [0.2, -0.4, 0.9].map((u) => {
      const r = couplingReadings(fullScale.map((x, j) => u * x * (j % 3 === 0 ? 1 : -0.5)));
      return [
        ...r.map((x, i) => loaded.channels.find((c) => c.name === `b${i + 1}`)!.channel.codeFromQuantity(x)),
        0,
        0,
        0,
        0,
      ];
    });
    const names = ['b1', 'b2', 'b3', 'b4', 'b5', 'b6', 'cell-1', 'cell-2', 'cell-3', 'cell-4'];
    const input = join(tmp(), 'codes.csv');
    writeFileSync(input, `${names.join(',')}\n${codes.map((c) => c.join(',')).join('\n')}\n`);
    const va = await run('convert', example, input, '--groups', 'coupling');
    const vb = await run('convert', written, input, '--groups', 'coupling');
    expect(va.code).toBe(exitCodes.ok);
    expect(vb.stdout).toBe(va.stdout);
  });

  it('stored coefficients in V/V (another reading unit) convert to the bridges’ mV/V', async () => {
    const data = parse(readFileSync(written, 'utf8')) as any;
    const cal = data.groups.coupling.calibration;
    cal.readingUnit = 'V/V';
    for (const b of Object.keys(cal.coefficients))
      cal.coefficients[b] = cal.coefficients[b].map((x: number) => x / 1000);
    cal.covariance.readings = cal.covariance.readings.map((row: number[]) => row.map((x) => x / 1e6));
    const file = join(join(tmp(), 'written'), 'volts.yaml');
    writeFileSync(file, stringify(data));
    const a = await coupling(written);
    const b = await coupling(file);
    // ×1000 after ÷1000: equal within a rounding or two of each coefficient.
    b.calibration.loadMatrix.forEach((row, j) =>
      row.forEach((c, i) => expect(c).toBeNear(a.calibration.loadMatrix[j]![i]!, { rel: 1e-14 })),
    );
    const u = (g: MultiComponentGroup) =>
      g.calibration.uncertaintyAt({ loads: fullScale.map((x) => 0.5 * x) }).standardUncertainties;
    u(b).forEach((x, j) => expect(x).toBeNear(u(a)[j]!, { rel: 1e-12 }));
  });

  it('refuses a stored form that is not a model, naming the field', async () => {
    const edit = async (change: (cal: any, group: any) => void) => {
      const data = parse(readFileSync(written, 'utf8')) as any;
      change(data.groups.coupling.calibration, data.groups.coupling);
      const file = join(join(tmp(), 'written'), 'bad.yaml');
      writeFileSync(file, stringify(data));
      const r = await run('report', file);
      expect(r.code).toBe(exitCodes.badInput);
      return r.stderr;
    };
    expect(await edit((cal) => (cal.schedule = 'coupling-schedule.csv'))).toMatch(
      /groups\.coupling\.calibration\.schedule: cannot be given with stored coefficients/,
    );
    expect(await edit((_, g) => delete g.components.Fx.fullScale)).toMatch(
      /groups\.coupling\.components: needs a fullScale for every component with stored coefficients/,
    );
    expect(await edit((cal) => delete cal.coefficients.b4)).toMatch(
      /groups\.coupling\.calibration\.coefficients\.b4: is required/,
    );
    expect(await edit((cal) => (cal.coefficients.b2 = cal.coefficients.b2.slice(1)))).toMatch(
      /groups\.coupling\.calibration\.coefficients\.b2: must be a list of 28 numbers/,
    );
    expect(await edit((cal) => (cal.terms[8] = 'Fx*Fq'))).toMatch(
      /groups\.coupling\.calibration\.terms\[8\]: the stored coefficients do not make a model: .*got 'Fx\*Fq'/,
    );
    expect(await edit((cal) => (cal.terms = cal.terms.map((t: string) => (t === 'Mz' ? 'Mz²' : t))))).toMatch(
      /groups\.coupling\.calibration\.terms.*Mz²/,
    );
    expect(await edit((cal) => (cal.readingUnit = 'kg'))).toMatch(
      /groups\.coupling\.calibration\.readingUnit: 'kg' is not a unit of every bridge's reading \(mV\/V\)/,
    );
    expect(await edit((cal) => (cal.covariance.readings[1][2] *= 2))).toMatch(
      /groups\.coupling\.calibration\.covariance\.readings\[1\]\[2\]: .*must be symmetric/,
    );
  });

  it('refuses a schedule that cannot determine the calibration, writing nothing', async () => {
    const file = copy('deficient');
    const rows = readFileSync(schedule, 'utf8').split('\n');
    const header = rows.find((l) => l.startsWith('Fx'))!.split(',');
    const mz = header.findIndex((h) => h.startsWith('Mz'));
    // Mz never loaded: every row's Mz set to 0.
    const flat = rows
      .map((l) =>
        l.startsWith('#') || l.startsWith('Fx') || l.trim() === ''
          ? l
          : l
              .split(',')
              .map((c, k) => (k === mz ? '0' : c))
              .join(','),
      )
      .join('\n');
    const bad = join(tmp(), 'no-mz.csv');
    writeFileSync(bad, flat);
    const r = await run('fit-group', file, bad, '--write');
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toContain('component Mz is never loaded (it is 0 at every point)');
    expect(readFileSync(file, 'utf8')).toBe(readFileSync(example, 'utf8'));
    const g = await run('fit-group', file, schedule, '--group', 'stand');
    expect(g.code).toBe(exitCodes.badInput);
    expect(g.stderr).toContain("`--group` 'stand' is not a multi-component group");
  });
});
