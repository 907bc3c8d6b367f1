/**
 * `bridgework convert` at the edges of files and pipes (issue 15, items 15–17): a closed pipe ends
 * the command quietly; an output that is the input is refused whatever path names it; file errors
 * name the path and the reason in words.
 */
import { spawnSync } from 'node:child_process';
import { linkSync, lstatSync, readFileSync, statSync, symlinkSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, repoRoot } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { tmp, file } = useTestFiles('edges');

async function run(argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('a closed pipe (issue 15 item 15)', () => {
  it('`convert … | head -2` prints two lines and exits 0, with nothing on standard error', () => {
    const input = file(
      'long.csv',
      `code\n${Array.from({ length: 200_000 }, (_, i) => i % 1000).join('\n')}\n`,
    );
    const bin = join(repoRoot, 'packages/cli/src/bin.ts');
    const script = `node --import tsx --conditions=@bridgework/source '${bin}' convert ${exampleShown} '${input}' --channels deck-temp | head -2; echo "exit \${PIPESTATUS[0]}" >&2`;
    const r = spawnSync('bash', ['-c', script], { cwd: repoRoot, encoding: 'utf8' });
    expect(r.stdout.split('\n')).toHaveLength(3); // two lines and the final newline
    expect(r.stdout.startsWith('deck-temp (°C)\n')).toBe(true);
    expect(r.stderr).toBe('exit 0\n'); // no stack trace, no EPIPE message
  });
});

describe('an output that is the input (issue 15 item 16)', () => {
  it('is refused, by the same file on disk whatever names it, and the recording is intact', async () => {
    const bytes = int32le([1, 2, 3, 4, 5, 6]);
    const input = file('rec.bin', bytes);
    const hard = join(tmp(), 'hard-link.csv');
    const soft = join(tmp(), 'soft-link.csv');
    linkSync(input, hard);
    symlinkSync(input, soft);
    for (const out of [input, hard, soft]) {
      const r = await run(['convert', exampleShown, input, '-o', out, '--force']);
      expect(r.code).toBe(exitCodes.badInput);
      expect(r.stderr).toBe(
        `bridgework convert: the output ${out} is the input ${input} (the same file); writing it would destroy the input, so choose another output file\n`,
      );
      expect(readFileSync(input)).toEqual(Buffer.from(bytes));
    }
    const channelCopy = file('ch.yaml', readFileSync(join(repoRoot, exampleShown)));
    const r = await run(['convert', channelCopy, input, '-o', channelCopy, '--force']);
    expect(r.stderr).toMatch(/the output .*ch\.yaml is the input .*ch\.yaml \(the same file\)/);
  });

  it('-o /dev/null (through a link) converts into the device and leaves it a device', async () => {
    const sink = join(tmp(), 'sink');
    symlinkSync('/dev/null', sink); // were the device replaced by a file, only this link would be
    const input = file('rec.bin', int32le([1, 2, 3, 4, 5, 6]));
    for (const extra of [[], ['--force']]) {
      const r = await run(['convert', exampleShown, input, '-o', sink, ...extra]);
      expect(r.stderr).toMatch(/wrote 2 rows/);
      expect(r.code).toBe(exitCodes.ok);
    }
    expect(statSync('/dev/null').isCharacterDevice()).toBe(true);
    expect(lstatSync(sink).isSymbolicLink()).toBe(true);
  });
});

describe('file errors in words (issue 15 item 17)', () => {
  const input = (): string => file('rec.bin', int32le([1, 2, 3]));

  it('an output under /proc says the folder does not allow new files', async () => {
    const r = await run(['convert', exampleShown, input(), '-o', '/proc/bridgework-out.csv']);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toBe(
      'bridgework convert: cannot write /proc/bridgework-out.csv: the folder /proc does not allow new files (a kernel or virtual file system?)\n',
    );
  });

  it('a file used as a folder says so, for output and input', async () => {
    const plain = file('plain.txt', 'x');
    const out = await run(['convert', exampleShown, input(), '-o', join(plain, 'out.csv')]);
    expect(out.stderr).toBe(
      `bridgework convert: cannot write ${join(plain, 'out.csv')}: a part of the path is a file, not a folder\n`,
    );
    const inp = await run(['convert', exampleShown, join(plain, 'rec.bin')]);
    expect(inp.stderr).toBe(
      `bridgework convert: cannot read ${join(plain, 'rec.bin')}: a part of the path is a file, not a folder\n`,
    );
  });

  it('a missing output folder names it', async () => {
    const out = join(tmp(), 'no-such-folder', 'out.csv');
    const r = await run(['convert', exampleShown, input(), '-o', out]);
    expect(r.stderr).toBe(
      `bridgework convert: cannot write ${out}: the folder ${join(tmp(), 'no-such-folder')} does not exist\n`,
    );
  });
});
