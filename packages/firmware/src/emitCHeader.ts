import { BridgeworkError } from '@bridgework/core';
import type { cIdentifierFromName } from './cIdentifierFromName.js';
import type { designFirmwareConstants } from './designFirmwareConstants.js';
import type { EmitOptions, EvaluatorType } from './emitOptions.js';
import type { FixedPiecewiseMap } from './fixedPiecewiseMap.js';
import type { FixedPointMap } from './fixedPointMap.js';
import type { FloatMap } from './floatMap.js';
import type { FloatMobiusMap } from './floatMobiusMap.js';
import type { FloatPiecewiseMap } from './floatPiecewiseMap.js';
import { emitModel, type EmittedChannel } from './internal/channels.js';
import { doubleLiteral, floatLiteral, intLiteral } from './internal/cLiterals.js';
import { block, cFloatType, costText, INDENT, ownErrorText, totalText, unitText } from './internal/cText.js';
import { commentText } from './internal/text.js';
import { segmentCodesUnchecked } from './piecewisePolynomial.js';
import type { FixedPointRounding } from './roundShift.js';
import type { TotalErrorBound } from './totalError.js';
import { FIRMWARE_GENERATOR_VERSION } from './version.js';

/** The caution every generated file carries (docs/safety.md). */
export const FIRMWARE_CAUTION =
  'Results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.';

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
      `/* floor(n / 2^s) for 0 <= s <= ${width - 2}. Only non-negative values are shifted: C99 (6.5.7) leaves the`,
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

/** The macro prefix and function name of one evaluator of a channel. */
function names(prefix: string, ch: EmittedChannel, type: EvaluatorType): { P: string; fn: string } {
  const tag = type === 'fixed' ? 'FIXED' : type === 'float32' ? 'F32' : 'F64';
  return {
    P: `${prefix}_${ch.identifier}_${tag}`.toUpperCase(),
    fn: `${prefix}_${ch.identifier}_${type === 'fixed' ? 'fixed' : tag.toLowerCase()}`,
  };
}

/** The total-error macro of a function, when it has a total. */
function totalMacro(P: string, total: TotalErrorBound | undefined): string[] {
  return total === undefined ? [] : [`#define ${P}_TOTAL_ERROR ${doubleLiteral(total.bound)}`];
}

/**
 * One evaluator's section as every form writes it: the comment block, the macros, the total-error
 * macro, then `static inline <type> <name>(int32_t code)` with its body.
 */
function functionText(
  comment: readonly string[],
  macros: readonly string[],
  P: string,
  total: TotalErrorBound | undefined,
  returnType: string,
  fn: string,
  body: readonly string[],
): string[] {
  return [
    ...comment,
    ...macros,
    ...totalMacro(P, total),
    '',
    `static inline ${returnType} ${fn}(int32_t code)`,
    '{',
    ...body,
    '}',
    '',
  ];
}

/** The names, C type, unit and total a floating-point evaluator's section starts from. */
function floatParts(prefix: string, ch: EmittedChannel, type: 'float32' | 'float64') {
  const { P, fn } = names(prefix, ch, type);
  return { P, fn, T: cFloatType(type), unit: unitText(ch.quantityUnit), total: ch.totals[type] };
}

/** Segment index and centred t in C (see PiecewisePolynomial). */
function segmentLines(P: string, bits: number): string[] {
  const mask = (2 ** bits - 1).toString(16).toUpperCase();
  return [
    `${INDENT}const uint32_t u = (uint32_t)code - (uint32_t)${P}_SEGMENT_BASE;`,
    `${INDENT}const uint32_t i = u >> ${bits};`,
    `${INDENT}const int32_t t = (int32_t)(u & UINT32_C(0x${mask})) - INT32_C(${2 ** (bits - 1)});`,
  ];
}

function segmentText(m: FixedPiecewiseMap | FloatPiecewiseMap, P: string): string {
  const bits = m.segmentBits;
  const count = m.segmentCount === 1 ? 'one segment' : `${m.segmentCount} segments`;
  return `${count} of 2^${bits} codes from ${P}_SEGMENT_BASE = ${m.segmentBase}: segment i = (code - SEGMENT_BASE) >> ${bits}, and t = ((code - SEGMENT_BASE) & (2^${bits} - 1)) - 2^${bits - 1}, the code relative to the segment's centre.`;
}

const DEGREE = ['constant', 'linear', 'quadratic', 'cubic', 'quartic', 'quintic'];

function fixedAffineSection(prefix: string, ch: EmittedChannel, map: FixedPointMap): string[] {
  const P = `${prefix}_${ch.identifier}`.toUpperCase();
  const { P: PF, fn } = names(prefix, ch, 'fixed');
  const width = widthOf(map);
  const T = `int${width}_t`;
  const unit = unitText(ch.quantityUnit);
  const total = ch.totals.fixed;
  const error =
    total === undefined
      ? [
          ownErrorText(
            map.maxAbsError,
            map.errorBound,
            map.verification,
            'LSB',
            '(code - offset) * scale / LSB',
          ),
        ]
      : totalText(total, unit, `${map.source.outputUnit} * output`, 'the line (code - offset) * scale');
  const lines = block([
    `${fn}: fixed point, affine. output = ${roundingWords[map.rounding]}(((code - ${P}_OFFSET_CODE) * ${P}_MULTIPLIER + ${P}_BIAS) / 2^${P}_SHIFT), an integer number of output steps of ${map.source.outputUnit} ${unit}.`,
    ...error,
    `Source values: scale ${map.source.scale} ${unit} per code; offset ${map.source.offset} codes; output step ${map.source.outputUnit} ${unit}; exact multiplier ${map.source.multiplierExact} (scale / step * 2^${map.shift}).`,
    `Multiplier ${map.qFormat.text} in a ${map.coefficientBits}-bit word. Accumulator ${T}${map.accumulatorBits < width ? `, held within ${map.accumulatorBits} bits` : ''}: values in [${map.accumulatorRange.min}, ${map.accumulatorRange.max}], limit +-${map.accumulatorLimit}. Outputs in [${map.outputRange.min}, ${map.outputRange.max}] (${map.outputBits}-bit).`,
    costText(map),
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
  const macros = [
    `#define ${P}_OFFSET_CODE ${intLiteral(map.offsetCode, 64)}`,
    `#define ${P}_MULTIPLIER ${intLiteral(map.multiplier, 32)}`,
    `#define ${P}_BIAS ${intLiteral(map.bias, width)}`,
    `#define ${P}_SHIFT ${map.shift}`,
    `#define ${PF}_OUTPUT_UNIT ${doubleLiteral(Number(map.source.outputUnit))}`,
  ];
  return functionText(lines, macros, PF, total, 'int32_t', fn, [...accumulate, rounding]);
}

/** Row of a table with a trailing comment, aligned for reading. */
function tableRow(values: readonly string[], comment: string): string {
  return `${INDENT}${INDENT}{ ${values.join(', ')} }, /* ${comment} */`;
}

function fixedPiecewiseSection(prefix: string, ch: EmittedChannel, map: FixedPiecewiseMap): string[] {
  const { P, fn } = names(prefix, ch, 'fixed');
  const unit = unitText(ch.quantityUnit);
  const n = map.degree;
  const total = ch.totals.fixed;
  const word = map.coefficientBits <= 8 ? 'int8_t' : map.coefficientBits <= 16 ? 'int16_t' : 'int32_t';
  const floor = helperName(prefix, 'floor', 32);
  const error =
    total === undefined
      ? [
          ownErrorText(
            map.arithmeticBound,
            map.arithmeticBound,
            undefined,
            'LSB',
            'the piecewise polynomial / output step',
          ),
        ]
      : totalText(
          total,
          unit,
          `${map.outputUnit} * output`,
          `the piecewise ${DEGREE[n] as string} polynomial as fitted`,
        );
  const steps = Array.from({ length: n }, (_, k) => n - 1 - k)
    .map((j) => `y = floor(y * t / 2^S[i][${j}]) + C[i][${j}]`)
    .join('; ');
  const lines = block([
    `${fn}: fixed point, piecewise ${DEGREE[n] as string} polynomial; output is an integer number of output steps of ${map.outputUnit} ${unit}, rounded to nearest (halves up).`,
    ...error,
    `Form: ${segmentText(map, P)} Horner's rule in int32_t: y = C[i][${n}]; ${steps}; output = floor(y / 2^S[i][${n}]) (C[i][0] holds the rounding half).`,
    `Coefficients: ${word} words (${map.coefficientBits} bits); coefficient j of segment i is C[i][j] / 2^f with its own fraction bits f per segment (Q-format Q(${map.coefficientBits - 1}-f).f), f listed per row. Every product y * t and every sum is an int32_t, proved to stay within +-2147483647 for every code of its segment (largest bound ${map.accumulatorBound}); no 64-bit arithmetic, no division.`,
    costText(map),
  ]);
  const rows = map.segments.map((s, i) => {
    const codes = segmentCodesUnchecked(map, i);
    return tableRow(
      s.coefficients.map((c) => String(c)),
      `${i}: codes ${codes.first}..${codes.last}, f = ${s.fractionBits.join(', ')}`,
    );
  });
  const shiftRows = map.segments.map((s, i) => tableRow(s.shifts.map(String), String(i)));
  const body = [`${INDENT}int32_t y = C[i][${n}];`];
  for (let j = n - 1; j >= 0; j--) body.push(`${INDENT}y = ${floor}(y * t, S[i][${j}]) + C[i][${j}];`);
  body.push(`${INDENT}return ${floor}(y, S[i][${n}]);`);
  const macros = [
    `#define ${P}_SEGMENT_BASE ${intLiteral(map.segmentBase, 32)}`,
    `#define ${P}_OUTPUT_UNIT ${doubleLiteral(Number(map.outputUnit))}`,
  ];
  return functionText(lines, macros, P, total, 'int32_t', fn, [
    `${INDENT}static const ${word} C[${map.segmentCount}][${n + 1}] = {`,
    ...rows,
    `${INDENT}};`,
    `${INDENT}static const uint8_t S[${map.segmentCount}][${n + 1}] = {`,
    ...shiftRows,
    `${INDENT}};`,
    ...segmentLines(P, map.segmentBits),
    ...(n === 0 ? [`${INDENT}(void)t;`] : []),
    ...body,
  ]);
}

function floatSection(prefix: string, ch: EmittedChannel, map: FloatMap): string[] {
  const type = map.precision;
  const { P, fn, T, unit, total } = floatParts(prefix, ch, type);
  const lit = type === 'float32' ? floatLiteral : doubleLiteral;
  const coefficients = map.kind === 'affine' ? [map.scale] : map.coefficients;
  const formula =
    map.kind === 'affine'
      ? `y = ((${T})code - ${P}_OFFSET) * ${P}_SCALE`
      : `y = sum of ${P}_C<k> * x^k with x = (${T})code - ${P}_OFFSET, by Horner's rule`;
  const source =
    map.kind === 'affine'
      ? `scale ${map.source.coefficients[0]} ${unit} per code`
      : `coefficients ${map.source.coefficients.map((c, k) => `c${k} = ${c}`).join(', ')} (${unit} per code^k)`;
  const error =
    total === undefined
      ? [ownErrorText(map.maxAbsError, map.errorBound, map.verification, unit, 'its source values below')]
      : totalText(total, unit, 'y', map.kind === 'affine' ? 'the line' : 'the polynomial as fitted');
  const lines = block([
    `${fn}: ${type}, ${map.kind}. ${formula}, in ${unit}; every operation rounded in ${T}.`,
    ...error,
    `Source values: ${source}; offset ${map.source.offset} codes.`,
    costText(map),
  ]);
  const defines = [`#define ${P}_OFFSET ${lit(map.offset)}`];
  if (map.kind === 'affine') defines.push(`#define ${P}_SCALE ${lit(map.scale)}`);
  else defines.push(...coefficients.map((c, k) => `#define ${P}_C${k} ${lit(c)}`));
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
  return functionText(lines, defines, P, total, T, fn, body);
}

function floatPiecewiseSection(prefix: string, ch: EmittedChannel, map: FloatPiecewiseMap): string[] {
  const type = map.precision;
  const { P, fn, T, unit, total } = floatParts(prefix, ch, type);
  const lit = (x: number) => (type === 'float32' ? floatLiteral(x, false) : doubleLiteral(x, false));
  const n = map.degree;
  const error =
    total === undefined
      ? [ownErrorText(map.arithmeticBound, map.arithmeticBound, undefined, unit, 'the piecewise polynomial')]
      : totalText(total, unit, 'y', `the piecewise ${DEGREE[n] as string} polynomial as fitted`);
  const lines = block([
    `${fn}: ${type}, piecewise ${DEGREE[n] as string} polynomial, in ${unit}; every operation rounded in ${T}.`,
    ...error,
    `Form: ${segmentText(map, P)} x = (${T})t; y = C[i][${n}]; then y = y * x + C[i][j] for j = ${n - 1} down to 0 (Horner's rule).`,
    costText(map),
  ]);
  const rows = map.coefficients.map((row, i) => {
    const codes = segmentCodesUnchecked(map, i);
    return tableRow(row.map(lit), `${i}: codes ${codes.first}..${codes.last}`);
  });
  const body = [`${INDENT}const ${T} x = (${T})t;`, `${INDENT}${T} y = C[i][${n}];`];
  for (let j = n - 1; j >= 0; j--) body.push(`${INDENT}y = y * x + C[i][${j}];`);
  if (n === 0) body.splice(0, 1, `${INDENT}(void)t;`);
  body.push(`${INDENT}return y;`);
  return functionText(
    lines,
    [`#define ${P}_SEGMENT_BASE ${intLiteral(map.segmentBase, 32)}`],
    P,
    total,
    T,
    fn,
    [
      `${INDENT}static const ${T} C[${map.segmentCount}][${n + 1}] = {`,
      ...rows,
      `${INDENT}};`,
      ...segmentLines(P, map.segmentBits),
      ...body,
    ],
  );
}

function mobiusSection(prefix: string, ch: EmittedChannel, map: FloatMobiusMap): string[] {
  const type = map.precision;
  const { P, fn, T, unit, total } = floatParts(prefix, ch, type);
  const lit = type === 'float32' ? floatLiteral : doubleLiteral;
  const one = type === 'float32' ? '1.0f' : '1.0';
  const error =
    total === undefined
      ? [
          ownErrorText(
            map.arithmeticBound,
            map.arithmeticBound,
            undefined,
            unit,
            'the Moebius form with its source values',
          ),
        ]
      : totalText(total, unit, 'y', 'the Moebius form as fitted');
  const lines = block([
    `${fn}: ${type}, linear-fractional (Moebius) form, in ${unit}: x = (${T})(code - ${P}_CENTRE); y = (${P}_B + ${P}_A * x) / (${one} + ${P}_C * x), every operation rounded in ${T}. For targets that divide in hardware.`,
    ...error,
    `Source values: a ${map.source.a} ${unit} per code, b ${map.source.b} ${unit}, c ${map.source.c} per code; the denominator stays positive over the code range.`,
    costText(map),
  ]);
  const macros = [
    `#define ${P}_CENTRE ${intLiteral(map.centre, 32)}`,
    `#define ${P}_A ${lit(map.a)}`,
    `#define ${P}_B ${lit(map.b)}`,
    `#define ${P}_C ${lit(map.c)}`,
  ];
  return functionText(lines, macros, P, total, T, fn, [
    `${INDENT}const ${T} x = (${T})(code - ${P}_CENTRE);`,
    `${INDENT}return (${P}_B + ${P}_A * x) / (${one} + ${P}_C * x);`,
  ]);
}

function functionSection(prefix: string, ch: EmittedChannel, type: EvaluatorType): string[] {
  const map = ch[type];
  if (map === undefined) return [];
  if (type === 'fixed') {
    const fixed = map as FixedPointMap | FixedPiecewiseMap;
    return fixed.kind === 'affine'
      ? fixedAffineSection(prefix, ch, fixed)
      : fixedPiecewiseSection(prefix, ch, fixed);
  }
  const float = map as FloatMap | FloatPiecewiseMap | FloatMobiusMap;
  if (float.kind === 'piecewise-polynomial') return floatPiecewiseSection(prefix, ch, float);
  if (float.kind === 'mobius') return mobiusSection(prefix, ch, float);
  return floatSection(prefix, ch, float);
}

const bitView = new DataView(new ArrayBuffer(8));

/** IEEE 754 bit patterns of float results, as C literals. */
function bits32(x: number): string {
  bitView.setFloat32(0, x);
  return `UINT32_C(0x${bitView.getUint32(0).toString(16).padStart(8, '0')})`;
}

function bits64(x: number): string {
  bitView.setFloat64(0, x);
  return `UINT64_C(0x${bitView.getBigUint64(0).toString(16).padStart(16, '0')})`;
}

/** The test vectors of a channel, compiled only with `<PREFIX>_TEST_VECTORS` defined. */
function vectorSection(prefix: string, ch: EmittedChannel): string[] {
  if (ch.testVectors.length === 0) return [];
  const id = `${prefix}_${ch.identifier}`;
  const fields = [`${INDENT}int32_t code;`, `${INDENT}double exact;`];
  if (ch.fixed !== undefined) fields.push(`${INDENT}int32_t fixed;`);
  if (ch.float32 !== undefined) fields.push(`${INDENT}uint32_t f32_bits;`);
  if (ch.float64 !== undefined) fields.push(`${INDENT}uint64_t f64_bits;`);
  const rows = ch.testVectors.map((v) => {
    const values = [intLiteral(v.code, 32), doubleLiteral(v.exact)];
    if (ch.fixed !== undefined) values.push(intLiteral(v.fixed as number, 32));
    if (ch.float32 !== undefined) values.push(bits32(v.float32 as number));
    if (ch.float64 !== undefined) values.push(bits64(v.float64 as number));
    return `${INDENT}{ ${values.join(', ')} }, /* ${v.reason} */`;
  });
  return [
    `#ifdef ${prefix.toUpperCase()}_TEST_VECTORS`,
    ...block([
      `Test vectors of "${ch.identifier}": code, the exact map there (as the generator's reference computed it), and each function's expected result (float results as IEEE 754 bit patterns). Chosen at both rails, segment edges, the worst-error codes found and a spread of others. The test program emitted with this header checks them.`,
    ]),
    `struct ${id}_vector {`,
    ...fields,
    '};',
    '',
    `static const struct ${id}_vector ${id}_vectors[${ch.testVectors.length}] = {`,
    ...rows,
    '};',
    `#endif /* ${prefix.toUpperCase()}_TEST_VECTORS */`,
    '',
  ];
}

function channelSection(prefix: string, ch: EmittedChannel): string[] {
  const P = `${prefix}_${ch.identifier}`.toUpperCase();
  const unit = unitText(ch.quantityUnit);
  const about = [
    `Channel "${commentText(ch.name)}" (identifier ${ch.identifier}); quantity in ${unit}.`,
    `Defined for codes ${ch.codeMin} to ${ch.codeMax}: check with ${prefix}_${ch.identifier}_in_range() first; nothing is clamped.`,
  ];
  if (ch.targetError !== undefined) {
    about.push(
      `Each function below was chosen as the cheapest form meeting a total error of ${ch.targetError} ${unit} against the exact map, and states its own proved or measured total.`,
    );
  }
  return [
    '/* ------------------------------------------------------------------------------------------ */',
    ...block(about),
    `#define ${P}_CODE_MIN ${intLiteral(ch.codeMin, 32)}`,
    `#define ${P}_CODE_MAX ${intLiteral(ch.codeMax, 32)}`,
    '',
    `static inline int ${prefix}_${ch.identifier}_in_range(int32_t code)`,
    '{',
    `${INDENT}return code >= ${P}_CODE_MIN && code <= ${P}_CODE_MAX;`,
    '}',
    '',
    ...functionSection(prefix, ch, 'fixed'),
    ...functionSection(prefix, ch, 'float32'),
    ...functionSection(prefix, ch, 'float64'),
    ...vectorSection(prefix, ch),
  ];
}

/**
 * Writes a C99 header with the constants and `static inline` evaluators of one or more channels.
 *
 * @remarks
 * The header has an include guard `<PREFIX>_CONSTANTS_H`, includes only `<stdint.h>`, and for each
 * channel defines its code range, an `_in_range` test, and the requested evaluators:
 * `<prefix>_<channel>_fixed(int32_t code) → int32_t` (output steps), `_f32(int32_t code) → float`
 * and `_f64(int32_t code) → double` (quantity), in whichever form each map has (affine,
 * piecewise polynomial with its tables inside the function, Möbius).
 *
 * The error. For a channel made by {@link designFirmwareConstants}, each function's comment opens
 * with its TOTAL ERROR against the exact map — proved (every code evaluated) or measured
 * (sampled), with the exact map's own stated error included — and the target it meets; the
 * approximation and arithmetic parts follow, named as parts; `<P>_TOTAL_ERROR` holds the bound. A
 * map assembled by hand has no exact map: its comment says that no total error is stated and gives
 * only its arithmetic error against its own formula. Every function also states its table bytes
 * and operation count ({@link firmwareCost}), and the channel's test vectors are included for
 * builds that define `<PREFIX>_TEST_VECTORS` (see {@link emitTestProgram}).
 *
 * Portability: fixed-point evaluators use only operations C99 defines exactly (no right shift of a
 * negative value, no signed overflow — the generator proved every intermediate fits), so they give
 * the same integers on every target and equal the maps' `evaluate`. Float evaluators equal
 * `evaluate` bit for bit where `float`/`double` are IEEE 754 binary32/binary64, FLT_EVAL_METHOD is 0
 * and multiply-adds are not contracted (gcc `-std=c99` implies `-ffp-contract=off`; `-std=gnu99 -O2`
 * may fuse them). The output compiles without warnings under
 * `gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic`, for a Cortex-M4F and a Cortex-M0+,
 * as the tests check. Output is deterministic: the same input gives the same bytes.
 *
 * Names: identifiers come from {@link cIdentifierFromName}; comments show names and units
 * sanitised to printable ASCII without `*`, `\` or `?`, so no text can end a comment early, splice
 * a line or form a trigraph.
 *
 * @param options - Channels, prefix, and which evaluator types to write.
 * @returns The header text (ASCII, `\n` line ends, ending with a newline).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for an empty channel list or types;
 *   `unknown-option`, `invalid-option` for a bad prefix, type, name, map or total; `conflicting-options`
 *   when two names give one identifier or a channel's maps differ in code range or unit;
 *   `missing-option` when a requested type is absent; `overflow` when a (hand-edited) fixed-point map
 *   would overflow.
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
      fixedMaps
        .filter((m): m is FixedPointMap => m.kind === 'affine' && widthOf(m) === width && m.shift > 0)
        .map((m) => m.rounding),
    );
    if (width === 32 && fixedMaps.some((m) => m.kind === 'piecewise-polynomial')) roundings.add('floor');
    helperText.push(...helpers(prefix, width, roundings));
  }
  const lines = [
    ...block([
      `Conversion constants from converter codes to engineering units, ${channels.length} channel${channels.length === 1 ? '' : 's'}.`,
      `Generated by @bridgework/firmware ${FIRMWARE_GENERATOR_VERSION}; do not edit, regenerate instead.`,
      `Caution. ${FIRMWARE_CAUTION}`,
      'The error of a function is its TOTAL ERROR: the largest |result - exact map| over its whole code range, where the exact map is the channel map the constants were made from. "Proved" means every code was evaluated as the function computes it; "measured" means sampled. Approximation and arithmetic figures are parts of it, named as such.',
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
