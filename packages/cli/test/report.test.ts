/**
 * `bridgework report` end to end on the example channel file: the text report against a golden
 * file, the JSON report against the channel package's own budgets of the same channels written
 * by hand in SI (so the file's units must have been read right), exit code 2 on a failed check
 * with the reports still written, and the output-file rules.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { channelBudget, createChannel, type ChannelBudget } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { SAFETY_CAUTION } from '../src/caution.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import {
  examplePath,
  exampleShown,
  footbridgeNames,
  footbridgeSpecs,
  repoRoot,
} from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, outPath } = useTestFiles('report');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

const library: Record<string, ChannelBudget> = Object.fromEntries(
  footbridgeNames.map((n) => [n, channelBudget(createChannel(footbridgeSpecs[n]))]),
);

describe('bridgework report on the example file', () => {
  it('runs from the repository root (the paths in the golden file are relative to it)', () => {
    expect(process.cwd().replace(/\/?$/, '/')).toBe(repoRoot);
    expect(existsSync(exampleShown)).toBe(true);
  });

  it('prints the text report exactly as the golden file, exit 0', async () => {
    const r = await run('report', exampleShown);
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stderr).toBe('');
    await expect(r.stdout).toMatchFileSnapshot('./__snapshots__/footbridge-report.txt');
    expect(r.stdout.replace(/\s+/g, ' ').trimEnd().endsWith(SAFETY_CAUTION)).toBe(true);
  });

  it('shows the library’s numbers in the text, in the units people read (kN, µε, °C)', async () => {
    const { stdout } = await run('report', exampleShown);
    const section = (name: string) => stdout.slice(stdout.indexOf(`${name}:`));
    const uc = (name: string) =>
      Number(/combined standard uncertainty u_c\s+([\d.]+)/.exec(section(name))?.[1]);
    // Three significant digits are printed: half a unit of the third digit is the tolerance.
    expect(uc('hanger-h3')).toBeNear(library['hanger-h3']!.combined.standardUncertainty / 1e3, { rel: 5e-3 });
    expect(uc('gusset-g2')).toBeNear(library['gusset-g2']!.combined.standardUncertainty, { rel: 5e-3 });
    expect(uc('deck-temp')).toBeNear(library['deck-temp']!.combined.standardUncertainty, { rel: 5e-3 });
    expect(section('hanger-h3')).toMatch(/^hanger-h3: force, shown in kN$/m);
    expect(section('gusset-g2')).toMatch(/^gusset-g2: strain \(µε\)$/m);
    // The converter input at the budget point in mV/V: code × LSB / excitation.
    const h = library['hanger-h3']!;
    const mvv = (h.code * createChannel(footbridgeSpecs['hanger-h3']).adc.lsbVolts * 1e3) / 5;
    expect(Number(/converter input ([\d.]+) mV\/V/.exec(section('hanger-h3'))?.[1])).toBeNear(mvv, {
      abs: 5e-5, // printed to 5 significant digits
    });
    // The gusset gauge uses 2.5 % of the converter's range (the channel package warns below 5 %).
    expect(stdout).toMatch(
      /^ {4}WARN {2}share of the converter's range used by the span: the span uses 2\.51\u00a0%/m,
    );
    expect(stdout).toMatch(/No check failed, but 1 warning: see the WARN lines above\./);
  });

  it('prints JSON with the same budgets as the channel package computes from the SI specs', async () => {
    const r = await run('report', exampleShown, '--json');
    expect(r.code).toBe(exitCodes.ok);
    const json = JSON.parse(r.stdout) as {
      generator: string;
      caution: string;
      ok: boolean;
      channels: {
        name: string;
        unit: string;
        at: number;
        code: number;
        lines: { name: string; value: number; standardUncertainty: number | null; model: string }[];
        combined: {
          standardUncertainty: number;
          expandedUncertainty: number;
          effectiveDegreesOfFreedom: null;
        };
        noise: { totalRms: number };
        checks: { id: string; status: string; ok: boolean; value: number | null; limit: number | null }[];
      }[];
    };
    expect(json.caution).toBe(SAFETY_CAUTION);
    expect(json.generator).toMatch(/^bridgework \d+\.\d+\.\d+$/);
    expect(json.ok).toBe(true);
    expect(json.channels.map((c) => c.name)).toEqual([...footbridgeNames]);
    for (const c of json.channels) {
      const b = library[c.name]!;
      // The same inputs through the same library: identical doubles.
      expect(c.unit).toBe(b.unit);
      expect(c.at).toBe(b.at);
      expect(c.code).toBe(b.code);
      expect(c.combined.standardUncertainty).toBe(b.combined.standardUncertainty);
      expect(c.combined.expandedUncertainty).toBe(b.combined.expandedUncertainty);
      expect(c.combined.effectiveDegreesOfFreedom).toBeNull(); // rectangular and exact inputs: ν = ∞
      expect(c.noise.totalRms).toBe(b.noise.totalRms);
      expect(c.lines.map((l) => [l.name, l.value, l.standardUncertainty, l.model])).toEqual(
        b.lines.map((l) => [l.name, l.value, l.standardUncertainty ?? null, l.model]),
      );
      // Every design check of the budget, its figure and threshold as computed (null where not finite).
      const orNull = (x: number) => (Number.isFinite(x) ? x : null);
      expect(c.checks.map((k) => [k.id, k.status, k.ok, k.value, k.limit])).toEqual(
        b.checks.map((k) => [k.id, k.status, k.ok, orNull(k.value), orNull(k.limit)]),
      );
      expect(c.checks.filter((k) => k.id.startsWith('headroom-')).map((k) => k.value)).toEqual(
        b.frontEnd.value.headroom.margins.map((m) => m.nodeVolts),
      );
    }
  });

  it('selects one channel with --channel, and suggests a name for a typo', async () => {
    const r = await run('report', exampleShown, '--channel', 'gusset-g2', '--json');
    expect((JSON.parse(r.stdout) as { channels: { name: string }[] }).channels.map((c) => c.name)).toEqual([
      'gusset-g2',
    ]);
    const typo = await run('report', exampleShown, '--channel', 'gusset-g3');
    expect(typo).toEqual({
      code: exitCodes.badInput,
      stdout: '',
      stderr: `bridgework report: ${exampleShown} has no channel 'gusset-g3'; did you mean 'gusset-g2'?\n`,
    });
  });
});

describe('bridgework report: output files and failed checks', () => {
  const example = readFileSync(examplePath, 'utf8');

  it('writes the text or JSON report and the HTML report atomically, and says where', async () => {
    const html = outPath('report.html');
    const json = outPath('report.json');
    const r = await run('report', exampleShown, '--json', '-o', json, '--html', html);
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(`wrote the HTML report to ${html}\nwrote the JSON report to ${json}\n`);
    expect(readFileSync(html, 'utf8')).toMatch(/^<!DOCTYPE html>/);
    expect((JSON.parse(readFileSync(json, 'utf8')) as { ok: boolean }).ok).toBe(true);
  });

  it('never replaces an existing file without --force, and then writes nothing at all', async () => {
    const html = outPath('kept.html');
    const text = file('kept.txt', 'an earlier report\n');
    const r = await run('report', exampleShown, '--html', html, '-o', text);
    expect(r).toEqual({
      code: exitCodes.badInput,
      stdout: '',
      stderr: `bridgework report: ${text} exists already; pass --force to replace it\n`,
    });
    expect(existsSync(html)).toBe(false);
    expect(readFileSync(text, 'utf8')).toBe('an earlier report\n');
    expect((await run('report', exampleShown, '--html', html, '-o', text, '--force')).code).toBe(0);
    expect(readFileSync(text, 'utf8')).toMatch(/^Design report: Riverside footbridge/);
  });

  it('refuses the same file for --html and --out', async () => {
    const same = outPath('same.html');
    const r = await run('report', exampleShown, '--html', same, '-o', same);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toBe('bridgework report: `--html` and `--out` must name different files\n');
  });

  it('exits 2 when a headroom check fails, and still prints and writes the reports', async () => {
    // The hanger's amplifier output may not swing below 1.2 V: at −10 kN it sits at 2.42 V, so
    // 3.5 V makes the low limit fail (margin 2.42 − 3.5 = −1.08 V).
    const failing = file(
      'failing.yaml',
      example.replace('outputVolts: [0.1 V, 4.9 V]', 'outputVolts: [3.5 V, 4.9 V]'),
    );
    const html = outPath('failing.html');
    const r = await run('report', failing, '--html', html);
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(r.stdout).toMatch(
      /^ {4}FAIL {2}amplifier output, low swing: 2\.424\u00a0V against 3\.5\u00a0V at −10\u00a0kN, margin −1\.076\u00a0V: .+$/m,
    );
    expect(r.stdout).toMatch(
      /A design check failed: see the FAIL lines above \(exit code 2\); 1 warning as well\./,
    );
    expect(r.stdout).toMatch(/^ {2}hanger-h3 .* 1 failed$/m);
    expect(readFileSync(html, 'utf8')).toContain(
      '<li class="fail"><span class="badge">fail</span> <strong>amplifier output, low swing</strong>',
    );
    const json = await run('report', failing, '--json');
    expect(json.code).toBe(exitCodes.failedCheck);
    expect((JSON.parse(json.stdout) as { ok: boolean }).ok).toBe(false);
  });

  it('colours only on a terminal and never with NO_COLOR', async () => {
    const tty = memoryIo({ stdoutTTY: true });
    await runCli(['report', exampleShown, '--channel', 'deck-temp'], tty);
    expect(tty.stdout.text()).toContain('\u001b[32mpass\u001b[39m');
    const noColor = memoryIo({ stdoutTTY: true, env: { NO_COLOR: '1' } });
    await runCli(['report', exampleShown, '--channel', 'deck-temp'], noColor);
    expect(noColor.stdout.text()).not.toContain('\u001b[');
  });

  it('writes no colour codes into a file even from a terminal', async () => {
    const out = outPath('plain.txt');
    const io = memoryIo({ stdoutTTY: true });
    expect(await runCli(['report', exampleShown, '-o', out], io)).toBe(0);
    expect(readFileSync(out, 'utf8')).not.toContain('\u001b[');
    writeFileSync(out, '');
  });
});
