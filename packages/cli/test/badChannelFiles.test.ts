/**
 * Bad channel files through the real command and the real channel schema: each mistake gives
 * its message with the file, position and field path, all mistakes at once, exit code 1, and
 * nothing on standard output. The files are the example with one mistake each.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { examplePath } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file } = useTestFiles('bad-files');
const example = readFileSync(examplePath, 'utf8');

/** The example with `from` replaced by `to` (which must occur exactly once). */
function edited(name: string, from: string, to: string): string {
  expect(example.split(from).length, from).toBe(2);
  return file(name, example.replace(from, to));
}

/** The line and column (from 1) of the first occurrence of `text` in a file's content. */
function position(content: string, text: string): string {
  const before = content.slice(0, content.indexOf(text)).split('\n');
  return `${before.length}:${(before[before.length - 1] as string).length + 1}`;
}

/**
 * One problem line: the field's path, then the channel package's message, which must contain
 * `text` (the message is printed as the channel package words it; only its substance is checked).
 */
function problemLine(at: string, path: string, text: string): RegExp {
  const esc = (x: string) => x.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`${esc(at)}: ${esc(path)}: [^\n]*${esc(text)}[^\n]*\n`);
}

async function report(path: string) {
  const io = memoryIo();
  const code = await runCli(['report', path], io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('bad channel files', () => {
  it('a missing required field', async () => {
    const path = edited('missing.yaml', '      gaugeFactor: 2.11\n', '');
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stdout).toBe('');
    const at = position(readFileSync(path, 'utf8'), 'sensor:\n      kind: strain-gauge\n      gaugeOhms');
    expect(r.stderr).toMatch(new RegExp(`^bridgework report: .+ has a problem:\n`));
    expect(r.stderr).toMatch(
      problemLine(`${path}:${at}`, 'channels.gusset-g2.sensor.gaugeFactor', 'is required'),
    );
    expect(r.stderr.split('\n')).toHaveLength(3);
  });

  it('a quantity in the wrong unit', async () => {
    const path = edited(
      'unit.yaml',
      'gaugeOhms: 350 Ω\n      gaugeFactorToleranceFraction: 0.5 %',
      'gaugeOhms: 350 m\n      gaugeFactorToleranceFraction: 0.5 %',
    );
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(
      problemLine(
        '',
        'channels.hanger-h3.sensor.gaugeOhms',
        "'350 m' is a length; expected a resistance, such as '350 Ω'",
      ),
    );
  });

  it('an unknown field (a typo), with the known name suggested', async () => {
    const path = edited('unknown.yaml', 'excitation: { volts: 1 V }', 'excitation: { volt: 1 V }');
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    const text = readFileSync(path, 'utf8');
    // The unknown field, and the required field it was meant to be: both reported.
    expect(r.stderr).toMatch(/has 2 problems:\n/);
    expect(r.stderr).toMatch(
      problemLine(`${path}:${position(text, 'volt: 1 V')}`, 'channels.deck-temp.excitation.volt', 'volts'),
    );
    expect(r.stderr).toMatch(
      problemLine(
        `${path}:${position(text, 'excitation: { volt: 1 V')}`,
        'channels.deck-temp.excitation.volts',
        'is required',
      ),
    );
  });

  it('an unknown top-level field and a name field inside a channel', async () => {
    const path = file(
      'layout.yaml',
      example.replace('project:', 'projects:').replace('  deck-temp:\n', '  deck-temp:\n    name: deck\n'),
    );
    const r = await report(path);
    expect(r.stderr).toMatch(/: projects: unknown field; did you mean 'project'\?\n/);
    expect(r.stderr).toMatch(
      /: channels\.deck-temp\.name: is not a field of a channel in a file: the channel's name is its key\n/,
    );
  });

  it('NaN and infinity (YAML .nan, .inf)', async () => {
    const path = file(
      'nan.yaml',
      example.replace('gaugeFactor: 2.09', 'gaugeFactor: .nan').replace('gain: 64', 'gain: .inf'),
    );
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(problemLine('', 'channels.hanger-h3.sensor.gaugeFactor', 'NaN'));
    expect(r.stderr).toMatch(problemLine('', 'channels.gusset-g2.amplifier.gain', 'Infinity'));
  });

  it('a negative resistance, with or without a unit', async () => {
    const path = file(
      'negative.yaml',
      example.replace('r0Ohms: 1000 Ω', 'r0Ohms: -1000 ohm').replace('gaugeOhms: 350 Ω', 'gaugeOhms: -350'),
    );
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(/has 2 problems:\n/);
    expect(r.stderr).toMatch(problemLine('', 'channels.hanger-h3.sensor.gaugeOhms', 'must be > 0; got -350'));
    expect(r.stderr).toMatch(problemLine('', 'channels.deck-temp.sensor.r0Ohms', 'must be > 0; got -1000'));
  });

  it('an expression is never evaluated', async () => {
    const path = edited('expression.yaml', 'volts: 5 V, remoteSense', "volts: '2*2.5 V', remoteSense");
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(problemLine('', 'channels.hanger-h3.excitation.volts', "'2*2.5 V'"));
    expect(r.stdout).toBe('');
  });

  it('malformed YAML, with the position of the error', async () => {
    const path = edited('malformed.yaml', 'excitation: { volts: 2.5 V }', 'excitation: { volts: 2.5 V');
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(
      new RegExp(
        `^bridgework report: ${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:\\d+:\\d+: malformed YAML: `,
      ),
    );
  });

  it('every problem of several channels at once', async () => {
    const path = file(
      'many.yaml',
      example
        .replace('gaugeFactor: 2.09', 'gaugeFactor: -2.09')
        .replace('bits: 24, referenceVolts: 2.5 V', 'bits: 24.5, referenceVolts: 2.5 V')
        .replace('toleranceClass: A', 'toleranceClass: D'),
    );
    const r = await report(path);
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines[0]).toBe(`bridgework report: ${path} has 3 problems:`);
    const problems = lines.slice(1).map((l) => l.replace(/^.*?: (channels\.)/, '$1'));
    expect(problems).toHaveLength(3);
    expect(problems[0]).toMatch(/^channels\.hanger-h3\.sensor\.gaugeFactor: .*-2\.09/);
    expect(problems[1]).toMatch(/^channels\.gusset-g2\.adc\.bits: .*integer.*24\.5/);
    expect(problems[2]).toMatch(/^channels\.deck-temp\.sensor\.toleranceClass: .*'D'/);
  });

  it('a span the converter cannot reach, found when the budget is made', async () => {
    const path = edited('span.yaml', 'range: [-300, 1200]', 'range: [-300, 90000]');
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    // The channel package names the field and the value as written (in µε).
    expect(r.stderr).toMatch(
      /^bridgework report: .+ has a problem:\n.+:\d+:\d+: channels\.gusset-g2(\.output\.range)?: .*90000 µε/,
    );
    expect(r.stdout).toBe('');
  });

  it('accepts a $schema text for editors, and rejects a $schema that is not a text', async () => {
    const ok = file('schema.yaml', `$schema: ../schema/channel-file.schema.json\n${example}`);
    expect((await report(ok)).code).toBe(exitCodes.ok);
    const bad = file('schema-bad.yaml', `$schema: 7\n${example}`);
    expect((await report(bad)).stderr).toMatch(/:1:1: \$schema: must be a text; got 7\n$/);
  });
});
