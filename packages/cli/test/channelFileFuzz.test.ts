/**
 * Channel-file fuzz (issue 13): seeded random mutations of the example files (the demo's file and
 * the minimal files, one per sensor kind) give either a clean report or a clean field error:
 * never an internal error, a stack trace, a silently dropped section or a hang.
 *
 * Two stages. Every mutation is read and validated as the command does (`parseChannelDocument`,
 * `validateChannelDocument` with the command's channel validator): it must be refused with a
 * `parse-error` or `invalid-spec` whose every line names the file (and, for a field, its path),
 * or accepted with every field of the file present in the validated spec (nothing dropped).
 * Accepted files (and a share of the refused ones) then run through the real command
 * (`runCli(['report', file])`) within a time box: exit 0 or 2 with a report, or exit 1 with a
 * clean message. The default run makes 10 000 mutations in a few seconds; BRIDGEWORK_HEAVY=1
 * makes 100 000 and runs every accepted file through the command.
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { isBridgeworkError } from '@bridgework/core';
import { describe, expect, it } from 'vitest';
import { validateChannelDocument } from '../src/channelFile/loadChannelFile.js';
import { parseChannelDocument } from '../src/channelFile/parseChannelDocument.js';
import { validateFileEntry } from '../src/channels/loadChannels.js';
import { runCli } from '../src/runCli.js';
import { examplePath } from './support/footbridge.js';
import { useTempDir } from './support/tempDir.js';
import { memoryIo } from './support/memoryIo.js';
import { generator, mutate } from './support/mutateChannelFile.js';

const heavy = process.env['BRIDGEWORK_HEAVY'] !== undefined;
const MUTATIONS = heavy ? 100_000 : 10_000;
/** Wall-clock budget of the command stage (stage 2), ms; unbounded with BRIDGEWORK_HEAVY. */
const COMMAND_BUDGET_MS = heavy ? Infinity : 4000;
const SEED = Number(process.env['FC_SEED'] ?? 20_261_205);

const minimal = fileURLToPath(new URL('./fixtures/minimal/', import.meta.url));
const seeds: { name: string; text: string; weight: number }[] = [
  { name: 'footbridge.yaml', text: readFileSync(examplePath, 'utf8'), weight: 1 },
  ...readdirSync(minimal)
    .filter((f) => f.endsWith('.yaml'))
    .map((f) => ({ name: f, text: readFileSync(join(minimal, f), 'utf8'), weight: 3 })),
];

/** Every leaf of the data as a dotted path (list items as `[i]`). */
function leafPaths(value: unknown, path: string, out: string[]): string[] {
  if (Array.isArray(value)) {
    if (value.length === 0) out.push(path);
    value.forEach((v, i) => leafPaths(v, `${path}[${i}]`, out));
  } else if (typeof value === 'object' && value !== null) {
    const entries = Object.entries(value);
    if (entries.length === 0) out.push(path);
    for (const [k, v] of entries) leafPaths(v, path === '' ? k : `${path}.${k}`, out);
  } else out.push(path);
  return out;
}

function valueAt(value: unknown, path: string): unknown {
  let x = value;
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) {
    if (typeof x !== 'object' || x === null) return undefined;
    // A range written [min, max] is { min, max } in the validated spec.
    const isRange = !Array.isArray(x) && Object.keys(x).join(',') === 'min,max';
    const key = m[2] !== undefined && isRange ? (m[2] === '0' ? 'min' : 'max') : (m[2] ?? (m[1] as string));
    x = (x as Record<string, unknown>)[key];
  }
  return x;
}

/** What no message of the command may contain. */
const internal =
  /internal error|TypeError|RangeError|ReferenceError|SyntaxError|call stack|\n\s+at .+:\d+:\d+|undefined is not|\[object Object\]/;

describe('channel-file fuzz', () => {
  const tmp = useTempDir('fuzz');

  it(
    `${MUTATIONS} seeded mutations of the example files: a clean report or a clean field error`,
    { timeout: heavy ? 3_600_000 : 120_000 },
    async () => {
      const random = generator(SEED);
      const totalWeight = seeds.reduce((a, s) => a + s.weight, 0);
      const accepted: { index: number; text: string; name: string }[] = [];
      const refusedSample: { index: number; text: string; name: string }[] = [];
      const counts = { parse: 0, spec: 0, accepted: 0 };
      const stage1 = performance.now();
      for (let index = 0; index < MUTATIONS; index++) {
        let r = random() * totalWeight;
        const seed = seeds.find((s) => (r -= s.weight) < 0) ?? (seeds[0] as (typeof seeds)[number]);
        const text = mutate(seed.text, random);
        const where = `mutation ${index} (seed ${SEED}) of ${seed.name}:\n${text}`;
        const file = seed.name.replace('.yaml', `-${index}.yaml`);
        let loaded;
        let data: unknown;
        try {
          const document = parseChannelDocument(text, file);
          data = document.data;
          loaded = validateChannelDocument(document, { validateChannel: validateFileEntry });
        } catch (e) {
          expect(isBridgeworkError(e), `${where}\n${String(e)}`).toBe(true);
          const err = e as Error & { code: string };
          expect(['parse-error', 'invalid-spec'], where).toContain(err.code);
          expect(err.message, where).not.toMatch(internal);
          // Each line names the file; problems of a field name its path.
          const lines = err.message.split('\n');
          for (const line of lines.slice(err.code === 'invalid-spec' ? 1 : 0))
            expect(line.startsWith(file), `${where}\n${err.message}`).toBe(true);
          if (err.code === 'parse-error') counts.parse++;
          else counts.spec++;
          if (index % 50 === 0) refusedSample.push({ index, text, name: file });
          continue;
        }
        counts.accepted++;
        // Nothing dropped: every field written for a channel is in its validated spec.
        const raw = (data as { channels: Record<string, unknown> }).channels;
        for (const { name, spec } of loaded.channels) {
          for (const path of leafPaths(raw[name], '', [])) {
            if (path === '') continue;
            expect(valueAt(spec, path), `${where}\nchannels.${name}.${path} was dropped`).not.toBe(undefined);
          }
        }
        accepted.push({ index, text, name: file });
      }
      expect(counts.parse + counts.spec + counts.accepted).toBe(MUTATIONS);
      // The mutations reach every outcome.
      expect(counts.parse).toBeGreaterThan(MUTATIONS / 20);
      expect(counts.spec).toBeGreaterThan(MUTATIONS / 20);
      expect(counts.accepted).toBeGreaterThan(MUTATIONS / 100);

      // Stage 2: the real command on accepted files (and a sample of refused ones), time-boxed.
      const start = performance.now();
      let ran = 0;
      const exits = { ok: 0, failedCheck: 0, refused: 0 };
      for (const c of [...refusedSample.slice(0, 20), ...accepted]) {
        if (performance.now() - start > COMMAND_BUDGET_MS && ran >= 20) break;
        const path = join(tmp(), c.name);
        writeFileSync(path, c.text);
        const io = memoryIo();
        const t0 = performance.now();
        const code = await runCli(['report', path], io);
        const elapsed = performance.now() - t0;
        const where = `mutation ${c.index} (seed ${SEED}):\n${c.text}\n--- stderr:\n${io.stderr.text()}`;
        expect(elapsed, `${where}\ntook ${elapsed} ms`).toBeLessThan(30_000);
        expect([0, 1, 2], where).toContain(code);
        expect(io.stderr.text(), where).not.toMatch(internal);
        if (code === 1) {
          exits.refused++;
          expect(io.stderr.text(), where).toMatch(/^bridgework report: /);
          expect(io.stdout.text(), where).toBe('');
        } else {
          if (code === 0) exits.ok++;
          else exits.failedCheck++;
          expect(io.stdout.text(), where).toMatch(/^Design report/);
          expect(io.stdout.text(), where).toMatch(/qualified engineering judgement/);
        }
        ran++;
      }
      expect(ran).toBeGreaterThanOrEqual(Math.min(20, accepted.length));
      console.log(
        `channel-file fuzz: ${MUTATIONS} mutations (seed ${SEED}) read in ${((start - stage1) / 1000).toFixed(1)} s: ${counts.parse} malformed, ${counts.spec} invalid, ${counts.accepted} accepted; ` +
          `${ran} run through 'report' (${exits.ok} ok, ${exits.failedCheck} failed a check, ${exits.refused} refused)`,
      );
    },
  );
});
