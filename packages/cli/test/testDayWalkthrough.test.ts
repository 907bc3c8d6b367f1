/**
 * The walk-through of docs/test-day.md ("The day, step by step"), run as written: every
 * `bridgework` line of its shell block, in order, on a copy of examples/test-day, each must exit
 * with 0; then the channel file carries what the day learned (span correction, calibration,
 * certificate characteristics, thermistor model) and `report` shows the span correction and
 * the calibration fit as budget lines.
 */
import { copyFileSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const guide = fileURLToPath(new URL('../../../docs/test-day.md', import.meta.url));
const tmp = useTempDir('walkthrough');
const env = { SOURCE_DATE_EPOCH: '1796342400', NO_COLOR: '1' };

/** The commands of the guide's first shell block: continuation lines joined, comments dropped. */
function guideCommands(): string[][] {
  const text = readFileSync(guide, 'utf8');
  const block = /## The day, step by step\n+```sh\n([\s\S]*?)```/.exec(text)?.[1];
  if (block === undefined) throw new Error('docs/test-day.md has no "The day, step by step" shell block');
  const lines = block.replace(/\\\n\s*/g, ' ').split('\n');
  return lines
    .map((l) => l.replace(/\s+#.*$/, '').trim())
    .filter((l) => l.startsWith('bridgework '))
    .map((l) => {
      // Words, with single-quoted words taken whole (the guide quotes only with single quotes).
      const words = [...l.matchAll(/'([^']*)'|(\S+)/g)].map((m) => m[1] ?? m[2]!);
      return words.slice(1);
    });
}

describe('the test day of docs/test-day.md, as written', () => {
  it('runs every command of the walk-through on the example files, each exiting with 0', async () => {
    const dir = tmp();
    for (const f of readdirSync(exampleDir))
      if (/\.(yaml|csv)$/.test(f)) copyFileSync(join(exampleDir, f), join(dir, f));
    const commands = guideCommands();
    expect(commands.length).toBeGreaterThanOrEqual(9);
    const local = (word: string) =>
      word.replace(
        /^(--[a-z-]+=)?([\w.-]+\.(?:yaml|csv|html))$/,
        (_, opt: string | undefined, file: string) => `${opt ?? ''}${join(dir, file)}`,
      );
    for (const argv of commands) {
      const io = memoryIo({ env });
      const code = await runCli(argv.map(local), io);
      expect({ command: argv.join(' '), code, stderr: code === 0 ? '' : io.stderr.text() }).toEqual({
        command: argv.join(' '),
        code: exitCodes.ok,
        stderr: '',
      });
    }
    const loaded = await loadChannels(join(dir, 'slipway-winch.yaml'));
    const spec = (name: string) => loaded.channels.find((c) => c.name === name)!.channel.spec;
    expect(spec('tie').spanCorrection?.factorStandardUncertainty).toBeGreaterThan(0);
    expect(spec('rope').calibration?.covariance).toHaveLength(9);
    expect((spec('rope').sensor as { certificateCelsius?: number }).certificateCelsius).toBe(20);
    expect((spec('tie-temperature').sensor as { steinhartHart?: unknown }).steinhartHart).toBeDefined();

    // What the day learned enters the budget: the span correction (shunt tolerance and readings'
    // scatter) and the calibration fit (the coefficients' covariance).
    const io = memoryIo({ env });
    expect(await runCli(['report', join(dir, 'slipway-winch.yaml'), '--json'], io)).toBe(exitCodes.ok);
    const budgets = JSON.parse(io.stdout.text()).channels as {
      name: string;
      lines: { name: string; standardUncertainty: number | null }[];
    }[];
    const line = (channel: string, name: string) =>
      budgets.find((b) => b.name === channel)?.lines.find((l) => l.name === name);
    expect(line('tie', 'span correction')?.standardUncertainty).toBeGreaterThan(0);
    expect(line('tie', 'gain')).toBeUndefined();
    expect(line('rope', 'calibration fit')?.standardUncertainty).toBeGreaterThan(0);
  });
});
