import { execFileSync } from 'node:child_process';
import {
  createReadStream,
  existsSync,
  lstatSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  readlinkSync,
  statSync,
  symlinkSync,
  writeFileSync,
} from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { openAtomicFile, writeFileAtomic } from '../src/files/atomicFile.js';
import { pendingTempFiles } from '../src/internal/pendingTempFiles.js';
import { caught } from './support/caught.js';
import { exited, spawnTs, waitForLine } from './support/spawnChild.js';
import { useTempDir } from './support/tempDir.js';

const tmp = useTempDir('atomic');
let n = 0;
const fresh = (): string => {
  const dir = join(tmp(), `case-${++n}`);
  mkdirSync(dir);
  return dir;
};

describe('writeFileAtomic', () => {
  it('writes a new file and leaves no temporary file behind', async () => {
    const dir = fresh();
    await writeFileAtomic(join(dir, 'hopper.h'), '#define X 1\n');
    expect(readFileSync(join(dir, 'hopper.h'), 'utf8')).toBe('#define X 1\n');
    expect(readdirSync(dir)).toEqual(['hopper.h']);
  });

  it('never replaces an existing file without force, and says how', async () => {
    const dir = fresh();
    const path = join(dir, 'report.html');
    writeFileSync(path, 'previous report');
    expect(await caught(writeFileAtomic(path, 'new'))).toThrowBridgeworkError('file-exists', { param: path });
    await expect(writeFileAtomic(path, 'new')).rejects.toThrow(/exists already; pass --force to replace it/);
    expect(readFileSync(path, 'utf8')).toBe('previous report');
    expect(readdirSync(dir)).toEqual(['report.html']);
  });

  it('replaces an existing file with force', async () => {
    const dir = fresh();
    const path = join(dir, 'out.json');
    writeFileSync(path, 'old');
    await writeFileAtomic(path, 'new', { force: true });
    expect(readFileSync(path, 'utf8')).toBe('new');
    expect(readdirSync(dir)).toEqual(['out.json']);
  });

  it('rejects a missing folder and a folder as target with io-error', async () => {
    const dir = fresh();
    expect(await caught(writeFileAtomic(join(dir, 'no-such-folder', 'x.csv'), 'x'))).toThrowBridgeworkError(
      'io-error',
    );
    await expect(writeFileAtomic(join(dir, 'no-such-folder', 'x.csv'), 'x')).rejects.toThrow(
      /the folder .*no-such-folder does not exist/,
    );
    await expect(writeFileAtomic(dir, 'x', { force: true })).rejects.toThrow(/it is a folder/);
  });

  it('writes through a character device (/dev/null, reached by a link) and never replaces it', async () => {
    // Through a link in the test folder: were the device replaced, only the link would be.
    const dir = fresh();
    const link = join(dir, 'sink');
    symlinkSync('/dev/null', link);
    await writeFileAtomic(link, 'discarded'); // no force needed: nothing is replaced
    await writeFileAtomic(link, 'discarded', { force: true });
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(readlinkSync(link)).toBe('/dev/null');
    expect(statSync('/dev/null').isCharacterDevice()).toBe(true);
    expect(readdirSync(dir)).toEqual(['sink']); // nothing temporary left
  });

  it('writes into a named pipe its reader reads, and leaves the pipe a pipe', async () => {
    const dir = fresh();
    const fifo = join(dir, 'to-reader');
    execFileSync('mkfifo', [fifo]);
    const chunks: Buffer[] = [];
    const read = new Promise<void>((done, fail) => {
      createReadStream(fifo)
        .on('data', (c) => chunks.push(c as Buffer))
        .on('end', done)
        .on('error', fail);
    });
    await writeFileAtomic(fifo, 'strain\n1.5\n', { force: true });
    await read;
    expect(Buffer.concat(chunks).toString('utf8')).toBe('strain\n1.5\n');
    expect(statSync(fifo).isFIFO()).toBe(true);
    expect(readdirSync(dir)).toEqual(['to-reader']);
  }, 15_000);

  it('follows a symbolic link with force: the file it names is replaced, the link stays', async () => {
    const dir = fresh();
    const real = join(dir, 'real.csv');
    const link = join(dir, 'latest.csv');
    writeFileSync(real, 'old');
    symlinkSync('real.csv', link);
    expect(await caught(writeFileAtomic(link, 'new'))).toThrowBridgeworkError('file-exists');
    await writeFileAtomic(link, 'new', { force: true });
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(readFileSync(real, 'utf8')).toBe('new');
    expect(readdirSync(dir).sort()).toEqual(['latest.csv', 'real.csv']);
  });

  const blockDevice = readdirSync('/dev')
    .map((name) => join('/dev', name))
    .find((path) => {
      try {
        return statSync(path).isBlockDevice();
      } catch {
        return false;
      }
    });
  it.skipIf(blockDevice === undefined)(
    'refuses a block device (a disk), before anything is written',
    async () => {
      let error: unknown;
      try {
        const opened = await openAtomicFile(blockDevice as string, { force: true });
        await opened.abort(); // never committed: the device is untouched even if this opened
      } catch (e) {
        error = e;
      }
      expect(() => {
        throw error;
      }).toThrowBridgeworkError('io-error');
      expect(String(error)).toMatch(/is a block device \(a disk or partition\).*write to a file/);
    },
  );

  it('a large output (flushes started in the background every 32 MiB) arrives whole and in order', async () => {
    const dir = fresh();
    const path = join(dir, 'big.bin');
    const file = await openAtomicFile(path);
    const chunk = new Uint8Array(1 << 20);
    for (let k = 0; k < 80; k++) {
      chunk.fill(k);
      await file.write(chunk);
    }
    await file.commit();
    const back = readFileSync(path);
    expect(back.length).toBe(80 << 20);
    for (let k = 0; k < 80; k++) {
      const part = back.subarray(k << 20, (k + 1) << 20);
      expect(part[0] === k && part[part.length - 1] === k && part.every((b) => b === k), `MiB ${k}`).toBe(
        true,
      );
    }
    expect(readdirSync(dir)).toEqual(['big.bin']);
  });

  it('writes bytes as they are', async () => {
    const dir = fresh();
    await writeFileAtomic(join(dir, 'codes.bin'), Uint8Array.of(0, 255, 1, 128));
    expect([...readFileSync(join(dir, 'codes.bin'))]).toEqual([0, 255, 1, 128]);
  });
});

describe('openAtomicFile', () => {
  it('shows nothing at the output path until commit', async () => {
    const dir = fresh();
    const path = join(dir, 'strain.csv');
    const file = await openAtomicFile(path);
    await file.write('strain\n');
    await file.write('0.001\n');
    expect(existsSync(path)).toBe(false);
    expect(file.tempPath.startsWith(join(dir, '.strain.csv.'))).toBe(true);
    expect(existsSync(file.tempPath)).toBe(true);
    await file.commit();
    expect(readFileSync(path, 'utf8')).toBe('strain\n0.001\n');
    expect(existsSync(file.tempPath)).toBe(false);
    await file.abort(); // harmless after commit
    expect(existsSync(path)).toBe(true);
  });

  it('abort removes the temporary file and leaves the target alone', async () => {
    const dir = fresh();
    const path = join(dir, 'strain.csv');
    const file = await openAtomicFile(path);
    await file.write('partial');
    await file.abort();
    await file.abort();
    expect(readdirSync(dir)).toEqual([]);
    await expect(file.write('more')).rejects.toThrow(/after aborted/);
  });

  it('fails at open (before any work) when the target exists', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'a.csv'), 'keep');
    expect(await caught(openAtomicFile(join(dir, 'a.csv')))).toThrowBridgeworkError('file-exists');
    expect(readdirSync(dir)).toEqual(['a.csv']);
  });

  it('does not replace a file that appeared while writing (no-clobber link at commit)', async () => {
    const dir = fresh();
    const path = join(dir, 'race.csv');
    const file = await openAtomicFile(path);
    await file.write('ours');
    writeFileSync(path, 'theirs');
    expect(await caught(file.commit())).toThrowBridgeworkError('file-exists');
    expect(readFileSync(path, 'utf8')).toBe('theirs');
    expect(readdirSync(dir)).toEqual(['race.csv']);
  });

  it('installs its signal handlers only while a temporary file is pending', async () => {
    const before = process.listenerCount('SIGTERM');
    const dir = fresh();
    const a = await openAtomicFile(join(dir, 'a'));
    const b = await openAtomicFile(join(dir, 'b'));
    expect(process.listenerCount('SIGTERM')).toBe(before + 1);
    expect(pendingTempFiles()).toEqual(expect.arrayContaining([a.tempPath, b.tempPath]));
    await a.commit();
    expect(process.listenerCount('SIGTERM')).toBe(before + 1);
    await b.abort();
    expect(process.listenerCount('SIGTERM')).toBe(before);
    expect(pendingTempFiles()).toEqual([]);
  });
});

describe('interrupted writers (child processes)', () => {
  const child = fileURLToPath(new URL('./support/atomicChild.ts', import.meta.url));

  it.each(['SIGTERM', 'SIGINT'] as const)(
    '%s removes the temporary file and leaves no output',
    async (signal) => {
      const dir = fresh();
      const target = join(dir, 'out.csv');
      const p = spawnTs(child, [target]);
      const m = await waitForLine(p, /^ready (.+)$/);
      expect(existsSync(m[1] as string)).toBe(true);
      p.kill(signal);
      const end = await exited(p);
      expect(end.signal).toBe(signal); // the handler re-raises: the process still dies by the signal
      expect(readdirSync(dir)).toEqual([]);
    },
  );

  it('SIGKILL (uncatchable) may leave the hidden temporary file, but never a file at the output path', async () => {
    const dir = fresh();
    const target = join(dir, 'out.csv');
    const p = spawnTs(child, [target]);
    const m = await waitForLine(p, /^ready (.+)$/);
    p.kill('SIGKILL');
    expect((await exited(p)).signal).toBe('SIGKILL');
    expect(existsSync(target)).toBe(false);
    expect(readdirSync(dir)).toEqual([(m[1] as string).slice(dir.length + 1)]);
  });
});
