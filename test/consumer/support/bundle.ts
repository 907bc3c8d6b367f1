/**
 * Browser bundles of bridgework entries, as a web app's bundler makes them: esbuild, ESM, browser
 * platform (a `node:` import is an error), minified, tree-shaken by the packages'
 * `sideEffects: false`. Sizes are the minified bytes and the gzip (level 9) bytes.
 */
import { gzipSync } from 'node:zlib';
import { build } from 'esbuild';

/**
 * The budget of the conversion path (`createChannel` + `convert`), gzipped bytes: issue 18's
 * target. Measured 39.3 kB on 2026-12-05 once the sensor kinds' budget sides
 * (`kinds/budgetRegistry.ts`), the spec's field reference and JSON Schema
 * (`spec/schemaReference.ts`) and the fields' meanings (`spec/fieldDocs.ts`) left the path (44.7
 * kB before). A change that crosses the budget splits something off the conversion path; it does
 * not raise the figure.
 */
export const CONVERSION_PATH_BUDGET_GZIP_BYTES = 40_000;

/** Issue 18's target for the conversion path, gzipped bytes (met; the budget is the target). */
export const CONVERSION_PATH_TARGET_GZIP_BYTES = 40_000;

/** A bundle and its size. */
export interface Bundle {
  /** The minified JavaScript. */
  readonly code: string;
  /** Minified size in bytes. */
  readonly minifiedBytes: number;
  /** Gzipped size in bytes (level 9). */
  readonly gzippedBytes: number;
  /** Bytes of output per input package (node_modules/<name>), largest first. */
  readonly byPackage: readonly { readonly name: string; readonly bytes: number }[];
}

/**
 * Bundles a module for the browser.
 *
 * @param contents - The entry module's source (ESM).
 * @param resolveDir - Where its imports resolve from (a project with the packages installed).
 * @returns The bundle and its size.
 */
export async function bundleForBrowser(contents: string, resolveDir: string): Promise<Bundle> {
  const result = await build({
    stdin: { contents, resolveDir, sourcefile: 'entry.mjs', loader: 'js' },
    bundle: true,
    minify: true,
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
    write: false,
    metafile: true,
    legalComments: 'none',
    logLevel: 'silent',
  });
  const code = result.outputFiles[0]!.text;
  const perPackage = new Map<string, number>();
  for (const output of Object.values(result.metafile.outputs)) {
    for (const [path, { bytesInOutput }] of Object.entries(output.inputs)) {
      // node_modules/<name>/… (installed; the last node_modules wins) or packages/<dir>/… (workspace).
      const installed = /node_modules\/((?:@[^/]+\/)?[^/]+)\/(?!.*node_modules\/)/.exec(path)?.[1];
      const workspace = /(?:^|\/)packages\/([^/]+)\/dist\//.exec(path)?.[1];
      const name =
        installed ??
        (workspace === undefined
          ? '(entry)'
          : workspace === 'cli'
            ? 'bridgework'
            : `@bridgework/${workspace}`);
      perPackage.set(name, (perPackage.get(name) ?? 0) + bytesInOutput);
    }
  }
  return {
    code,
    minifiedBytes: Buffer.byteLength(code),
    gzippedBytes: gzipSync(code, { level: 9 }).length,
    byPackage: [...perPackage].map(([name, bytes]) => ({ name, bytes })).sort((a, b) => b.bytes - a.bytes),
  };
}

/** A bundle measured for docs/performance.md: what it imports and what it keeps. */
export interface MeasuredPath {
  /** Short label. */
  readonly label: string;
  /** The entry module. */
  readonly contents: string;
}

/**
 * The entries and import paths whose browser weight docs/performance.md states: each browser
 * entry whole (`export *`), and the single functions apps typically start from.
 */
export const measuredPaths: readonly MeasuredPath[] = [
  ...[
    'core',
    'bridge',
    'compensation',
    'chain',
    'uncertainty',
    'mechanics',
    'calibration',
    'firmware',
    'channel',
  ].map((p) => ({ label: `@bridgework/${p} (whole entry)`, contents: `export * from '@bridgework/${p}';` })),
  { label: 'solveArm', contents: `export { solveArm } from '@bridgework/bridge';` },
  { label: 'createStrainBridge', contents: `export { createStrainBridge } from '@bridgework/bridge';` },
  { label: 'propagate', contents: `export { propagate } from '@bridgework/uncertainty';` },
  { label: 'fitPolynomial', contents: `export { fitPolynomial } from '@bridgework/calibration';` },
  { label: 'fixedPointMap', contents: `export { fixedPointMap } from '@bridgework/firmware';` },
  {
    label: 'createChannel + convert (the conversion path)',
    contents: `import { createChannel } from '@bridgework/channel';
export const convert = (spec, codes) => createChannel(spec).convert(codes);`,
  },
  {
    label: 'the opt-in RTD polynomial (`@bridgework/channel/rtd-polynomial`) with createChannel + convert',
    contents: `import { createChannel } from '@bridgework/channel';
import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial';
export const convert = (spec, codes) => createChannel(spec).convert(codes);
export const convertFast = (spec, codes) => createRtdPolynomialConverter(createChannel(spec)).convert(codes);`,
  },
  { label: 'validateChannelSpec', contents: `export { validateChannelSpec } from '@bridgework/channel';` },
  {
    label: 'createChannel + channelBudget',
    contents: `import { channelBudget, createChannel } from '@bridgework/channel';
export const budget = (spec) => channelBudget(createChannel(spec));`,
  },
  {
    label: 'createChannel + channelConstants',
    contents: `import { channelConstants, createChannel } from '@bridgework/channel';
export const constants = (spec) => channelConstants(createChannel(spec));`,
  },
  {
    label: 'channelSpecFields + channelSpecJsonSchema',
    contents: `export { channelSpecFields, channelSpecJsonSchema } from '@bridgework/channel';`,
  },
];
