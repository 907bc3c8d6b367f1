/**
 * `bridgework demo` once installed from the packed tarballs (issue 18 item 1): every package is
 * packed with `pnpm pack` (workspace versions replaced as for publishing), installed globally
 * with npm into a temporary prefix, and the demo is run from an unrelated folder that holds a
 * decoy `examples/footbridge-monitoring.yaml`: the demo must use the file shipped in the package.
 *
 * It builds the packages first (`tsc -b`, quick when they are current) and needs the npm registry
 * for third-party dependencies, so it runs under CI, or locally with BRIDGEWORK_HEAVY=1 (about
 * 40 s).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repoRoot } from './support/footbridge.js';
import { useTempDir } from './support/tempDir.js';

const tmp = useTempDir('installed');
const enabled = process.env['CI'] !== undefined || process.env['BRIDGEWORK_HEAVY'] !== undefined;

describe.runIf(enabled)('the demo of the installed command', () => {
  it('runs from any folder with the channel file shipped in the package', { timeout: 600_000 }, () => {
    const packs = join(tmp(), 'packs');
    mkdirSync(packs);
    execFileSync('pnpm', ['exec', 'tsc', '-b', 'packages/cli'], { cwd: repoRoot, stdio: 'pipe' });
    for (const name of readdirSync(join(repoRoot, 'packages'))) {
      execFileSync('pnpm', ['pack', '--pack-destination', packs], {
        cwd: join(repoRoot, 'packages', name),
        stdio: 'pipe',
      });
    }
    const tarballs = readdirSync(packs).map((f) => join(packs, f));
    const cli = tarballs.find((f) => /[/\\]bridgework-\d/.test(f));
    expect(cli).toBeDefined();
    const listing = execFileSync('tar', ['tzf', cli as string], { encoding: 'utf8' });
    expect(listing.split('\n')).toContain('package/demo/footbridge-monitoring.yaml');

    const prefix = join(tmp(), 'prefix');
    execFileSync('npm', ['install', '--global', '--prefix', prefix, '--no-audit', '--no-fund', ...tarballs], {
      stdio: 'pipe',
      env: { ...process.env, npm_config_loglevel: 'error' },
    });
    const bin = join(prefix, 'bin', 'bridgework');
    expect(existsSync(bin)).toBe(true);

    // An unrelated folder with a decoy example that must not be read.
    const elsewhere = join(tmp(), 'elsewhere');
    mkdirSync(join(elsewhere, 'examples'), { recursive: true });
    writeFileSync(join(elsewhere, 'examples', 'footbridge-monitoring.yaml'), 'channels: not a channel\n');
    const out = execFileSync(bin, ['demo', '--dir', 'out'], {
      cwd: elsewhere,
      encoding: 'utf8',
      env: { PATH: process.env['PATH'], NO_COLOR: '1' },
    });
    const shipped = join(prefix, 'lib', 'node_modules', 'bridgework', 'demo', 'footbridge-monitoring.yaml');
    expect(out).toMatch(
      new RegExp(
        `^bridgework demo: the design report of ${shipped.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')},\n`,
      ),
    );
    expect(out).toMatch(/Every check passed/);
    for (const f of ['footbridge-monitoring.html', 'footbridge_constants.h', 'footbridge-monitoring.yaml'])
      expect(existsSync(join(elsewhere, 'out', f)), f).toBe(true);
    // The copy is the shipped example, pointed at the shipped schema, and `report` runs on it.
    const copy = readFileSync(join(elsewhere, 'out', 'footbridge-monitoring.yaml'), 'utf8');
    expect(copy).toContain(
      `$schema=${join(prefix, 'lib', 'node_modules', 'bridgework', 'schema', 'channel-file.schema.json')}`,
    );
    expect(
      existsSync(join(prefix, 'lib', 'node_modules', 'bridgework', 'schema', 'channel-file.schema.json')),
    ).toBe(true);
    const report = execFileSync(bin, ['report', 'out/footbridge-monitoring.yaml'], {
      cwd: elsewhere,
      encoding: 'utf8',
      env: { PATH: process.env['PATH'], NO_COLOR: '1' },
    });
    expect(report).toMatch(/^Design report: Riverside footbridge, crowd-load test\n/);
  });
});
