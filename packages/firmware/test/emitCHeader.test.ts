import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  cIdentifierFromName,
  emitCHeader,
  fixedPointMap,
  floatMap,
  type EmitOptions,
  type FirmwareChannel,
} from '@bridgework/firmware';
import {
  compile,
  CORTEX_M4F_FLAGS,
  needCompiler,
  run,
  scratch,
  STRICT_FLAGS,
  writeFiles,
} from './support/cc.js';
import { designedChannels, driverProgram, expectedLine, testChannels } from './support/channels.js';

const channels = testChannels();
const options: EmitOptions = { channels, prefix: 'hopper' };
const header = emitCHeader(options);
const identifiers = channels.map((c) => cIdentifierFromName(c.name));

/** Codes spanning each channel: both rails, just outside them, the offset, zero, random codes. */
function codesFor(ch: FirmwareChannel): number[] {
  const map = (ch.fixed ?? ch.float32 ?? ch.float64)!;
  const { codeMin, codeMax } = map;
  const offset = ch.fixed?.kind === 'affine' ? ch.fixed.offsetCode : 0;
  const special = [codeMin - 1, codeMin, codeMin + 1, codeMax - 1, codeMax, codeMax + 1, 0, offset - 2];
  special.push(offset - 1, offset, offset + 1, offset + 2);
  const random = fc.sample(fc.integer({ min: codeMin, max: codeMax }), 1500);
  return [...special, ...random].filter((c) => c >= -(2 ** 31) && c < 2 ** 31);
}

describe('emitCHeader: the generated header', () => {
  it('matches the reviewed snapshot (test/snapshots/hopper-constants.h)', async () => {
    await expect(header).toMatchFileSnapshot('snapshots/hopper-constants.h');
  });

  it('is deterministic: maps and header rebuilt from the same input give the same bytes', () => {
    expect(emitCHeader({ channels: testChannels(), prefix: 'hopper' })).toBe(header);
  });

  it('is plain ASCII with an include guard, <stdint.h>, the version and the caution', () => {
    expect(header).toMatch(/^[\n\x20-\x7e]*$/);
    expect(header).toMatch(/#ifndef HOPPER_CONSTANTS_H\n#define HOPPER_CONSTANTS_H\n/);
    expect(header.trimEnd().endsWith('#endif /* HOPPER_CONSTANTS_H */')).toBe(true);
    expect(header).toContain('#include <stdint.h>');
    expect(header).toContain('#define HOPPER_GENERATOR_VERSION "0.1.0"');
    expect(header.replace(/\n \* /g, ' ')).toMatch(/do not replace, qualified engineering judgement/);
    expect(header).toContain('static inline int32_t hopper_weight_fixed(int32_t code)');
    expect(header).toContain('static inline float hopper_weight_f32(int32_t code)');
    expect(header).toContain('static inline double hopper_weight_f64(int32_t code)');
  });

  it('writes float literals with 9 digits and f, doubles in shortest round-trip form, never a bare 2f', () => {
    const floats = [...header.matchAll(/#define \w+_F32_\w+ \(?-?([0-9.e+-]+f)\)?\n/g)].map(
      (m) => m[1] as string,
    );
    expect(floats.length).toBeGreaterThan(4);
    for (const f of floats) {
      expect(f).toMatch(/^\d+\.\d+(e[+-]\d+)?f$/); // a point and digits after it, then f
      const significant = f
        .replace(/e.*$|f$/g, '')
        .replace('.', '')
        .replace(/^0+/, '');
      if (significant === '')
        expect(f).toBe('0.00000000f'); // zero, with its nine digits
      else expect(significant.length).toBe(9);
    }
    expect(header).not.toMatch(/(?<![\w.]|e[+-])\d+f\b/); // no literal like 2f (an exponent's digits excepted)
    expect('#define X (-2f)').toMatch(/(?<![\w.]|e[+-])\d+f\b/); // the pattern does catch one
    const doubles = [...header.matchAll(/#define (\w+_F64_\w+) \(?-?([0-9.e+-]+)\)?\n/g)];
    for (const [, , text] of doubles) {
      const value = Number(text);
      expect(String(value).replace(/^(\d+)$/, '$1.0')).toBe(text); // the shortest form
    }
  });

  it('sanitises a name holding */, quotes, a backslash, a trigraph and non-ASCII letters', () => {
    expect(identifiers[1]).toBe('zelle_b_wagung_u');
    // No comment can end early: removing every /* … */ leaves no */ and no /* behind.
    const code = header.replace(/\/\*[\s\S]*?\*\//g, '');
    expect(code).not.toContain('*/');
    expect(code).not.toContain('/*');
    expect(header).not.toContain('??');
    expect(header).not.toContain('\\');
    // In the comment: '*', '?' and '\\' become '_', 'ä' → 'a', 'µ' → 'u'; quotes are harmless there.
    expect(header).toContain('Channel "Zelle "B" _/ Wagung __/ _ u"');
  });

  it('compiles under gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic, and the C equals TypeScript exactly', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const { dir, remove } = scratch();
    try {
      const driven = channels.map((c, i) => ({ ...c, identifier: identifiers[i] as string }));
      writeFiles(dir, { 'constants.h': header, 'driver.c': driverProgram('hopper', driven) });
      const input: string[] = [];
      const expected: string[] = [];
      channels.forEach((ch, i) => {
        const map = (ch.fixed ?? ch.float32 ?? ch.float64)!;
        for (const code of codesFor(ch)) {
          input.push(`${i} ${code}`);
          expected.push(expectedLine(driven[i]!, code, map.codeMin, map.codeMax));
        }
      });
      // -O0 and -O2: optimisation must not change a single bit (no contraction under -std=c99).
      for (const level of ['-O0', '-O2']) {
        compile('gcc', [...STRICT_FLAGS, level, '-o', 'driver', 'driver.c'], dir);
        const out = run(join(dir, 'driver'), `${input.join('\n')}\n`, dir)
          .trimEnd()
          .split('\n');
        expect(out.length).toBe(expected.length);
        for (let k = 0; k < out.length; k++)
          if (out[k] !== expected[k]) expect(`${input[k]}: ${out[k]}`).toBe(`${input[k]}: ${expected[k]}`);
      }
    } finally {
      remove();
    }
  });

  it('compiles for a Cortex-M4F with arm-none-eabi-gcc (-c, strict flags)', (ctx) => {
    if (!needCompiler('arm-none-eabi-gcc', () => ctx.skip())) return;
    const { dir, remove } = scratch();
    try {
      // Non-static wrappers make the compiler generate every evaluator.
      const uses = identifiers.flatMap((id, i) => {
        const ch = channels[i]!;
        const out = [`int32_t use_${id}_fixed(int32_t c) { return hopper_${id}_fixed(c); }`];
        if (ch.float32 !== undefined)
          out.push(`float use_${id}_f32(int32_t c) { return hopper_${id}_f32(c); }`);
        if (ch.float64 !== undefined)
          out.push(`double use_${id}_f64(int32_t c) { return hopper_${id}_f64(c); }`);
        return out;
      });
      const prototypes = uses.map((u) => `${u.slice(0, u.indexOf(')') + 1)};`);
      writeFiles(dir, {
        'constants.h': header,
        'unit.c': `#include "constants.h"\n${prototypes.join('\n')}\n${uses.join('\n')}\n`,
      });
      for (const level of ['-O0', '-O2']) {
        compile(
          'arm-none-eabi-gcc',
          [...CORTEX_M4F_FLAGS, ...STRICT_FLAGS, level, '-c', 'unit.c', '-o', 'unit.o'],
          dir,
        );
      }
    } finally {
      remove();
    }
  });
});

describe('emitCHeader: channels designed against an exact map', () => {
  const designed = designedChannels();
  const text = emitCHeader({ channels: designed, prefix: 'plant' });
  const unwrapped = text.replace(/\n \* /g, ' ');

  it('matches the reviewed snapshot (test/snapshots/designed-constants.h)', async () => {
    expect(designed[0]!.fixed!.kind).toBe('piecewise-polynomial');
    expect(designed[1]!.float64!.kind).toBe('mobius');
    await expect(text).toMatchFileSnapshot('snapshots/designed-constants.h');
  });

  it('states each function’s total error first, its parts as parts, its cost, and a macro with the bound', () => {
    for (const ch of designed) {
      for (const t of ['fixed', 'float32', 'float64'] as const) {
        if (ch[t] === undefined) continue;
        const total = ch.totals![t]!;
        const { P } = {
          P: `PLANT_${cIdentifierFromName(ch.name).toUpperCase()}_${t === 'fixed' ? 'FIXED' : t === 'float32' ? 'F32' : 'F64'}`,
        };
        expect(text).toContain(`#define ${P}_TOTAL_ERROR ${String(total.bound).replace(/^(\d+)$/, '$1.0')}`);
      }
    }
    expect(unwrapped).toMatch(
      /TOTAL ERROR: \|0\.001 \* output - exact map\| <= [\d.e-]+ degC over the whole code range, proved: every one of the 4096 codes/,
    );
    expect(unwrapped).toMatch(/Parts of it \(not the error\): approximation \(/);
    expect(unwrapped).toMatch(/plus 1e-12 degC for the exact map's own error \(three binary64 operations/);
    // The second channel stated no reference error: the header says so instead of hiding it.
    expect(unwrapped).toMatch(/the exact map's own error is not included \(none stated\)/);
    expect(unwrapped).toMatch(/Cost: \d+ bytes of constants; per conversion /);
    // The old wording that called an arithmetic figure "the error against the exact map" is gone.
    expect(text).not.toMatch(/Max \|y - exact map\|/);
  });

  it('compiles under the strict flags, equals TypeScript at every code at -O0 and -O2, and for Cortex-M0+ and M4F', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const { dir, remove } = scratch();
    try {
      const driven = designed.map((c) => ({ ...c, identifier: cIdentifierFromName(c.name) }));
      writeFiles(dir, { 'constants.h': text, 'driver.c': driverProgram('plant', driven) });
      const input: string[] = [];
      const expected: string[] = [];
      designed.forEach((ch, i) => {
        const { codeMin, codeMax } = (ch.fixed ?? ch.float64)!;
        for (let code = codeMin - 1; code <= codeMax + 1; code++) {
          input.push(`${i} ${code}`);
          expected.push(expectedLine(driven[i]!, code, codeMin, codeMax));
        }
      });
      for (const level of ['-O0', '-O2']) {
        compile('gcc', [...STRICT_FLAGS, level, '-o', 'driver', 'driver.c'], dir);
        const out = run(join(dir, 'driver'), `${input.join('\n')}\n`, dir)
          .trimEnd()
          .split('\n');
        expect(out.length).toBe(expected.length);
        for (let k = 0; k < out.length; k++)
          if (out[k] !== expected[k]) expect(`${input[k]}: ${out[k]}`).toBe(`${input[k]}: ${expected[k]}`);
      }
    } finally {
      remove();
    }
  });
});

describe('emitCHeader: options', () => {
  const fixed = fixedPointMap({ scale: '1/3', outputUnit: '1', codeMin: 0, codeMax: 100 });
  const f32 = floatMap({ kind: 'affine', scale: '1/3', precision: 'float32', codeMin: 0, codeMax: 100 });
  const f64 = floatMap({ kind: 'affine', scale: '1/3', precision: 'float64', codeMin: 0, codeMax: 100 });

  it('writes only the requested types, and the default prefix', () => {
    const text = emitCHeader({
      channels: [{ name: 'Weight', fixed, float32: f32, float64: f64 }],
      types: ['float32'],
    });
    expect(text).toContain('bridgework_weight_f32');
    expect(text).not.toContain('bridgework_weight_fixed');
    expect(text).not.toContain('bridgework_weight_f64');
    expect(text).toContain('#ifndef BRIDGEWORK_CONSTANTS_H');
  });

  it.each([
    ['prefix', 'upper case', { prefix: 'Hopper' }, 'invalid-option'],
    ['prefix', 'leading digit', { prefix: '1st' }, 'invalid-option'],
    ['prefix', 'double underscore', { prefix: 'a__b' }, 'invalid-option'],
    ['prefix', '25 characters', { prefix: 'x'.repeat(25) }, 'invalid-option'],
    ['channels', 'no channels', { channels: [] }, 'invalid-shape'],
    ['channels', 'not an array', { channels: 'weight' }, 'invalid-shape'],
    ['types', 'empty', { types: [] }, 'invalid-shape'],
    ['types', 'repeated', { types: ['fixed', 'fixed'] }, 'invalid-option'],
    ['types[0]', 'unknown type', { types: ['float16'] }, 'invalid-option'],
    ['channels[0].float64', 'requested, absent', { types: ['float64'] }, 'missing-option'],
    ['channels[0].name', 'no letter or digit', { channels: [{ name: '***', fixed }] }, 'invalid-option'],
    ['channels[0].name', 'a number', { channels: [{ name: 7, fixed }] }, 'wrong-type'],
    ['channels[0]', 'no map', { channels: [{ name: 'Weight' }] }, 'missing-option'],
    [
      'channels[1].name',
      'same identifier',
      {
        channels: [
          { name: 'Weight', fixed },
          { name: 'weight!', fixed },
        ],
      },
      'conflicting-options',
    ],
    [
      'channels[0].float32.precision',
      'a float64 map as float32',
      { channels: [{ name: 'Weight', float32: f64 }] },
      'invalid-option',
    ],
    [
      'channels[0]',
      'ranges differ',
      { channels: [{ name: 'Weight', fixed, float32: { ...f32, codeMax: 99 } }] },
      'conflicting-options',
    ],
    [
      'channels[0].fixed',
      'edited to overflow',
      { channels: [{ name: 'Weight', fixed: { ...fixed, accumulatorBits: 33, shift: 31 } }] },
      'overflow',
    ],
    [
      'channels[0].fixed.shift',
      'shift beyond the accumulator',
      { channels: [{ name: 'Weight', fixed: { ...fixed, shift: 63 } }] },
      'out-of-range',
    ],
    [
      'channels[0].float32',
      'a constant that is not a float32',
      { channels: [{ name: 'Weight', float32: { ...f32, scale: 0.1 } }] },
      'invalid-option',
    ],
  ] as const)('%s (%s) → %s', (param, _what, patch, code) => {
    const base = { channels: [{ name: 'Weight', fixed }] };
    expect(() => emitCHeader({ ...base, ...patch } as unknown as EmitOptions)).toThrowBridgeworkError(code, {
      param,
    });
  });
});
