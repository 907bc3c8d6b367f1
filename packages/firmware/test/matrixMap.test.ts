/**
 * matrixMap: a load matrix y = C·(x − a) in float32 and float64 C, its proved total error bound
 * (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §3.1) checked by compiling
 * the emitted C with gcc (strict flags) and comparing its outputs with a 60-digit decimal.js
 * evaluation of the exact map over sampled input vectors.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { matrixMap, type MatrixMap } from '@bridgework/firmware';
import {
  compile,
  CORTEX_M4F_FLAGS,
  needCompiler,
  run,
  scratch,
  STRICT_FLAGS,
  writeFiles,
} from './support/cc.js';
import { D } from './support/reference.js';

// An invented six-bridge load matrix (N per mV/V and N·m per mV/V): dominant diagonal, 1–3 %
// cross-terms, the scale of a coupling with 2–5 kN and 100–200 N·m full scales.
const scales = [2000, 2000, 5000, 100, 100, 200];
const matrix = scales.map((s, j) =>
  scales.map((_, i) => (i === j ? s * (1 - 0.01 * j) : s * 0.03 * Math.sin(1.7 * i + 2.3 * j))),
);
const offsets = [-0.04999, -0.03002, -0.01001, 0.009999, 0.03002, 0.04998];
const inputRanges = offsets.map(() => ({ min: -1.5, max: 1.5 }));
const maps = {
  float32: matrixMap({ matrix, offsets, inputRanges, precision: 'float32' }),
  float64: matrixMap({ matrix, offsets, inputRanges, precision: 'float64' }),
};

/** The exact map in 60-digit decimal arithmetic, on the given doubles. */
function exact(x: readonly number[]): InstanceType<typeof D>[] {
  return matrix.map((row) =>
    row.reduce((s, c, i) => s.plus(new D(c).times(new D(x[i]!).minus(new D(offsets[i]!)))), new D(0)),
  );
}

/** Input vectors: the box's 64 corners, vectors that cancel each row, and random ones. */
function samples(): number[][] {
  const out: number[][] = [];
  for (let k = 0; k < 64; k++) out.push(offsets.map((_, i) => ((k >> i) & 1 ? 1.5 : -1.5)));
  for (const row of matrix) out.push(row.map((c) => (c > 0 ? 1.4999 : -1.4999)));
  for (const row of matrix) out.push(row.map((c, i) => offsets[i]! + 1e-3 * Math.sign(c)));
  out.push(
    ...fc.sample(
      fc.array(fc.double({ min: -1.5, max: 1.5, noNaN: true }), { minLength: 6, maxLength: 6 }),
      3000,
    ),
  );
  return out;
}

function driver(prefix: string): string {
  return [
    '#include <stdio.h>',
    '#include "matrix.h"',
    'int main(void) {',
    '    double x[6];',
    '    float xf[6];',
    '    float yf[6];',
    '    double yd[6];',
    '    int i;',
    '    while (scanf("%lf %lf %lf %lf %lf %lf", &x[0], &x[1], &x[2], &x[3], &x[4], &x[5]) == 6) {',
    '        for (i = 0; i < 6; i++) xf[i] = (float)x[i];',
    `        ${prefix}_coupling_f32(xf, yf);`,
    `        ${prefix}_coupling_f64(x, yd);`,
    '        for (i = 0; i < 6; i++) printf("%.17g %.17g%s", (double)yf[i], yd[i], i == 5 ? "\\n" : " ");',
    '    }',
    '    return 0;',
    '}',
    '',
  ].join('\n');
}

const header = (m: Record<'float32' | 'float64', MatrixMap>): string =>
  `#ifndef MATRIX_H\n#define MATRIX_H\n${m.float32.cSource('rig', 'coupling')}${m.float64.cSource('rig', 'coupling')}#endif\n`;

describe('matrixMap', () => {
  it('states bounds of the size the analysis gives: about (N + 2)·u·Σ|C|·|x − a| in float32', () => {
    // float32: γ_8 ≈ 8·2⁻²⁴ ≈ 4.8e-7 of Σ|C_ji|·D_i, plus the inputs' and offsets' rounding.
    maps.float32.bounds.forEach((b, j) => {
      const sum = matrix[j]!.reduce((s, c, i) => s + Math.abs(c) * (1.5 + Math.abs(offsets[i]!)), 0);
      expect(b).toBeGreaterThan(8 * 2 ** -24 * sum * 0.9);
      expect(b).toBeLessThan(10 * 2 ** -24 * sum);
    });
    maps.float64.bounds.forEach((b, j) => expect(b).toBeLessThan(maps.float32.bounds[j]! * 2 ** -28));
    expect(maps.float64.boundParts.every((p) => p.rounding === 0)).toBe(true);
  });

  it('the compiled C (gcc, strict flags) is within the proved bound of a 60-digit evaluation, and equals evaluate() bit for bit', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const { dir, remove } = scratch();
    try {
      writeFiles(dir, { 'matrix.h': header(maps), 'driver.c': driver('rig') });
      compile('gcc', [...STRICT_FLAGS, '-O2', '-o', 'driver', 'driver.c'], dir);
      const xs = samples();
      const lines = run('./driver', xs.map((x) => x.map((v) => v.toPrecision(17)).join(' ')).join('\n'), dir)
        .trimEnd()
        .split('\n');
      expect(lines).toHaveLength(xs.length);
      const worst = { float32: [0, 0, 0, 0, 0, 0], float64: [0, 0, 0, 0, 0, 0] };
      lines.forEach((line, s) => {
        const v = line.split(' ').map(Number);
        const x = xs[s]!;
        const ref = exact(x);
        const e32 = maps.float32.evaluate(x);
        const e64 = maps.float64.evaluate(x);
        for (let j = 0; j < 6; j++) {
          const y32 = v[2 * j]!;
          const y64 = v[2 * j + 1]!;
          expect(y32).toBe(e32[j]);
          expect(y64).toBe(e64[j]);
          const err32 = Math.abs(new D(y32).minus(ref[j]!).toNumber());
          const err64 = Math.abs(new D(y64).minus(ref[j]!).toNumber());
          expect(err32).toBeLessThanOrEqual(maps.float32.bounds[j]!);
          expect(err64).toBeLessThanOrEqual(maps.float64.bounds[j]!);
          worst.float32[j] = Math.max(worst.float32[j]!, err32 / maps.float32.bounds[j]!);
          worst.float64[j] = Math.max(worst.float64[j]!, err64 / maps.float64.bounds[j]!);
        }
      });
      // The float32 bound is not vacuous: the samples reach a few percent of it.
      worst.float32.forEach((w) => expect(w).toBeGreaterThan(0.01));
    } finally {
      remove();
    }
  });

  it('compiles for a Cortex-M4F (arm-none-eabi-gcc, strict flags, -c)', (ctx) => {
    if (!needCompiler('arm-none-eabi-gcc', () => ctx.skip())) return;
    const { dir, remove } = scratch();
    try {
      writeFiles(dir, {
        'matrix.h': header(maps),
        'unit.c':
          '#include "matrix.h"\nvoid loads(const float r[6], float f[6]);\nvoid loads(const float r[6], float f[6]) { rig_coupling_f32(r, f); }\n',
      });
      compile('arm-none-eabi-gcc', [...STRICT_FLAGS, ...CORTEX_M4F_FLAGS, '-O2', '-c', 'unit.c'], dir);
    } finally {
      remove();
    }
  });

  it('refuses bad shapes, non-finite entries, empty ranges and overflow with typed errors', () => {
    const base = { matrix, offsets, inputRanges, precision: 'float32' as const };
    expect(() => matrixMap({ ...base, matrix: [[1, 2], [3]] })).toThrowBridgeworkError('invalid-shape', {
      param: 'matrix[1]',
    });
    expect(() => matrixMap({ ...base, matrix: [[Number.NaN, 1, 1, 1, 1, 1]] })).toThrowBridgeworkError(
      'not-finite',
    );
    expect(() =>
      matrixMap({ ...base, inputRanges: inputRanges.map((r, i) => (i === 2 ? { min: 1, max: -1 } : r)) }),
    ).toThrowBridgeworkError('out-of-range', { param: 'inputRanges[2]' });
    expect(() => matrixMap({ ...base, matrix: [[1e38, 1, 1, 1, 1, 1]] })).toThrowBridgeworkError(
      'out-of-range',
    );
    expect(() => matrixMap({ ...base, matrix: [[1e-50, 1, 1, 1, 1, 1]] })).toThrowBridgeworkError(
      'out-of-range',
    );
    expect(() => matrixMap({ ...base, precison: 'float32' } as never)).toThrowBridgeworkError(
      'unknown-option',
    );
    expect(() => matrixMap({ ...base, precision: 'float16' } as never)).toThrowBridgeworkError(
      'invalid-option',
    );
  });
});
