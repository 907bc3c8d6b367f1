import { BridgeworkError } from '@bridgework/core';
import type { cIdentifierFromName } from './cIdentifierFromName.js';
import type { EmitOptions } from './emitOptions.js';
import type { FixedPointMap } from './fixedPointMap.js';
import type { FloatMap, FloatMapBase } from './floatMap.js';
import { emitModel, type EmittedChannel } from './internal/channels.js';
import { doubleLiteral, floatLiteral, intLiteral } from './internal/cLiterals.js';
import { boundString, shortString } from './internal/decimal.js';
import { rationalFromNumber } from './internal/exact.js';
import { commentText } from './internal/text.js';
import type { FixedPointRounding } from './roundShift.js';
import type { Verification } from './verification.js';
import { FIRMWARE_GENERATOR_VERSION } from './version.js';

/** The caution every generated file carries (docs/safety.md). */
export const FIRMWARE_CAUTION =
  'Results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.';

const INDENT = '    ';

function bound(x: number): string {
  return boundString(rationalFromNumber(x));
}

function unitText(unit: string): string {
  const u = commentText(unit, 24);
  return u === '' ? '(unit not stated)' : u;
}

/** Wraps comment text at about 96 columns, every line starting with ` * `. */
function commentLines(text: string): string[] {
  const words = text.split(' ');
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line !== '' && line.length + 1 + w.length > 92) {
      lines.push(` * ${line}`);
      line = w;
    } else {
      line = line === '' ? w : `${line} ${w}`;
    }
  }
  if (line !== '') lines.push(` * ${line}`);
  return lines;
}

function block(paragraphs: readonly string[]): string[] {
  // Every user text went through commentText; this guards the generator's own wording.
  if (paragraphs.some((p) => p.includes('/*') || p.includes('*/'))) throw new Error('comment text nests');
  const out = ['/*'];
  paragraphs.forEach((p, i) => {
    if (i > 0) out.push(' *');
    out.push(...commentLines(p));
  });
  out.push(' */');
  return out;
}

type Width = 32 | 64;

function widthOf(map: FixedPointMap): Width {
  return map.accumulatorBits <= 32 ? 32 : 64;
}

/** The helper that applies a rounding: floor is the floor shift itself. */
function helperName(prefix: string, rounding: FixedPointRounding, width: Width): string {
  const base = rounding === 'floor' ? 'floor_shift' : `round_${rounding.replace('-', '_')}`;
  return `${prefix}_${base}_i${width}`;
}

/** The rounding as named in comments. */
const roundingWords: Readonly<Record<FixedPointRounding, string>> = {
  'half-even': 'round_half_even',
  'half-away': 'round_half_away',
  floor: 'floor',
};

/** The rounding helpers one accumulator width needs, in a fixed order. */
function helpers(prefix: string, width: Width, roundings: ReadonlySet<FixedPointRounding>): string[] {
  const T = `int${width}_t`;
  const U = `uint${width}_t`;
  const floor = helperName(prefix, 'floor', width);
  const out: string[] = [];
  if (roundings.has('floor') || roundings.has('half-even')) {
    out.push(
      `/* floor(n / 2^s) for 1 <= s <= ${width - 2}. Only non-negative values are shifted: C99 (6.5.7) leaves the`,
      ' * right shift of a negative value implementation-defined; for n < 0, floor(n / 2^s) is',
      ' * -floor((-n - 1) / 2^s) - 1, and -(n + 1) cannot overflow. */',
      `static inline ${T} ${floor}(${T} n, int s)`,
      '{',
      `${INDENT}return n >= 0 ? (n >> s) : -((-(n + 1)) >> s) - 1;`,
      '}',
      '',
    );
  }
  if (roundings.has('half-away')) {
    out.push(
      `/* round(n / 2^s), halves away from zero, for 1 <= s <= ${width - 2}; the generator proved that`,
      ' * |n| + 2^(s-1) fits. */',
      `static inline ${T} ${helperName(prefix, 'half-away', width)}(${T} n, int s)`,
      '{',
      `${INDENT}const ${T} half = (${T})1 << (s - 1);`,
      `${INDENT}return n >= 0 ? ((n + half) >> s) : -((half - n) >> s);`,
      '}',
      '',
    );
  }
  if (roundings.has('half-even')) {
    out.push(
      `/* round(n / 2^s), halves to even, for 1 <= s <= ${width - 2}; the generator proved that n + 2^(s-1)`,
      ' * fits. An exact half leaves n + 2^(s-1) a multiple of 2^s: its low bits, read through the',
      ' * unsigned type (a conversion C99 6.3.1.3 defines modulo 2^N), are zero. */',
      `static inline ${T} ${helperName(prefix, 'half-even', width)}(${T} n, int s)`,
      '{',
      `${INDENT}const ${T} half = (${T})1 << (s - 1);`,
      `${INDENT}const ${T} q = ${floor}(n + half, s);`,
      `${INDENT}const ${U} low = (${U})(n + half) & (((${U})1 << s) - 1u);`,
      `${INDENT}return (low == 0u && ((${U})q & 1u) != 0u) ? q - 1 : q;`,
      '}',
      '',
    );
  }
  return out;
}

/** How a bound was obtained, for the comments. */
function verificationText(maxAbs: number, analytic: number, v: Verification, unit: string): string {
  const worst = `largest at code ${v.worstCode}: ${shortString(v.worstError)} ${unit}`;
  return v.method === 'exhaustive'
    ? `<= ${bound(maxAbs)} ${unit}, proved by evaluating all ${v.codesChecked} codes (${worst}); the analytic bound is ${bound(analytic)} ${unit}.`
    : `<= ${bound(maxAbs)} ${unit}, the analytic bound, checked on ${v.codesChecked} sampled codes (${worst}).`;
}

function fixedSection(prefix: string, ch: EmittedChannel, map: FixedPointMap): string[] {
  const P = `${prefix}_${ch.identifier}`.toUpperCase();
  const fn = `${prefix}_${ch.identifier}_fixed`;
  const width = widthOf(map);
  const T = `int${width}_t`;
  const unit = unitText(ch.quantityUnit);
  const how = verificationText(map.maxAbsError, map.errorBound, map.verification, 'LSB');
  const total =
    map.totalError === undefined
      ? []
      : [
          `Against the reference map: max |error| <= ${bound(map.totalError.maxAbsError)} LSB (${map.totalError.method}, ${map.totalError.codesChecked} codes).`,
        ];
  const lines = block([
    `Fixed point: output = ${roundingWords[map.rounding]}(((code - ${P}_OFFSET_CODE) * ${P}_MULTIPLIER + ${P}_BIAS) / 2^${P}_SHIFT), in output LSB of ${map.source.outputUnit} ${unit}.`,
    `Source values: scale ${map.source.scale} ${unit} per code; offset ${map.source.offset} codes; output LSB ${map.source.outputUnit} ${unit}; exact multiplier ${map.source.multiplierExact} (scale / LSB * 2^${map.shift}).`,
    `Multiplier ${map.qFormat.text} in a ${map.coefficientBits}-bit word. Accumulator ${T}${map.accumulatorBits < width ? `, held within ${map.accumulatorBits} bits` : ''}: values in [${map.accumulatorRange.min}, ${map.accumulatorRange.max}], limit +-${map.accumulatorLimit}. Outputs in [${map.outputRange.min}, ${map.outputRange.max}] (${map.outputBits}-bit).`,
    `Max |output - (code - offset) * scale / LSB| ${how}`,
    ...total,
  ]);
  const rounding =
    map.shift === 0
      ? `${INDENT}return (int32_t)acc;`
      : `${INDENT}return (int32_t)${helperName(prefix, map.rounding, width)}(acc, ${P}_SHIFT);`;
  const accumulate =
    width === 64
      ? [`${INDENT}const int64_t acc = ((int64_t)code - ${P}_OFFSET_CODE) * ${P}_MULTIPLIER + ${P}_BIAS;`]
      : [
          `${INDENT}const int32_t d = (int32_t)((int64_t)code - ${P}_OFFSET_CODE);`,
          `${INDENT}const int32_t acc = d * ${P}_MULTIPLIER + ${P}_BIAS;`,
        ];
  return [
    ...lines,
    `#define ${P}_OFFSET_CODE ${intLiteral(map.offsetCode, 64)}`,
    `#define ${P}_MULTIPLIER ${intLiteral(map.multiplier, 32)}`,
    `#define ${P}_BIAS ${intLiteral(map.bias, width)}`,
    `#define ${P}_SHIFT ${map.shift}`,
    '',
    `static inline int32_t ${fn}(int32_t code)`,
    '{',
    ...accumulate,
    rounding,
    '}',
    '',
  ];
}

function floatSection(prefix: string, ch: EmittedChannel, map: FloatMap): string[] {
  const f32 = map.precision === 'float32';
  const tag = f32 ? 'F32' : 'F64';
  const P = `${prefix}_${ch.identifier}_${tag}`.toUpperCase();
  const fn = `${prefix}_${ch.identifier}_${tag.toLowerCase()}`;
  const T = f32 ? 'float' : 'double';
  const lit = f32 ? floatLiteral : doubleLiteral;
  const unit = unitText(ch.quantityUnit);
  const how = verificationText(map.maxAbsError, map.errorBound, map.verification, unit);
  const coefficients = map.kind === 'affine' ? [map.scale] : map.coefficients;
  const formula =
    map.kind === 'affine'
      ? `y = ((${T})code - ${P}_OFFSET) * ${P}_SCALE`
      : `y = sum of ${P}_C<k> * x^k with x = (${T})code - ${P}_OFFSET, by Horner's rule`;
  const source =
    map.kind === 'affine'
      ? `scale ${map.source.coefficients[0]} ${unit} per code`
      : `coefficients ${map.source.coefficients.map((c, k) => `c${k} = ${c}`).join(', ')} (${unit} per code^k)`;
  const total =
    map.totalError === undefined
      ? []
      : [
          `Against the reference map: max |error| <= ${bound(map.totalError.maxAbsError)} ${unit} (${map.totalError.method}, ${map.totalError.codesChecked} codes).`,
        ];
  const lines = block([
    `${f32 ? 'float32' : 'float64'}: ${formula}, in ${unit}; every operation rounded in ${T}.`,
    `Source values: ${source}; offset ${map.source.offset} codes.`,
    `Max |y - exact map| ${how}`,
    ...total,
  ]);
  const defines =
    map.kind === 'affine'
      ? [`#define ${P}_OFFSET ${lit(map.offset)}`, `#define ${P}_SCALE ${lit(map.scale)}`]
      : [
          `#define ${P}_OFFSET ${lit(map.offset)}`,
          ...coefficients.map((c, k) => `#define ${P}_C${k} ${lit(c)}`),
        ];
  let body: string[];
  if (map.kind === 'affine') {
    body = [`${INDENT}const ${T} x = (${T})code - ${P}_OFFSET;`, `${INDENT}return x * ${P}_SCALE;`];
  } else if (coefficients.length === 1) {
    body = [`${INDENT}(void)code;`, `${INDENT}return ${P}_C0;`];
  } else {
    const n = coefficients.length - 1;
    body = [`${INDENT}const ${T} x = (${T})code - ${P}_OFFSET;`, `${INDENT}${T} y = ${P}_C${n};`];
    for (let k = n - 1; k >= 0; k--) body.push(`${INDENT}y = y * x + ${P}_C${k};`);
    body.push(`${INDENT}return y;`);
  }
  return [...lines, ...defines, '', `static inline ${T} ${fn}(int32_t code)`, '{', ...body, '}', ''];
}

function channelSection(prefix: string, ch: EmittedChannel): string[] {
  const P = `${prefix}_${ch.identifier}`.toUpperCase();
  const out = [
    '/* ------------------------------------------------------------------------------------------ */',
    ...block([
      `Channel "${commentText(ch.name)}" (identifier ${ch.identifier}); quantity in ${unitText(ch.quantityUnit)}.`,
      `Defined for codes ${ch.codeMin} to ${ch.codeMax}: check with ${prefix}_${ch.identifier}_in_range() first; nothing is clamped.`,
    ]),
    `#define ${P}_CODE_MIN ${intLiteral(ch.codeMin, 32)}`,
    `#define ${P}_CODE_MAX ${intLiteral(ch.codeMax, 32)}`,
    '',
    `static inline int ${prefix}_${ch.identifier}_in_range(int32_t code)`,
    '{',
    `${INDENT}return code >= ${P}_CODE_MIN && code <= ${P}_CODE_MAX;`,
    '}',
    '',
  ];
  if (ch.fixed !== undefined) out.push(...fixedSection(prefix, ch, ch.fixed));
  if (ch.float32 !== undefined) out.push(...floatSection(prefix, ch, ch.float32));
  if (ch.float64 !== undefined) out.push(...floatSection(prefix, ch, ch.float64));
  return out;
}

/**
 * Writes a C99 header with the constants and `static inline` evaluators of one or more channels.
 *
 * @remarks
 * The header has an include guard `<PREFIX>_CONSTANTS_H`, includes only `<stdint.h>`, and for each
 * channel defines its code range, an `_in_range` test, and the requested evaluators:
 * `<prefix>_<channel>_fixed(int32_t code) → int32_t` (output LSB), `_f32(int32_t code) → float` and
 * `_f64(int32_t code) → double` (quantity). Comments state the units, the exact source values, the
 * Q-format, the accumulator and output ranges, the proved error bounds with how they were obtained,
 * the generator version and the safety caution. Integer constants use `INT32_C`/`INT64_C`; float
 * literals have 9 significant digits and an `f` suffix, doubles the shortest round-trip form.
 *
 * Portability: fixed-point evaluators use only operations C99 defines exactly (no right shift of a
 * negative value, no signed overflow — the generator proved every intermediate fits), so they give
 * the same integers on every target and equal {@link FixedPointMap.evaluate}. Float evaluators equal
 * {@link FloatMapBase.evaluate} bit for bit where `float`/`double` are IEEE 754 binary32/binary64,
 * FLT_EVAL_METHOD is 0 and multiply-adds are not contracted (gcc `-std=c99` implies
 * `-ffp-contract=off`; `-std=gnu99 -O2` may fuse them). The output compiles without warnings under
 * `gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic` and for a Cortex-M4F
 * (`arm-none-eabi-gcc -mcpu=cortex-m4 -mfpu=fpv4-sp-d16 -mfloat-abi=hard`), as the tests check.
 * Output is deterministic: the same input gives the same bytes (no dates, no environment).
 *
 * Names: identifiers come from {@link cIdentifierFromName}; comments show names and units
 * sanitised to printable ASCII without `*`, `\` or `?`, so no text can end a comment early, splice
 * a line or form a trigraph.
 *
 * @param options - Channels, prefix, and which evaluator types to write.
 * @returns The header text (ASCII, `\n` line ends, ending with a newline).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for an empty channel list or types;
 *   `invalid-option` for a bad prefix, type, name or map; `conflicting-options` when two names give
 *   one identifier or a channel's maps differ in code range or unit; `missing-option` when a
 *   requested type is absent; `overflow` when a (hand-edited) fixed-point map would overflow.
 * @example
 * ```ts
 * const fixed = fixedPointMap({ scale: '50/2147483.648', outputUnit: '0.00001', codeMin: -8388608, codeMax: 8388607, quantityUnit: 'kg' });
 * const header = emitCHeader({ channels: [{ name: 'Weight', fixed }], prefix: 'hopper' });
 * // … static inline int32_t hopper_weight_fixed(int32_t code) …
 * ```
 */
export function emitCHeader(options: EmitOptions): string {
  const { prefix, channels } = emitModel(options);
  const guard = `${prefix.toUpperCase()}_CONSTANTS_H`;
  const fixedMaps = channels.flatMap((c) => (c.fixed === undefined ? [] : [c.fixed]));
  const helperText: string[] = [];
  for (const width of [32, 64] as const) {
    const roundings = new Set(
      fixedMaps.filter((m) => widthOf(m) === width && m.shift > 0).map((m) => m.rounding),
    );
    helperText.push(...helpers(prefix, width, roundings));
  }
  const lines = [
    ...block([
      `Conversion constants from converter codes to engineering units, ${channels.length} channel${channels.length === 1 ? '' : 's'}.`,
      `Generated by @bridgework/firmware ${FIRMWARE_GENERATOR_VERSION}; do not edit, regenerate instead.`,
      `Caution. ${FIRMWARE_CAUTION}`,
      'Fixed-point evaluators use exact integer arithmetic that C99 fully defines: the same result on every target. Float evaluators match the generator bit for bit where float and double are IEEE 754 binary32 and binary64, FLT_EVAL_METHOD is 0 and a*b+c is not contracted to a fused multiply-add (gcc: -std=c99, or -ffp-contract=off).',
    ]),
    `#ifndef ${guard}`,
    `#define ${guard}`,
    '',
    '#include <stdint.h>',
    '',
    `#define ${prefix.toUpperCase()}_GENERATOR_VERSION "${FIRMWARE_GENERATOR_VERSION}"`,
    '',
    ...helperText,
    ...channels.flatMap((c) => channelSection(prefix, c)),
    `#endif /* ${guard} */`,
  ];
  checkDistinctNames(lines);
  return `${lines.join('\n')}\n`;
}

/**
 * Every macro and function name must be defined once. Identifiers are distinct by construction
 * (channel names are distinct and every channel name carries a suffix), so this guards the guard.
 */
function checkDistinctNames(lines: readonly string[]): void {
  const seen = new Set<string>();
  for (const line of lines) {
    const name = /^#define (\w+)/.exec(line)?.[1] ?? /^static inline \w+ (\w+)\(/.exec(line)?.[1];
    if (name === undefined) continue;
    if (seen.has(name)) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`channels\` must give distinct C names; '${name}' repeats`,
        {
          param: 'channels',
          value: name,
        },
      );
    }
    seen.add(name);
  }
}
