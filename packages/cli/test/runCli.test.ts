import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { formatCommandHelp, formatProgramHelp } from '../src/args/formatHelp.js';
import { commands } from '../src/commands/registry.js';
import { convertCommand } from '../src/commands/convert/convertCommand.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { memoryIo } from './support/memoryIo.js';

const packageDir = fileURLToPath(new URL('..', import.meta.url));
const pkg = JSON.parse(readFileSync(`${packageDir}package.json`, 'utf8')) as {
  version: string;
  bin: Record<string, string>;
};

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('runCli: help, version, unknown commands', () => {
  it.each([['--help'], ['-h'], ['help']])('%s prints the program help on stdout, exit 0', async (arg) => {
    const r = await run(arg);
    expect(r).toEqual({ code: 0, stdout: formatProgramHelp(commands), stderr: '' });
  });

  it('prints a command’s help three ways, exit 0', async () => {
    const expected = formatCommandHelp(convertCommand);
    for (const argv of [
      ['convert', '--help'],
      ['convert', '-h'],
      ['help', 'convert'],
    ]) {
      expect(await run(...argv)).toEqual({ code: 0, stdout: expected, stderr: '' });
    }
  });

  it('prints the package version', async () => {
    expect(await run('--version')).toEqual({ code: 0, stdout: `${pkg.version}\n`, stderr: '' });
    expect((await run('-V')).stdout).toBe(`${pkg.version}\n`);
  });

  it('needs a command: usage on stderr, exit 1', async () => {
    const r = await run();
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^bridgework: a command is required\n/);
  });

  it('rejects an unknown command with a suggestion, exit 1', async () => {
    const r = await run('reprot', 'hopper.yaml');
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(
      "bridgework: unknown command 'reprot'; did you mean 'report'?\nRun 'bridgework --help' for the list of commands.\n",
    );
    expect((await run('--bogus')).stderr).toMatch(/^bridgework: unknown option '--bogus'/);
    expect((await run('help', 'convrt')).stderr).toBe(
      "bridgework help: unknown command 'convrt'; did you mean 'convert'?\n",
    );
  });

  it('reports a usage error in one line plus a pointer to the help, exit 1', async () => {
    const r = await run('convert', 'hook.yaml', 'codes.bin', '--block', 'many');
    expect(r).toEqual({
      code: 1,
      stdout: '',
      stderr:
        "bridgework convert: `--block` must be an integer; got 'many'\nRun 'bridgework convert --help' for its options.\n",
    });
  });
});

describe('runCli: a channel file that cannot be read', () => {
  const invocations: [string, string[]][] = [
    ['report', ['report', 'no-such-file.yaml', '--html', 'never-written.html']],
    ['constants', ['constants', 'no-such-file.yaml', '--format', 'json']],
    ['convert', ['convert', 'no-such-file.yaml', 'codes.bin']],
    ['uncertainty', ['uncertainty', 'no-such-file.yaml', '--trials', '2000']],
  ];
  it.each(invocations)('%s says so in one line, exit 1, and prints no result', async (name, argv) => {
    const r = await run(...argv);
    expect(r).toEqual({
      code: exitCodes.badInput,
      stdout: '',
      stderr: `bridgework ${name}: cannot read no-such-file.yaml: no such file\n`,
    });
  });

  it('validates the arguments first (usage errors win)', async () => {
    const r = await run('uncertainty', 'no-such-file.yaml', '--coverage', '2');
    expect(r.stderr).toMatch(/`--coverage` must be in \[0\.5, 0\.9999\]; got 2/);
  });
});

describe('the executable', () => {
  const bin = `${packageDir}src/bin.ts`;
  it('is declared as the bundle of dist/bin.js, with a node shebang (see bundledBin.test.ts)', () => {
    expect(pkg.bin).toEqual({ bridgework: 'dist/bundle/bridgework.js' });
    expect(readFileSync(bin, 'utf8').split('\n')[0]).toBe('#!/usr/bin/env node');
  });

  it('sets the process exit code (0 for help, 1 for a usage error)', () => {
    const node = [process.execPath, '--import', 'tsx', '--conditions=@bridgework/source', bin] as const;
    const help = execFileSync(node[0], [...node.slice(1), '--help'], {
      encoding: 'utf8',
      env: { ...process.env, NO_COLOR: '1' },
    });
    expect(help).toBe(formatProgramHelp(commands));
    const bad = spawnSync(node[0], [...node.slice(1), 'report'], { encoding: 'utf8' });
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/^bridgework report: missing argument <channel-file>/);
  });
});
