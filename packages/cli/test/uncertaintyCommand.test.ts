/**
 * `bridgework uncertainty`: the channel package's Monte Carlo of the budget, shown. Checked
 * against `channelBudget(channel, { monteCarlo })` called here (bit for bit: the command adds no
 * sampling of its own), against the GUM result, and against the 95 % interval of a rectangular
 * distribution of half-width a, which is ±0.95a (derived: a rectangle spreads its probability
 * evenly over 2a).
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { channelBudget, createChannel } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { examplePath, exampleShown, footbridgeSpecs, repoRoot } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { outPath } = useTestFiles('uncertainty');

async function run(argv: string[], options: { stderrTTY?: boolean } = {}) {
  const io = memoryIo(options);
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('bridgework uncertainty', () => {
  const argv = ['uncertainty', exampleShown, '--channel', 'deck-temp', '--trials', '12000', '--seed', '5'];

  it('prints JSON equal to the channel package’s run, and the same for the same seed', async () => {
    const r = await run([...argv, '--json']);
    expect(r.code).toBe(exitCodes.ok);
    const json = JSON.parse(r.stdout) as {
      caution: string;
      channels: {
        name: string;
        trials: number;
        seed: number;
        monteCarlo: { value: number; standardUncertainty: number; interval: { min: number; max: number } };
        gum: { standardUncertainty: number; coverageFactor: number };
        gumValidation: { validated: boolean };
      }[];
    };
    const budget = channelBudget(createChannel(footbridgeSpecs['deck-temp']), {
      monteCarlo: { trials: 12_000, seed: 5 },
    });
    const ours = budget.monteCarlo!;
    const c = json.channels[0]!;
    expect(c.name).toBe('deck-temp');
    expect(c.trials).toBe(12_000);
    expect(c.seed).toBe(5);
    expect(c.monteCarlo.value).toBe(ours.value);
    expect(c.monteCarlo.standardUncertainty).toBe(ours.standardUncertainty);
    expect(c.monteCarlo.interval).toEqual(ours.interval);
    expect(c.gum.standardUncertainty).toBe(budget.combined.standardUncertainty);
    expect(json.caution).toMatch(/do not replace, qualified engineering judgement/);
    expect((await run([...argv, '--json'])).stdout).toBe(r.stdout);
    expect((await run([...argv.slice(0, -1), '6', '--json'])).stdout).not.toBe(r.stdout);
  });

  it('prints a table of the Monte Carlo and GUM results with the clause 8 verdict', async () => {
    const r = await run(argv);
    expect(r.stdout).toMatch(
      /^Monte Carlo uncertainty \(JCGM 101\): packages\/cli\/demo\/footbridge-monitoring\.yaml$/m,
    );
    expect(r.stdout).toMatch(
      /12000 trials per channel; seed 5: the same seed and trials give the same result/,
    );
    expect(r.stdout).toMatch(/^deck-temp: temperature at 60 °C$/m);
    expect(r.stdout).toMatch(
      /^ {2}Monte Carlo \(JCGM 101\), symmetric +(59\.9|60\.0)\d{2} +0\.\d+ +59\.\d{3} +60\.\d{3}$/m,
    );
    expect(r.stdout).toMatch(/^ {2}GUM \(JCGM 100\), k = 1\.96 +60\.000 +0\.157 +59\.692 +60\.308$/m);
    expect(r.stdout).toMatch(/JCGM 101 clause 8: .+ the GUM interval is (not )?validated/s);
    expect(r.stdout).toMatch(/do not replace, qualified engineering judgement/);
  });

  it('gives the interval of a rectangular distribution when one rectangular tolerance dominates', async () => {
    // The hanger's budget is 99.8 % gauge factor (rectangular, a = |c|·half-width = 600 N at 120 kN).
    const r = await run([
      'uncertainty',
      exampleShown,
      '--channel',
      'hanger-h3',
      '--trials',
      '40000',
      '--seed',
      '3',
      '--json',
    ]);
    expect(r.code).toBe(exitCodes.ok);
    const c = (
      JSON.parse(r.stdout) as {
        channels: {
          monteCarlo: { standardUncertainty: number; interval: { min: number; max: number } };
          gum: { standardUncertainty: number };
          gumValidation: { validated: boolean; dLow: number };
        }[];
      }
    ).channels[0]!;
    const gf = channelBudget(createChannel(footbridgeSpecs['hanger-h3'])).lines.find(
      (l) => l.name === 'gauge factor',
    )!;
    const a = Math.abs(gf.value);
    // ±0.95a holds 95 % of a rectangle. Sampling error of the 2.5 % and 97.5 % quantiles at
    // 40 000 trials: √(p(1 − p)/M)·2a ≈ 0.0016a; the small gain and noise terms widen it slightly.
    expect((c.monteCarlo.interval.max - c.monteCarlo.interval.min) / 2).toBeNear(0.95 * a, { rel: 0.01 });
    // u(y) of the sample against the GUM's root-sum-square: relative standard error of a standard
    // deviation of a near-rectangular sample ≈ √(0.8/(4M)) ≈ 0.2 %; allow 1 %.
    expect(c.monteCarlo.standardUncertainty).toBeNear(c.gum.standardUncertainty, { rel: 0.01 });
    // The GUM's ±1.96u is wider than the rectangle's ±1.645u: JCGM 101 clause 8 does not validate it.
    expect(c.gumValidation.validated).toBe(false);
    expect(c.gumValidation.dLow).toBeNear((1.96 - 0.95 * Math.sqrt(3)) * c.gum.standardUncertainty, {
      rel: 0.05,
    });
  });

  it('refuses a trial count outside [1000, 50 000 000]', async () => {
    for (const trials of ['999', '50000001']) {
      const r = await run(['uncertainty', exampleShown, '--trials', trials]);
      expect(r.code).toBe(exitCodes.badInput);
      expect(r.stderr).toMatch(/--trials/);
    }
  });

  it('uses --coverage for both methods', async () => {
    const r = await run([...argv, '--coverage', '0.9', '--json']);
    const c = (JSON.parse(r.stdout) as { channels: { coverage: number; gum: { coverageFactor: number } }[] })
      .channels[0]!;
    expect(c.coverage).toBe(0.9);
    // ν_eff = ∞ here (rectangular and exact inputs): k is the normal quantile, 1.6448536… (from memory).
    expect(c.gum.coverageFactor).toBeNear(1.6448536269514722, { rel: 1e-12 });
  });

  it('draws a progress bar per channel only on a terminal, from the budget’s onProgress', async () => {
    // The uncertainty package reports after every block of 16 384 trials: 40.96 % and 81.92 % of 40 000.
    const tty = await run([...argv.slice(0, 5), '40000'], { stderrTTY: true });
    expect(tty.stderr).toMatch(/\rdeck-temp \[[█░]+\] +40\.9 %/);
    expect(tty.stderr).toMatch(/\rdeck-temp \[[█░]+\] +81\.9 %/);
    expect(tty.stderr).toMatch(/\rdeck-temp \[█+\] 100\.0 %/);
    expect((await run(argv)).stderr).toBe('');
  });

  it('writes to a file, never over an existing one without --force', async () => {
    const out = outPath('mc.txt');
    expect((await run([...argv, '-o', out])).stderr).toBe(`wrote the Monte Carlo results to ${out}\n`);
    expect(readFileSync(out, 'utf8')).toMatch(/^Monte Carlo uncertainty/);
    expect((await run([...argv, '-o', out])).code).toBe(exitCodes.badInput);
  });
});

describe('bridgework uncertainty: Ctrl-C during a long run', () => {
  it(
    'stops within one block, leaves no file behind and ends by SIGINT (the built command)',
    { timeout: 120_000 },
    async () => {
      // The trials run in a worker thread, so the command's own thread hears the signal at once
      // and sets the run's abort signal; 2·10⁷ trials of three channels would take many seconds.
      const dir = mkdtempSync(join(tmpdir(), 'bridgework-sigint-'));
      const out = join(dir, 'mc.txt');
      const child = spawn(
        process.execPath,
        [
          join(repoRoot, 'packages/cli/dist/bin.js'),
          'uncertainty',
          examplePath,
          '--trials',
          '20000000',
          '-o',
          out,
        ],
        { stdio: ['ignore', 'ignore', 'pipe'], env: { ...process.env, NO_COLOR: '1' } },
      );
      let stderr = '';
      child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
      const ended = new Promise<{ code: number | null; signal: NodeJS.Signals | null; at: number }>(
        (resolve) => child.on('exit', (code, signal) => resolve({ code, signal, at: Date.now() })),
      );
      // Busy: the output's temporary file exists once the command has read the file and started.
      const start = Date.now();
      while (!readdirSync(dir).some((f) => f.endsWith('.tmp')) && Date.now() - start < 60_000)
        await new Promise((r) => setTimeout(r, 50));
      await new Promise((r) => setTimeout(r, 500));
      const sent = Date.now();
      child.kill('SIGINT');
      const { code, signal, at } = await ended;
      try {
        expect({ code, signal }, stderr).toSatisfy(
          (e: { code: number | null; signal: string | null }) => e.signal === 'SIGINT' || e.code === 130,
        );
        expect(at - sent, 'ended soon after the signal (a whole run takes far longer)').toBeLessThan(5_000);
        expect(readdirSync(dir)).toEqual([]); // neither the output nor its temporary file
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
