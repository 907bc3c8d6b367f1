/**
 * The package's executable is the bundle of dist/bin.js (packages/cli/scripts/bundle.mjs, run by
 * `pnpm build` and before every pack): the same program in a few files instead of some three
 * hundred modules, for start-up. These tests hold it to that: it is built from the current dist/,
 * and it prints, writes and exits exactly as dist/bin.js does, for every kind of work (output
 * formats, a YAML and a JSON channel file, a report, the demo with the files shipped in the
 * package, Monte Carlo in a worker thread, a refused input).
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { useTempDir } from './support/tempDir.js';

const cli = fileURLToPath(new URL('../', import.meta.url));
const manifest = JSON.parse(readFileSync(join(cli, 'package.json'), 'utf8')) as {
  bin: Record<string, string>;
};
const bundled = join(cli, manifest.bin['bridgework'] as string);
const unbundled = join(cli, 'dist/bin.js');
const tmp = useTempDir('bundled-bin');

/** Runs `bin` with `args` in its own folder (a copy of `files`); what it printed and wrote. */
function run(
  bin: string,
  folder: string,
  args: readonly string[],
  files: Record<string, string | Uint8Array>,
) {
  mkdirSync(folder, { recursive: true });
  for (const [name, data] of Object.entries(files)) writeFileSync(join(folder, name), data);
  const r = spawnSync(process.execPath, [bin, ...args], {
    cwd: folder,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', SOURCE_DATE_EPOCH: '1764892800', BRIDGEWORK_STOP_WITH_PARENT: '' },
    timeout: 120_000,
  });
  const written: Record<string, string> = {};
  const walk = (dir: string, prefix: string): void => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      if (e.isDirectory()) walk(join(dir, e.name), `${prefix}${e.name}/`);
      else if (!(prefix === '' && e.name in files))
        written[`${prefix}${e.name}`] = createHash('sha256')
          .update(readFileSync(join(dir, e.name)))
          .digest('hex');
    }
  };
  walk(folder, '');
  return { status: r.status, stdout: r.stdout, stderr: r.stderr, written };
}

// Two quarter-bridge strain channels and one frame of codes.
const spec = (gaugeFactor: number) => ({
  sensor: { kind: 'strain-gauge', gaugeFactor, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain', unit: 'µε' },
});
const rigJson = JSON.stringify({ channels: { sg1: spec(2.0), sg2: spec(2.1) } }, null, 2);
const rigYaml = `channels:\n  sg1: ${JSON.stringify(spec(2.0))}\n  sg2: ${JSON.stringify(spec(2.1))}\n`;
const frames = new Uint8Array(new Int32Array([120_000, -340_000, 8_388_607, 5, -8_388_608, 77]).buffer);
const oneJson = JSON.stringify({ channels: { sg1: spec(2.0) } });
const files = { 'rig.json': rigJson, 'rig.yaml': rigYaml, 'one.json': oneJson, 'codes.bin': frames };

describe('the bundled executable', () => {
  it('is the package’s bin, an executable script built from the current dist/', () => {
    expect(manifest.bin['bridgework']).toBe('dist/bundle/bridgework.js');
    expect(readFileSync(bundled, 'utf8').split('\n')[0]).toBe('#!/usr/bin/env node');
    const { inputs } = JSON.parse(readFileSync(join(cli, 'dist/bundle/inputs.json'), 'utf8')) as {
      inputs: Record<string, string>;
    };
    expect(Object.keys(inputs)).toContain('dist/bin.js');
    expect(Object.keys(inputs)).toContain('dist/commands/convert/runConvert.js');
    const stale = Object.entries(inputs).filter(
      ([f, hash]) =>
        createHash('sha256')
          .update(readFileSync(join(cli, f)))
          .digest('hex') !== hash,
    );
    expect(
      stale.map(([f]) => f),
      'dist/bundle is older than dist/: run pnpm build',
    ).toEqual([]);
  });

  it('holds every worker thread’s module beside the modules that start it', () => {
    // Workers are started as new Worker(new URL('./name.js', import.meta.url)).
    const workers = new Set<string>();
    const visit = (folder: string): void => {
      for (const e of readdirSync(folder, { withFileTypes: true })) {
        if (e.isDirectory()) visit(join(folder, e.name));
        else if (e.name.endsWith('.ts'))
          for (const m of readFileSync(join(folder, e.name), 'utf8').matchAll(
            /new Worker\(new URL\('\.\/([\w-]+)\.js'/g,
          ))
            workers.add(m[1] as string);
      }
    };
    visit(join(cli, 'src'));
    expect([...workers].sort()).toEqual(expect.arrayContaining(['conversionWorker', 'monteCarloWorker']));
    for (const w of workers) expect(existsSync(join(cli, 'dist/bundle', `${w}.js`)), w).toBe(true);
  });

  it.each([
    ['--version', ['--version']],
    ['--help', ['--help']],
    ['convert --help', ['convert', '--help']],
    ['convert to float32', ['convert', 'rig.json', 'codes.bin', '--to', 'float32le', '-o', 'out.f32']],
    ['convert to CSV (YAML file)', ['convert', 'rig.yaml', 'codes.bin', '-o', 'out.csv']],
    ['convert to Arrow', ['convert', 'rig.json', 'codes.bin', '-o', 'out.arrow']],
    ['convert to Parquet', ['convert', 'rig.json', 'codes.bin', '-o', 'out.parquet']],
    [
      'convert in worker threads',
      ['convert', 'rig.json', 'codes.bin', '--convert-threads', '2', '-o', 'threads.csv'],
    ],
    ['report', ['report', 'rig.yaml']],
    ['constants', ['constants', 'one.json', '--format', 'c', '--verification', 'sampled', '-o', 'rig.h']],
    ['uncertainty (a worker thread)', ['uncertainty', 'rig.json', '--trials', '20000']],
    ['demo (files shipped in the package)', ['demo', '--dir', 'demo-out']],
    ['a refused input', ['convert', 'rig.json', 'codes.bin', '--to', 'float16le', '-o', 'x']],
  ] as const)(
    '%s: the same output, files and exit code as dist/bin.js',
    (name, args) => {
      const folder = name.replace(/\W+/g, '-');
      const a = run(bundled, join(tmp(), 'bundled', folder), args, files);
      const b = run(unbundled, join(tmp(), 'unbundled', folder), args, files);
      const same = (s: string) =>
        s.replaceAll(join(tmp(), 'bundled'), '<tmp>').replaceAll(join(tmp(), 'unbundled'), '<tmp>');
      expect({ ...a, stdout: same(a.stdout), stderr: same(a.stderr) }).toEqual({
        ...b,
        stdout: same(b.stdout),
        stderr: same(b.stderr),
      });
      expect(a.status, a.stderr).toBe(name === 'a refused input' ? 1 : 0);
    },
    120_000,
  );
});
