/**
 * Runs a header's compiled functions over many codes: a C program reads the codes and the
 * reference values (the exact map, computed by the test) from binary files, evaluates every
 * function, and prints per function the largest |result − reference| with its code, and an
 * FNV-1a hash of the results' bytes; the same hash of the TypeScript evaluators shows that the
 * compiled code computes exactly what the library verified.
 */
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { EvaluatorType, FirmwareChannel } from '@bridgework/firmware';
import { cIdentifierFromName, emitCHeader, emitTestProgram } from '@bridgework/firmware';
import { compile, run, STRICT_FLAGS } from './cc.js';

/** What the compiled sweep found for one function. */
export interface SweepLine {
  /** Largest |result − reference| over the codes, quantity unit (computed in C, in double). */
  readonly maxError: number;
  /** A code where it occurs. */
  readonly worstCode: number;
  /** FNV-1a (32-bit) of the results' bytes, little-endian, in code order. */
  readonly hash: number;
}

/** FNV-1a over bytes, 32-bit (Fowler–Noll–Vo, common practice). */
export function fnv1a(h: number, bytes: Uint8Array): number {
  let x = h;
  for (const b of bytes) x = Math.imul(x ^ b, 16777619) >>> 0;
  return x;
}

export const FNV_OFFSET = 2166136261;

/** The TypeScript side of the hash: the same bytes the C program hashes. */
export function hashOf(channel: FirmwareChannel, type: EvaluatorType, codes: Int32Array): number {
  const map = channel[type];
  if (map === undefined) throw new Error(`no ${type} map`);
  const buf = new ArrayBuffer(8);
  const view = new DataView(buf);
  const bytes = new Uint8Array(buf);
  let h = FNV_OFFSET;
  for (const code of codes) {
    const y = map.evaluate(code);
    if (type === 'fixed') {
      view.setInt32(0, y, true);
      h = fnv1a(h, bytes.subarray(0, 4));
    } else if (type === 'float32') {
      view.setFloat32(0, y, true);
      h = fnv1a(h, bytes.subarray(0, 4));
    } else {
      view.setFloat64(0, y, true);
      h = fnv1a(h, bytes);
    }
  }
  return h;
}

function sweepProgram(prefix: string, id: string, types: readonly EvaluatorType[]): string {
  const P = `${prefix}_${id}`;
  const U = P.toUpperCase();
  const body = types.map((t) => {
    const fn = t === 'fixed' ? `${P}_fixed` : t === 'float32' ? `${P}_f32` : `${P}_f64`;
    const value =
      t === 'fixed'
        ? `const int32_t y = ${fn}(code); const double v = (double)y * ${U}_FIXED_OUTPUT_UNIT;`
        : t === 'float32'
          ? `const float y = ${fn}(code); const double v = (double)y;`
          : `const double y = ${fn}(code); const double v = y;`;
    return `        { ${value} const double e = v > ref ? v - ref : ref - v; if (e > worst[${types.indexOf(t)}]) { worst[${types.indexOf(t)}] = e; at[${types.indexOf(t)}] = code; } hash[${types.indexOf(t)}] = fnv(hash[${types.indexOf(t)}], &y, sizeof y); }`;
  });
  return `#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include "constants.h"

static uint32_t fnv(uint32_t h, const void *p, size_t n)
{
    const unsigned char *b = (const unsigned char *)p;
    size_t i;
    for (i = 0; i < n; i++) h = (h ^ b[i]) * 16777619u;
    return h;
}

int main(int argc, char **argv)
{
    FILE *codes;
    FILE *refs;
    int32_t code;
    double ref;
    double worst[3] = { 0.0, 0.0, 0.0 };
    long at[3] = { 0, 0, 0 };
    uint32_t hash[3] = { 2166136261u, 2166136261u, 2166136261u };
    int k;
    if (argc != 3) return 3;
    codes = fopen(argv[1], "rb");
    refs = fopen(argv[2], "rb");
    if (codes == NULL || refs == NULL) return 4;
    while (fread(&code, sizeof code, 1, codes) == 1 && fread(&ref, sizeof ref, 1, refs) == 1) {
        if (!${P}_in_range(code)) return 2;
${body.join('\n')}
    }
    for (k = 0; k < ${types.length}; k++) printf("%.17g %ld %lu\\n", worst[k], at[k], (unsigned long)hash[k]);
    return 0;
}
`;
}

/**
 * Compiles the channel's header with the strict flags, runs every function over `codes`, and
 * returns what the compiled code found per type. Also compiles and runs the emitted test program
 * and returns its output (it must report no failure).
 */
export function sweepCompiled(
  dir: string,
  channel: FirmwareChannel,
  codes: Int32Array,
  reference: Float64Array,
  prefix = 'sweep',
): { readonly lines: Partial<Record<EvaluatorType, SweepLine>>; readonly testProgramOutput: string } {
  const types = (['fixed', 'float32', 'float64'] as const).filter((t) => channel[t] !== undefined);
  const id = cIdentifierFromName(channel.name);
  writeFileSync(join(dir, 'constants.h'), emitCHeader({ channels: [channel], prefix }));
  writeFileSync(join(dir, 'sweep.c'), sweepProgram(prefix, id, types));
  writeFileSync(
    join(dir, 'vectors.c'),
    emitTestProgram({ channels: [channel], prefix, header: 'constants.h' }),
  );
  writeFileSync(join(dir, 'codes.bin'), new Uint8Array(codes.buffer, codes.byteOffset, codes.byteLength));
  writeFileSync(
    join(dir, 'refs.bin'),
    new Uint8Array(reference.buffer, reference.byteOffset, reference.byteLength),
  );
  compile('gcc', [...STRICT_FLAGS, '-O2', 'sweep.c', '-o', 'sweep'], dir);
  compile('gcc', [...STRICT_FLAGS, '-O2', 'vectors.c', '-o', 'vectors'], dir);
  const text = execFileSync(join(dir, 'sweep'), ['codes.bin', 'refs.bin'], { cwd: dir, encoding: 'utf8' })
    .trim()
    .split('\n');
  const lines: Partial<Record<EvaluatorType, SweepLine>> = {};
  types.forEach((t, i) => {
    const [maxError, worstCode, hash] = (text[i] as string).split(' ').map(Number) as [
      number,
      number,
      number,
    ];
    lines[t] = { maxError, worstCode, hash };
  });
  return { lines, testProgramOutput: run(join(dir, 'vectors'), '', dir) };
}
