/**
 * The packages as a user meets them. Every package is built and packed (`pnpm -r pack`, the same
 * tarballs `pnpm publish` uploads); a loopback registry serves them under their names; npm installs
 * them into throwaway projects outside the repository (nothing resolves from the workspace, nothing
 * is cached outside the temp folder); then:
 *
 * - the tarballs hold what they should, pass publint (strict) and are-the-types-wrong, and
 *   `npm publish --dry-run` of each is clean;
 * - (a) Node imports every entry with `import` and with `require()`, computes a documented value of
 *   each, and runs every README example, printing exactly the output the README shows;
 * - (b) TypeScript strict (NodeNext and bundler resolution, skipLibCheck false, lib ES2022 alone,
 *   no @types/node) type-checks a program using every package's main API, and the README examples;
 * - (c) an esbuild browser bundle of the conversion path runs in Chromium, gives the same numbers
 *   as Node, and stays within its size budget;
 * - (d) the CLI installed globally runs `--help`, `demo`, `report` and its README example from an
 *   unrelated folder;
 * - (e) two versions of core side by side recognise each other's errors, and compatible versions
 *   share one copy.
 *
 * Third-party dependencies (decimal.js, yaml) come from the npm registry. Chromium is
 * Debian's /usr/bin/chromium: without it the browser check fails under CI and is skipped elsewhere.
 * Set BRIDGEWORK_CONSUMER_KEEP=1 to keep the temp folder for inspection.
 */
import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  readdirSync,
  realpathSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BOLTZMANN_JOULES_PER_KELVIN, ZERO_CELSIUS_KELVIN } from '@bridgework/core';
import { bundleForBrowser, CONVERSION_PATH_BUDGET_GZIP_BYTES } from './support/bundle.js';
import { startLocalRegistry, type LocalRegistry, type PackedPackage } from './support/localRegistry.js';
import { readmeExample, toCommonJs } from './support/readmeExamples.js';
import { run, runOk, type RunResult } from './support/run.js';
import { readPackedManifest, readTarball } from './support/tarball.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const fixtures = join(root, 'test', 'consumer', 'fixtures');
const packageDirs = readdirSync(join(root, 'packages')).filter((p) =>
  existsSync(join(root, 'packages', p, 'package.json')),
);
const node = process.execPath;
const tsc = join(root, 'node_modules', 'typescript', 'bin', 'tsc');
const chromiumPath = '/usr/bin/chromium';
const haveChromium = existsSync(chromiumPath);
const ci = (process.env['CI'] ?? '') !== '' && process.env['CI'] !== 'false';
const keep = process.env['BRIDGEWORK_CONSUMER_KEEP'] === '1';

let tmp = '';
let tarballs: PackedPackage[] = [];
let registry: LocalRegistry | undefined;
let registryWithBumps: LocalRegistry | undefined;
/** An empty registry for `npm publish --dry-run` (npm asks who is logged in and whether the version exists). */
let emptyRegistry: LocalRegistry | undefined;
/** The dry-run publications of the unpacked tarballs, started while npm installs (they are independent). */
let publications: Promise<RunResult[]> = Promise.resolve([]);
/** Where each throwaway project lives. */
const at = {
  project: '',
  twoCopies: '',
  oneCopy: '',
  prefix: '',
  elsewhere: '',
};

const byName = (name: string): PackedPackage => {
  const p = tarballs.find((t) => t.name === name && t.version === '0.1.0');
  if (p === undefined) throw new Error(`no tarball of ${name}`);
  return p;
};
const npmArgs = (r: LocalRegistry): string[] => [
  '--no-audit',
  '--no-fund',
  '--no-update-notifier',
  '--loglevel=warn',
  `--cache=${join(tmp, 'npm-cache')}`,
  ...r.npmArgs,
];
const writeProject = (dir: string, dependencies: Record<string, string>): void => {
  mkdirSync(dir, { recursive: true });
  writeFileSync(
    join(dir, 'package.json'),
    `${JSON.stringify({ name: basename(dir), private: true, type: 'module', dependencies }, null, 2)}\n`,
  );
};

/** Repacks a tarball of core with another version number (a later release, for side-by-side tests). */
async function bumpedCore(version: string): Promise<PackedPackage> {
  const core = byName('@bridgework/core');
  const dir = join(tmp, `core-${version}`);
  mkdirSync(dir, { recursive: true });
  await runOk('tar', ['-xzf', core.file, '-C', dir], { cwd: tmp });
  const manifest = { ...core.manifest, version };
  writeFileSync(join(dir, 'package', 'package.json'), `${JSON.stringify(manifest, null, 2)}\n`);
  const file = join(tmp, 'tarballs-bumped', `bridgework-core-${version}.tgz`);
  mkdirSync(join(tmp, 'tarballs-bumped'), { recursive: true });
  await runOk('tar', ['-czf', file, '-C', dir, 'package'], { cwd: tmp });
  return { name: core.name, version, file, manifest };
}

beforeAll(async () => {
  tmp = realpathSync(mkdtempSync(join(tmpdir(), 'bridgework-consumer-')));
  // The tarballs hold dist/: bring it up to date with the sources (incremental, seconds when current).
  await runOk(node, [tsc, '-b', ...packageDirs.map((p) => join(root, 'packages', p))], {
    cwd: root,
    timeoutMs: 300_000,
  });
  const tarDir = join(tmp, 'tarballs');
  await runOk('pnpm', ['-r', 'pack', '--pack-destination', tarDir], { cwd: root });
  tarballs = readdirSync(tarDir).map((f) => {
    const file = join(tarDir, f);
    const manifest = readPackedManifest(file);
    return { name: String(manifest['name']), version: String(manifest['version']), file, manifest };
  });
  expect(tarballs.map((t) => t.name).sort()).toEqual(
    packageDirs.map((p) => (p === 'cli' ? 'bridgework' : `@bridgework/${p}`)).sort(),
  );

  registry = await startLocalRegistry(tarballs);
  emptyRegistry = await startLocalRegistry([]);
  const empty = emptyRegistry;
  // From the unpacked folder, as `npm publish` in a package folder: npm then normalises the
  // manifest itself and warns about what it corrects (a `./dist/bin.js` bin is dropped, for one).
  publications = Promise.all(
    tarballs.map(async (t) => {
      const dir = join(tmp, 'unpacked', basename(t.file, '.tgz'));
      mkdirSync(dir, { recursive: true });
      await runOk('tar', ['-xzf', t.file, '-C', dir], { cwd: tmp });
      const args = [
        'publish',
        join(dir, 'package'),
        '--dry-run',
        '--json',
        `--registry=${empty.url}`,
        ...npmArgs(empty),
      ];
      return run('npm', args, { cwd: tmp });
    }),
  );
  publications.catch(() => undefined); // awaited (and reported) by its test
  registryWithBumps = await startLocalRegistry([
    ...tarballs,
    await bumpedCore('0.1.1'),
    await bumpedCore('0.2.0'),
  ]);

  // The main project: every library by name from the registry, the CLI from its tarball.
  at.project = join(tmp, 'project');
  const libraries = tarballs.filter((t) => t.name.startsWith('@bridgework/'));
  writeProject(at.project, {
    ...Object.fromEntries(libraries.map((t) => [t.name, `^${t.version}`])),
    bridgework: `file:${byName('bridgework').file}`,
  });
  // (e) core 0.2.0 beside bridge 0.1.0 (which needs ^0.1.0): two copies; core 0.1.1: one copy.
  at.twoCopies = join(tmp, 'two-copies');
  writeProject(at.twoCopies, { '@bridgework/core': '0.2.0', '@bridgework/bridge': '0.1.0' });
  at.oneCopy = join(tmp, 'one-copy');
  writeProject(at.oneCopy, { '@bridgework/core': '0.1.1', '@bridgework/bridge': '0.1.0' });
  // (d) the CLI installed globally into its own prefix; run from a folder that knows nothing of it.
  at.prefix = join(tmp, 'global');
  at.elsewhere = join(tmp, 'elsewhere');
  mkdirSync(at.elsewhere);

  const install = { timeoutMs: 240_000 };
  await Promise.all([
    runOk('npm', ['install', ...npmArgs(registry)], { cwd: at.project, ...install }),
    runOk('npm', ['install', ...npmArgs(registryWithBumps)], { cwd: at.twoCopies, ...install }),
    runOk('npm', ['install', ...npmArgs(registryWithBumps)], { cwd: at.oneCopy, ...install }),
    runOk(
      'npm',
      ['install', '--global', `--prefix=${at.prefix}`, byName('bridgework').file, ...npmArgs(registry)],
      {
        cwd: at.elsewhere,
        ...install,
      },
    ),
  ]);
  for (const f of readdirSync(fixtures)) writeFileSync(join(at.project, f), readFileSync(join(fixtures, f)));
  writeFileSync(join(at.twoCopies, 'two-copies.mjs'), readFileSync(join(fixtures, 'two-copies.mjs')));
}, 600_000);

afterAll(async () => {
  await registry?.close();
  await registryWithBumps?.close();
  await publications.catch(() => undefined);
  await emptyRegistry?.close();
  if (tmp === '') return;
  if (keep) console.log(`consumer test folder kept: ${tmp}`);
  else rmSync(tmp, { recursive: true, force: true });
}, 120_000);

describe('the packed tarballs', () => {
  it('hold dist, sources, README, LICENSE and CHANGELOG; no build info, tests, scripts or workspace ranges', () => {
    const rows: string[] = [];
    for (const t of tarballs) {
      const entries = readTarball(t.file);
      const paths = entries.map((e) => e.path);
      for (const f of [
        'package.json',
        'README.md',
        'LICENSE',
        'CHANGELOG.md',
        'dist/index.js',
        'dist/index.d.ts',
      ])
        expect(paths, `${t.name}: ${f}`).toContain(`package/${f}`);
      expect(
        paths.filter((p) => /tsbuildinfo|\/test\/|\.test\.|\/fixtures\/|\/bench\//.test(p)),
        t.name,
      ).toEqual([]);
      expect(readFileSync(join(root, 'LICENSE'), 'utf8')).toBe(
        entries.find((e) => e.path === 'package/LICENSE')!.data.toString('utf8'),
      );
      const m = t.manifest;
      expect(m['scripts'], t.name).toBeUndefined();
      expect(m['devDependencies'], t.name).toBeUndefined();
      for (const [dep, range] of Object.entries((m['dependencies'] ?? {}) as Record<string, string>)) {
        expect(range, `${t.name} → ${dep}`).toMatch(/^\^\d+\.\d+\.\d+$/);
      }
      for (const target of Object.values((m['bin'] ?? {}) as Record<string, string>)) {
        const bin = entries.find((e) => e.path === `package/${target}`);
        expect(bin?.data.toString('utf8').split('\n')[0], `${t.name} bin`).toBe('#!/usr/bin/env node');
      }
      const unpacked = entries.reduce((s, e) => s + e.data.length, 0);
      rows.push(
        `${t.name}: ${(readFileSync(t.file).length / 1000).toFixed(1)} kB packed, ${(unpacked / 1000).toFixed(1)} kB unpacked, ${entries.length} files`,
      );
    }
    console.log(`tarballs:\n  ${rows.join('\n  ')}`);
  });

  it('pass publint (strict: warnings fail) and are-the-types-wrong (ESM-only profile)', async () => {
    const { publint } = await import('publint');
    const { formatMessage } = await import('publint/utils');
    const attw = await import('@arethetypeswrong/core');
    for (const t of tarballs) {
      const data = readFileSync(t.file);
      const tarball = data.buffer.slice(data.byteOffset, data.byteOffset + data.byteLength);
      const lint = await publint({ pack: { tarball }, strict: true, level: 'suggestion' });
      expect(
        lint.messages.map((m) => `${m.type}: ${formatMessage(m, lint.pkg, { color: false })}`),
        t.name,
      ).toEqual([]);
      // ESM-only profile: node10 resolution (no exports support) and TypeScript < 5.8's view of
      // require() from CommonJS are out of scope; (a) and (b) below prove require() in Node and TS.
      const analysis = await attw.checkPackage(attw.createPackageFromTarballData(new Uint8Array(data)));
      expect(analysis.types, t.name).not.toBe(false);
      const ignored = new Set(['node10', 'node16-cjs']);
      const problems = 'problems' in analysis ? analysis.problems : [];
      expect(
        problems.filter((p) => !('resolutionKind' in p) || !ignored.has(p.resolutionKind)),
        t.name,
      ).toEqual([]);
    }
  });

  it('publish cleanly: npm publish --dry-run of each unpacked tarball warns about nothing', async () => {
    const results = await publications;
    expect(results).toHaveLength(tarballs.length);
    results.forEach((r, i) => {
      const name = tarballs[i]!.name;
      expect(r.status, `${name}\n${r.stderr}`).toBe(0);
      expect(
        r.stderr.split('\n').filter((l) => /\bwarn|\berr/i.test(l)),
        name,
      ).toEqual([]);
      // npm, packing the unpacked folder by its own rules, takes exactly the files pnpm packed.
      const report = (JSON.parse(r.stdout) as Record<string, { id: string; files: { path: string }[] }>)[
        name
      ];
      expect(report?.id).toBe(`${name}@${tarballs[i]!.version}`);
      expect(report?.files.map((f) => `package/${f.path}`).sort(), name).toEqual(
        readTarball(tarballs[i]!.file)
          .map((e) => e.path)
          .sort(),
      );
    });
  });
});

describe('(a) Node: every entry by import and by require(), and every README example', () => {
  it('imports and requires every entry and computes a documented value of each', async () => {
    const [esm, cjs] = await Promise.all(
      (['import', 'require'] as const).map(async (mode) => {
        const r = await runOk(node, ['entries.cjs', mode], { cwd: at.project });
        return JSON.parse(r.stdout) as Record<string, { exports: string[]; value: number | string }>;
      }),
    );
    expect(Object.keys(esm!)).toHaveLength(12);
    for (const [entry, { exports }] of Object.entries(esm!)) {
      expect(exports.length, entry).toBeGreaterThan(0);
      expect(cjs![entry]?.exports, `require('${entry}') gives what import gives`).toEqual(exports);
    }
    for (const values of [esm!, cjs!]) {
      const v = (entry: string): number => values[entry]!.value as number;
      expect(v('@bridgework/core')).toBeNear(2, { ulps: 1 }); // 2e-3 V/V is 2 mV/V
      // README (root) worked example: the reading was made with R1 = 350.7 Ω (10-digit voltage).
      expect(v('@bridgework/bridge')).toBeNear(350.7, { rel: 1e-9 });
      // IEC 60751: R(100 °C) = 100·(1 + 100A + 100²B) = 138.5055 Ω (table: 138.51 Ω).
      expect(v('@bridgework/compensation')).toBeNear(100 * (1 + 100 * 3.9083e-3 + 1e4 * -5.775e-7), {
        rel: 1e-12,
      });
      // Johnson noise √(4kTR), 350 Ω at 25 °C with the exact SI Boltzmann constant.
      const kT = BOLTZMANN_JOULES_PER_KELVIN * (ZERO_CELSIUS_KELVIN + 25);
      expect(v('@bridgework/chain')).toBeNear(Math.sqrt(4 * kT * 350), { rel: 1e-12 });
      // JCGM 100 law of propagation for R = V/I: u = √((u_V/I)² + (V·u_I/I²)²) = √(0.1² + 0.125²).
      expect(v('@bridgework/uncertainty')).toBeNear(Math.hypot(0.002 / 0.02, (5 * 1e-5) / 0.02 ** 2), {
        rel: 1e-8,
      });
      expect(v('@bridgework/uncertainty/node')).toBe(1); // worker threads agree with one thread bit for bit
      // Rectangular rosette: the condition number of its strain-transformation matrix is √15.
      expect(v('@bridgework/mechanics')).toBeNear(Math.sqrt(15), { rel: 1e-12 });
      // Resistance-equivalent shunt (common practice): Rs = Rg·(1/(GF·|ε|) − 1) = 350·499 Ω.
      expect(v('@bridgework/calibration')).toBeNear(350 * 499, { rel: 1e-12 });
      // (50 kg / 2147483.648 counts) / 0.00001 kg = 2.3283064365386963 = 1.25e9 / 2^29: exact.
      expect(v('@bridgework/firmware')).toBe(1_250_000_000);
      // The channel README's output: 1003.209 µε at code 563000.
      expect(v('@bridgework/channel')).toBeNear(1003.209e-6, { abs: 5e-10 });
      // The opt-in RTD polynomial (subpath export): the Pt100's code for 100 °C converts within
      // 1 ulp of the exact composition, so within 1e-12 °C of channel.convert (whose own error
      // is up to 35 ulp there); a rail code is refused by both.
      const [poly, exact, polyRejected, exactRejected] = values['@bridgework/channel/rtd-polynomial']!
        .value as unknown as [number, number, number, number];
      expect(poly).toBeNear(exact, { abs: 1e-12 });
      expect(exact).toBeNear(100, { abs: 1e-3 }); // the nearest code to 100 °C at 24 bits, gain 8
      expect([polyRejected, exactRejected]).toEqual([1, 1]);
      expect(values['bridgework']!.value).toBe('0 0.1.0');
    }
  });

  it.each(packageDirs.filter((p) => p !== 'cli'))(
    'README example of %s prints its stated output, as ESM and as CommonJS',
    async (p) => {
      const example = readmeExample(readFileSync(join(root, 'packages', p, 'README.md'), 'utf8'));
      writeFileSync(join(at.project, `readme-${p}.mjs`), example.code);
      writeFileSync(join(at.project, `readme-${p}.cjs`), toCommonJs(example.code));
      for (const file of [`readme-${p}.mjs`, `readme-${p}.cjs`]) {
        const r = await runOk(node, [file], { cwd: at.project });
        expect(r.stdout.trimEnd(), `packages/${p}/README.md, run as ${file}`).toBe(example.output);
      }
    },
  );
});

describe('(b) TypeScript strict, skipLibCheck false, lib ES2022 alone, no @types/node', () => {
  it.each([
    ['NodeNext', { module: 'NodeNext', moduleResolution: 'NodeNext' }, ['usage.cts']],
    ['Bundler', { module: 'Preserve', moduleResolution: 'Bundler', exactOptionalPropertyTypes: true }, []],
  ] as const)(
    'type-checks every package and the README examples with %s resolution',
    async (label, options, extra) => {
      for (const p of packageDirs.filter((d) => d !== 'cli')) {
        const example = readmeExample(readFileSync(join(root, 'packages', p, 'README.md'), 'utf8'));
        writeFileSync(join(at.project, `readme-${p}.ts`), example.code);
      }
      const config = {
        compilerOptions: {
          strict: true,
          target: 'ES2022',
          lib: ['ES2022'],
          types: [],
          skipLibCheck: false,
          noEmit: true,
          ...options,
        },
        include: ['*.ts', ...extra],
      };
      const file = `tsconfig.${label.toLowerCase()}.json`;
      writeFileSync(join(at.project, file), JSON.stringify(config, null, 2));
      // --listFiles: besides any error, the files of the program. A third-party dependency may
      // bring @types/node into node_modules (apache-arrow does); none of it may be compiled.
      const r = await run(node, [tsc, '-p', file, '--listFiles'], { cwd: at.project, timeoutMs: 180_000 });
      const lines = (r.stdout + r.stderr).split('\n').filter((l) => l.trim() !== '');
      const files = lines.filter((l) => l.startsWith('/') && !/\(\d+,\d+\): error TS/.test(l));
      expect(
        lines.filter((l) => !files.includes(l)),
        `tsc -p ${file}`,
      ).toEqual([]);
      expect(r.status).toBe(0);
      expect(files.filter((f) => f.includes('/node_modules/@types/'))).toEqual([]);
      expect(files.some((f) => f.endsWith('/node_modules/@bridgework/channel/dist/createChannel.d.ts'))).toBe(
        true,
      );
    },
  );
});

describe('(c) the conversion path in a browser', () => {
  it.skipIf(!haveChromium && !ci)(
    'bundles createChannel + convert for the browser within budget, and Chromium computes what Node does',
    async () => {
      const bundle = await bundleForBrowser(
        readFileSync(join(fixtures, 'browser-entry.mjs'), 'utf8'),
        at.project,
      );
      console.log(
        `conversion path: ${(bundle.minifiedBytes / 1000).toFixed(1)} kB minified, ${(bundle.gzippedBytes / 1000).toFixed(1)} kB gzipped ` +
          `(budget ${CONVERSION_PATH_BUDGET_GZIP_BYTES / 1000} kB)`,
      );
      expect(bundle.code).not.toMatch(/\bfrom\s*["']node:|require\(["']node:/);
      expect(bundle.gzippedBytes).toBeLessThanOrEqual(CONVERSION_PATH_BUDGET_GZIP_BYTES);
      // What only the budget, the firmware constants or the field reference need stays out.
      const packages = bundle.byPackage.map((p) => p.name);
      for (const name of ['@bridgework/uncertainty', '@bridgework/firmware', 'decimal.js'])
        expect(packages).not.toContain(name);
      expect(bundle.code).not.toContain('x-unit'); // the JSON Schema's unit keyword
      expect(bundle.code).not.toContain('Gauge resistance'); // a field's meaning (spec/fieldDocs.ts)
      // The opt-in RTD polynomial (a subpath export) stays out: its option's name and message.
      expect(bundle.code).not.toContain('checkAllSegments');
      expect(bundle.code).not.toContain('has no IEC 60751 RTD curve');

      const inNode = await runOk(
        node,
        [
          '--input-type=module',
          '-e',
          "await import('./browser-entry.mjs'); console.log(globalThis.conversionResult);",
        ],
        { cwd: at.project },
      );
      const expected = JSON.parse(inNode.stdout) as { values: string[]; converted: number };
      expect(expected.converted).toBe(4); // six codes, the two at the rails are refused

      if (!haveChromium)
        throw new Error(`${chromiumPath} is missing: install the Debian package chromium (.ci/run does)`);
      const { chromium } = await import('playwright-core');
      const browser = await chromium.launch({
        executablePath: chromiumPath,
        args: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--no-first-run',
          '--disable-background-networking',
        ],
      });
      try {
        const page = await browser.newPage();
        const errors: string[] = [];
        const requests: string[] = [];
        page.on('pageerror', (e) => errors.push(e.message));
        page.on('request', (r) => {
          if (!r.url().startsWith('data:') && r.url() !== 'about:blank') requests.push(r.url());
        });
        await page.setContent('<!doctype html><meta charset="utf-8"><title>conversion</title>');
        await page.addScriptTag({ content: bundle.code, type: 'module' });
        await page.waitForFunction(() => 'conversionResult' in globalThis, undefined, { timeout: 30_000 });
        const inBrowser = await page.evaluate(
          () => (globalThis as { conversionResult?: string }).conversionResult,
        );
        expect(errors).toEqual([]);
        expect(requests).toEqual([]);
        expect(JSON.parse(inBrowser ?? 'null')).toEqual(expected);
      } finally {
        await browser.close();
      }
    },
  );
});

describe('(d) the CLI installed globally, run from an unrelated folder', () => {
  const bridgework = (args: readonly string[]) =>
    run(join(at.prefix, 'bin', 'bridgework'), args, { cwd: at.elsewhere, timeoutMs: 120_000 });

  it('is the installed copy, and runs --help and --version', async () => {
    expect(realpathSync(join(at.prefix, 'bin', 'bridgework')).startsWith(at.prefix)).toBe(true);
    const help = await bridgework(['--help']);
    expect(help.status, help.stderr).toBe(0);
    expect(help.stdout).toContain('Usage: bridgework <command>');
    expect(help.stdout).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    const version = await bridgework(['--version']);
    expect(version.stdout.trim()).toBe(byName('bridgework').version);
  });

  it('runs its README example and prints the stated output', async () => {
    const example = readmeExample(readFileSync(join(root, 'packages', 'cli', 'README.md'), 'utf8'));
    for (const f of example.files) writeFileSync(join(at.elsewhere, f.name), f.text);
    const commands = example.commands.filter((c) => c.startsWith('bridgework '));
    expect(commands).toHaveLength(1);
    const r = await bridgework(commands[0]!.split(/\s+/).slice(1));
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trimEnd(), 'packages/cli/README.md').toBe(example.output);
  });

  it('runs report on a channel file in that folder', async () => {
    const example = readmeExample(readFileSync(join(root, 'packages', 'cli', 'README.md'), 'utf8'));
    const channelFile = example.files.find((f) => f.name.endsWith('.yaml'))!;
    writeFileSync(join(at.elsewhere, channelFile.name), channelFile.text);
    const r = await bridgework(['report', channelFile.name]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain(`Design report: ${channelFile.name}`);
    expect(r.stdout).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });

  it('runs demo with the channel file shipped inside the package, not a look-alike in the folder', async () => {
    // A decoy where a repository-relative lookup would land (issue 18, item 1).
    mkdirSync(join(at.elsewhere, 'examples'), { recursive: true });
    writeFileSync(join(at.elsewhere, 'examples', 'footbridge-monitoring.yaml'), 'channels: not a channel\n');
    const r = await bridgework(['demo', '--dir', 'demo-out']);
    expect(r.status, r.stdout + r.stderr).toBe(0);
    const shipped = join(
      at.prefix,
      'lib',
      'node_modules',
      'bridgework',
      'demo',
      'footbridge-monitoring.yaml',
    );
    expect(r.stdout.split('\n')[0]).toBe(`bridgework demo: the design report of ${shipped},`);
    expect(r.stdout).toContain('No check failed, but 1 warning');
    expect(r.stdout).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });
  it('converts in worker threads (their entry file is in the package) as in one thread, byte for byte', async () => {
    const shipped = join(at.prefix, 'lib', 'node_modules', 'bridgework');
    expect(existsSync(join(shipped, 'dist', 'data', 'conversionWorker.js'))).toBe(true);
    const codes = new Int32Array(3 * 3000).map((_, i) => ((i * 7919) % 2_000_001) - 1_000_000);
    writeFileSync(join(at.elsewhere, 'rig.bin'), new Uint8Array(codes.buffer));
    const channelFile = join(shipped, 'demo', 'footbridge-monitoring.yaml');
    for (const to of ['csv', 'float32le']) {
      const outputs = [];
      for (const threads of ['0', '2']) {
        const out = `rig-${threads}.${to}`;
        const r = await bridgework([
          'convert',
          channelFile,
          'rig.bin',
          '--block',
          '500',
          '--to',
          to,
          '-o',
          out,
          '--convert-threads',
          threads,
        ]);
        expect(r.status, r.stderr).toBe(0);
        outputs.push(readFileSync(join(at.elsewhere, out)));
      }
      expect(outputs[1]!.equals(outputs[0]!), to).toBe(true);
    }
  });
});

describe('(e) two versions of core side by side', () => {
  it("recognise each other's errors (by the registered brand), and neither takes a look-alike", async () => {
    const r = await runOk(node, ['two-copies.mjs'], { cwd: at.twoCopies });
    expect(JSON.parse(r.stdout)).toEqual({
      appVersion: '0.2.0',
      nestedVersion: '0.1.1', // the newest release that bridge's ^0.1.0 accepts
      distinctCopies: true,
      nestedErrorCode: 'not-positive',
      appRecognisesNested: true,
      appInstanceofNested: true,
      nestedRecognisesApp: true,
      nestedInstanceofApp: true,
      plainErrorRecognised: false,
      lookalikeRecognised: false,
    });
  });

  it('share one copy when the versions are compatible (caret ranges between packages)', () => {
    const core = JSON.parse(
      readFileSync(join(at.oneCopy, 'node_modules', '@bridgework', 'core', 'package.json'), 'utf8'),
    ) as { version: string };
    expect(core.version).toBe('0.1.1');
    expect(existsSync(join(at.oneCopy, 'node_modules', '@bridgework', 'bridge', 'node_modules'))).toBe(false);
  });
});
