/**
 * `bridgework demo` and `pnpm demo`: the design report of the built-in example, printed, with the
 * HTML report and the C header written where it says; the root `demo` script builds the packages
 * when needed and runs the built command, so the README's Quick start works from a fresh clone.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { examplePath, exampleShown, repoRoot } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { tmp } = useTestFiles('demo');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('bridgework demo', () => {
  it('prints the example’s design report and writes its HTML report and C header into --dir', async () => {
    const dir = join(tmp(), 'out');
    const r = await run('demo', '--dir', dir);
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stderr).toBe('');
    expect(r.stdout).toMatch(
      /^bridgework demo: the design report of packages\/cli\/demo\/footbridge-monitoring\.yaml,\n/,
    );
    // The report is the one `bridgework report` prints for the example.
    const report = await run('report', exampleShown);
    expect(r.stdout).toContain(report.stdout);
    const html = join(dir, 'footbridge-monitoring.html');
    const header = join(dir, 'footbridge_constants.h');
    const copy = join(dir, 'footbridge-monitoring.yaml');
    expect(r.stdout).toContain(
      `  HTML report with plots  ${html}\n  C header of constants   ${header}\n  channel file (a copy)   ${copy}\n`,
    );
    // The copy is the example with the editor's schema line pointing into the package.
    expect(readFileSync(copy, 'utf8').replace(/^# yaml-language-server: .*\n/, '')).toBe(
      readFileSync(examplePath, 'utf8').replace(/^# yaml-language-server: .*\n/, ''),
    );
    const page = readFileSync(html, 'utf8');
    expect(page.match(/<svg [^>]*class="bw-plot/g)).toHaveLength(12);
    expect(page).toMatch(/do not replace, qualified engineering judgement/);
    // The header is the one `bridgework constants` writes with the same prefix and verification.
    const constants = await run(
      'constants',
      exampleShown,
      '--prefix',
      'footbridge',
      '--verification',
      'sampled',
    );
    expect(readFileSync(header, 'utf8')).toBe(constants.stdout);
  });

  it('replaces its files only with --force', async () => {
    const dir = join(tmp(), 'again');
    expect((await run('demo', '--dir', dir)).code).toBe(exitCodes.ok);
    const again = await run('demo', '--dir', dir);
    expect(again.code).toBe(exitCodes.badInput);
    expect(again.stdout).toBe('');
    expect(again.stderr).toBe(
      `bridgework demo: ${join(dir, 'footbridge-monitoring.html')} exists already; pass --force to replace it\n`,
    );
    expect((await run('demo', '--dir', dir, '--force')).code).toBe(exitCodes.ok);
  });

  it('writes into a new temporary folder without --dir, and prints where', async () => {
    const r = await run('demo');
    const html = /HTML report with plots {2}(\S+)/.exec(r.stdout)?.[1] ?? '';
    try {
      expect(r.code).toBe(exitCodes.ok);
      expect(dirname(html)).toMatch(/bridgework-demo-[A-Za-z0-9]+$/);
      expect(existsSync(html)).toBe(true);
      expect(existsSync(join(dirname(html), 'footbridge_constants.h'))).toBe(true);
    } finally {
      if (/bridgework-demo-/.test(dirname(html))) rmSync(dirname(html), { recursive: true, force: true });
    }
  });
});

describe('pnpm demo', () => {
  const scripts = (
    JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')) as { scripts: Record<string, string> }
  ).scripts;

  it('is the root script that builds and runs the built command as pnpm’s own child (as `pnpm bridgework` runs any command)', () => {
    const run = 'exec env BRIDGEWORK_STOP_WITH_PARENT=1 node packages/cli/dist/bin.js';
    expect(scripts['bridgework']).toBe(`tsc -b packages/cli && ${run}`);
    expect(scripts['demo']).toBe(`tsc -b packages/cli && ${run} demo`);
  });

  it('runs from the repository root through pnpm, building first when needed', { timeout: 300_000 }, () => {
    const dir = join(tmp(), 'script');
    const out = execFileSync('pnpm', ['demo', '--dir', dir], {
      cwd: repoRoot,
      encoding: 'utf8',
      env: { ...process.env, NO_COLOR: '1' },
    });
    expect(out).toMatch(
      /(^|\n)bridgework demo: the design report of packages\/cli\/demo\/footbridge-monitoring\.yaml,/,
    );
    expect(out).toMatch(/Every check passed\./);
    expect(existsSync(join(dir, 'footbridge-monitoring.html'))).toBe(true);
  });
});
