import { describe, expect, it } from 'vitest';
import type { OptionSpec, PositionalSpec } from '../src/args/optionTable.js';
import { parseCommandLine } from '../src/args/parseCommandLine.js';
import { convertCommand } from '../src/commands/convert/convertCommand.js';

// A table exercising every option type (names invented for the test).
const options = [
  { name: 'out', short: 'o', type: 'string', placeholder: 'file', description: 'Output.' },
  { name: 'force', short: 'f', type: 'boolean', description: 'Force.' },
  { name: 'quiet', short: 'q', type: 'boolean', description: 'Quiet.' },
  { name: 'gain', type: 'number', min: 0.5, max: 1000, default: 128, description: 'Gain.' },
  { name: 'offset-volts', type: 'number', description: 'Offset.' },
  { name: 'block', type: 'integer', min: 1, default: 64, description: 'Block.' },
  { name: 'format', type: 'choice', choices: ['c', 'json'], default: 'c', description: 'Format.' },
] as const satisfies readonly OptionSpec[];
const positionals = [
  { name: 'channel-file', required: true, description: 'The channel file.' },
  { name: 'extra-file', required: false, description: 'Another file.' },
] as const satisfies readonly PositionalSpec[];
const spec = { options, positionals };

function parse(...argv: string[]) {
  const r = parseCommandLine(spec, argv);
  if (r.help) throw new Error('unexpected help');
  return r;
}

describe('parseCommandLine: accepted forms', () => {
  it('applies defaults and camel-cases names', () => {
    const r = parse('hopper.yaml');
    expect(r.options).toEqual({
      out: undefined,
      force: false,
      quiet: false,
      gain: 128,
      offsetVolts: undefined,
      block: 64,
      format: 'c',
    });
    expect(r.positionals).toEqual({ channelFile: 'hopper.yaml', extraFile: undefined });
  });

  it('reads long, short, inline and grouped forms', () => {
    expect(parse('a', '--out', 'x.csv').options.out).toBe('x.csv');
    expect(parse('a', '--out=x.csv').options.out).toBe('x.csv');
    expect(parse('a', '-o', 'x.csv').options.out).toBe('x.csv');
    expect(parse('a', '-ox.csv').options.out).toBe('x.csv');
    const g = parse('a', '-fq');
    expect([g.options.force, g.options.quiet]).toEqual([true, true]);
  });

  it('reads numbers as finite decimals, including negative values after a space', () => {
    expect(parse('a', '--gain', '2.5e2').options.gain).toBe(250);
    expect(parse('a', '--offset-volts', '-0.125').options.offsetVolts).toBe(-0.125);
    expect(parse('a', '--offset-volts=-.5').options.offsetVolts).toBe(-0.5);
    expect(parse('a', '--block', '4096').options.block).toBe(4096);
  });

  it('takes `-` as a value (standard output) and anything after `--` as positional', () => {
    expect(parse('a', '-o', '-').options.out).toBe('-');
    expect(parse('--', '--odd-name.yaml').positionals.channelFile).toBe('--odd-name.yaml');
    expect(parse('a', '--out=--odd').options.out).toBe('--odd');
  });

  it('accepts options before, between and after positionals', () => {
    const r = parse('-f', 'a.yaml', '--format', 'json', 'b.csv');
    expect(r.positionals).toEqual({ channelFile: 'a.yaml', extraFile: 'b.csv' });
    expect(r.options.format).toBe('json');
  });

  it('returns help for -h or --help wherever it is, even beside other mistakes', () => {
    expect(parseCommandLine(spec, ['--help']).help).toBe(true);
    expect(parseCommandLine(spec, ['a', '--bogus', '-h']).help).toBe(true);
    expect(parseCommandLine(spec, ['-h']).help).toBe(true);
    expect(parseCommandLine(spec, ['a']).help).toBe(false);
  });
});

describe('parseCommandLine: one clear error per mistake', () => {
  const cases: [string[], string, string, RegExp][] = [
    [['a', '--bogus'], 'invalid-option', '--bogus', /^unknown option `--bogus`$/],
    [['a', '--forse'], 'invalid-option', '--forse', /did you mean `--force`\?/],
    [['a', '-x'], 'invalid-option', '-x', /^unknown option `-x`/],
    [['a', '--out'], 'missing-option', '--out', /^`--out` needs a value <file>$/],
    [['a', '--out', '--force'], 'missing-option', '--out', /looks like an option; write --out=--force/],
    [['a', '--force=yes'], 'invalid-option', '--force', /takes no value/],
    [['a', '-f', '-f'], 'invalid-option', '--force', /given more than once/],
    [['a', '--gain', 'abc'], 'wrong-type', '--gain', /must be a number; got 'abc'/],
    [['a', '--gain', '0x10'], 'wrong-type', '--gain', /must be a number/],
    [['a', '--gain', 'NaN'], 'wrong-type', '--gain', /must be a number/],
    [['a', '--gain', 'Infinity'], 'wrong-type', '--gain', /must be a number/],
    [['a', '--gain='], 'wrong-type', '--gain', /must be a number; got ''/],
    [['a', '--gain', '1e999'], 'not-finite', '--gain', /finite/],
    [['a', '--gain', '0.1'], 'out-of-range', '--gain', /must be in \[0\.5, 1000\]; got 0\.1/],
    [['a', '--block', '1.5'], 'not-integer', '--block', /must be an integer/],
    [['a', '--block', '0'], 'out-of-range', '--block', /must be >= 1/],
    [['a', '--block', '9007199254740993'], 'not-integer', '--block', /integer/],
    [['a', '--format', 'yaml'], 'invalid-option', '--format', /must be one of c, json; got 'yaml'/],
    [[], 'missing-option', '<channel-file>', /missing argument <channel-file>/],
    [['a', 'b', 'c'], 'invalid-option', 'c', /unexpected argument 'c'/],
  ];
  it.each(cases)('%j → %s (%s)', (argv, code, param, message) => {
    expect(() => parseCommandLine(spec, argv)).toThrowBridgeworkError(code as never, { param });
    expect(() => parseCommandLine(spec, argv)).toThrow(message);
  });
});

describe('parseCommandLine on a real table', () => {
  it('types and defaults the convert options', () => {
    const r = parseCommandLine(convertCommand, [
      'hook.yaml',
      'codes.bin',
      '--from',
      'int32le',
      '--digits',
      '9',
    ]);
    if (r.help) throw new Error('unexpected help');
    expect(r.options.from).toBe('int32le');
    expect(r.options.digits).toBe(9);
    expect(r.options.block).toBe(65_536);
    expect(r.options.failOnClip).toBe(false);
    expect(r.positionals.codesFile).toBe('codes.bin');
  });
});
