/**
 * The designed functions as compiled C: gcc with the strict flags runs every code of the range
 * through each function (the results hashed against TypeScript's, the error measured against the
 * exact map computed in the test), the emitted test program passes on the host, and the header
 * cross-compiles for a Cortex-M0+ (fixed point pulls in no floating-point routine; 32-bit forms
 * no library call at all) and a Cortex-M4F (float32 runs on the FPU, no software float).
 */
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import {
  designFirmwareConstants,
  emitCHeader,
  type DesignFirmwareConstantsOptions,
} from '@bridgework/firmware';
import { exactDecimalString } from '@bridgework/core';
import { compile, CORTEX_M4F_FLAGS, needCompiler, scratch, STRICT_FLAGS, writeFiles } from './support/cc.js';
import { D } from './support/reference.js';
import { hashOf, sweepCompiled } from './support/sweep.js';

const CORTEX_M0PLUS_FLAGS = ['-mcpu=cortex-m0plus', '-mthumb'];

/** A thermistor-like curve in a divider (invented): strongly nonlinear, 2^17 codes. */
const SPAN = { codeMin: -(2 ** 16), codeMax: 2 ** 16 - 1 };
const curve = (c: number) => {
  const r = c / 2 ** 17; // −0.5 … 0.5
  const ohms = (10000 * (1 + 1.6 * r)) / (1 - 1.6 * r);
  return 1 / (1.129241e-3 + 2.341077e-4 * Math.log(ohms) + 8.775468e-8 * Math.log(ohms) ** 3) - 273.15;
};
/** The same in decimal.js at 60 digits: Steinhart–Hart (Deep-Sea Research 15, 1968) of the divider. */
const curveExact = (c: number) => {
  const r = new D(c).div(2 ** 17);
  const ln = new D(10000)
    .times(r.times('1.6').plus(1))
    .div(new D(1).minus(r.times('1.6')))
    .ln();
  const inv = new D(exactDecimalString(1.129241e-3))
    .plus(new D(exactDecimalString(2.341077e-4)).times(ln))
    .plus(new D(exactDecimalString(8.775468e-8)).times(ln.pow(3)));
  return new D(1).div(inv).minus('273.15');
};

const options: DesignFirmwareConstantsOptions = {
  name: 'divider temperature',
  exact: curve,
  // Measured in the test below against the 60-digit evaluation: a few 1e-14 °C.
  referenceError: { bound: 1e-12, source: 'binary64 Steinhart-Hart, checked against 60 digits in the test' },
  ...SPAN,
  quantityUnit: 'degC',
  targetError: 0.01,
  outputUnit: '0.001',
};
const design = designFirmwareConstants(options);
const n = SPAN.codeMax - SPAN.codeMin + 1;
const codes = Int32Array.from({ length: n }, (_, i) => SPAN.codeMin + i);

describe('compiled functions against the exact map, every code', () => {
  it('the binary64 reference is within its stated 1e-12 °C of the 60-digit map (sampled)', () => {
    let worst = 0;
    for (let c = SPAN.codeMin; c <= SPAN.codeMax; c += 97) {
      worst = Math.max(worst, new D(exactDecimalString(curve(c))).minus(curveExact(c)).abs().toNumber());
    }
    expect(worst).toBeLessThanOrEqual(1e-12);
  });

  it('gcc -O2 (strict flags): bit for bit the library over all 131072 codes, and within each stated total', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const reference = Float64Array.from(codes, curve);
    const { dir, remove } = scratch();
    try {
      const { lines, testProgramOutput } = sweepCompiled(dir, design, codes, reference);
      for (const t of ['fixed', 'float32', 'float64'] as const) {
        const line = lines[t]!;
        const total = design.totals![t]!;
        expect(line.hash, `${t} results`).toBe(hashOf(design, t, codes));
        // Against the binary64 reference; the reference's own error is part of the stated bound.
        expect(line.maxError, t).toBeLessThanOrEqual(total.bound);
        expect(total.bound, t).toBeLessThanOrEqual(2 * line.maxError);
      }
      expect(testProgramOutput).toMatch(/^sweep test vectors: \d+ checked, 0 failed\n$/);
    } finally {
      remove();
    }
  });

  it('the test program reports a function that disagrees with its vectors', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    // Hand-edit one expected result: the program must fail, naming the function and code.
    const v = design.testVectors!;
    const edited = {
      ...design,
      testVectors: v.map((x, i) => (i === 3 ? { ...x, fixed: (x.fixed ?? 0) + 1 } : x)),
    };
    const { dir, remove } = scratch();
    try {
      const reference = Float64Array.from(codes.subarray(0, 10), curve);
      let output = '';
      try {
        sweepCompiled(dir, edited, codes.subarray(0, 10), reference);
      } catch (e) {
        output = String((e as { stdout?: string }).stdout);
      }
      expect(output).toMatch(
        /^FAIL divider_temperature fixed at code -?\d+: differs from the expected output\n/,
      );
      expect(output).toMatch(/sweep test vectors: \d+ checked, 1 failed\n$/);
    } finally {
      remove();
    }
  });
});

describe('cross-compiled for microcontrollers (arm-none-eabi-gcc, strict flags, -O2)', () => {
  function undefinedSymbols(flags: readonly string[], header: string, body: string): string[] {
    const { dir, remove } = scratch();
    try {
      writeFiles(dir, { 'constants.h': header, 'unit.c': `#include "constants.h"\n${body}\n` });
      compile('arm-none-eabi-gcc', [...flags, ...STRICT_FLAGS, '-O2', '-c', 'unit.c', '-o', 'unit.o'], dir);
      return execFileSync('arm-none-eabi-nm', ['-u', 'unit.o'], { cwd: dir, encoding: 'utf8' })
        .split('\n')
        .map((l) => l.trim().split(/\s+/).pop() ?? '')
        .filter((s) => s !== '');
    } finally {
      remove();
    }
  }

  it('Cortex-M0+: the fixed-point functions need no library routine (32-bit forms) and no float routine (64-bit)', (ctx) => {
    if (!needCompiler('arm-none-eabi-gcc', () => ctx.skip())) return;
    const header = emitCHeader({ channels: [design], prefix: 'm0', types: ['fixed'] });
    expect(design.fixed!.kind).toBe('piecewise-polynomial');
    const use = 'int32_t use(int32_t c);\nint32_t use(int32_t c) { return m0_divider_temperature_fixed(c); }';
    expect(undefinedSymbols(CORTEX_M0PLUS_FLAGS, header, use)).toEqual([]);
    // The affine form with a 64-bit accumulator: the integer multiply helper only, never floating point.
    const linear = designFirmwareConstants({
      ...options,
      exact: (c) => c * 1e-3,
      types: ['fixed'],
      targetError: 0.001,
    });
    expect(linear.fixed!.kind).toBe('affine');
    const affineHeader = emitCHeader({ channels: [linear], prefix: 'm0', types: ['fixed'] });
    const symbols = undefinedSymbols(CORTEX_M0PLUS_FLAGS, affineHeader, use);
    expect(symbols.filter((s) => /^__aeabi_[fd]/.test(s))).toEqual([]);
    expect(symbols.every((s) => s === '__aeabi_lmul')).toBe(true);
    // With a 32-bit accumulator: nothing at all.
    const narrow = designFirmwareConstants({
      ...options,
      exact: (c) => c * 1e-3,
      types: ['fixed'],
      targetError: 0.001,
      accumulatorBits: 32,
    });
    expect(
      undefinedSymbols(CORTEX_M0PLUS_FLAGS, emitCHeader({ channels: [narrow], prefix: 'm0' }), use),
    ).toEqual([]);
  });

  it('Cortex-M4F: float32 runs on the single-precision FPU (no software float), fixed point with no call', (ctx) => {
    if (!needCompiler('arm-none-eabi-gcc', () => ctx.skip())) return;
    const header = emitCHeader({ channels: [design], prefix: 'm4', types: ['fixed', 'float32'] });
    const use = [
      'int32_t use_fixed(int32_t c);',
      'int32_t use_fixed(int32_t c) { return m4_divider_temperature_fixed(c); }',
      'float use_f32(int32_t c);',
      'float use_f32(int32_t c) { return m4_divider_temperature_f32(c); }',
    ].join('\n');
    expect(undefinedSymbols(CORTEX_M4F_FLAGS, header, use)).toEqual([]);
    // The float64 function compiles too; on this FPU its operations are library calls, as its cost says.
    const all = emitCHeader({ channels: [design], prefix: 'm4' });
    const doubles = undefinedSymbols(
      CORTEX_M4F_FLAGS,
      all,
      'double use(int32_t c);\ndouble use(int32_t c) { return m4_divider_temperature_f64(c); }',
    );
    expect(doubles.some((s) => s.startsWith('__aeabi_d'))).toBe(true);
  });
});
