import { BridgeworkError, formatValue } from '@bridgework/core';
import type { EmitOptions } from './emitOptions.js';
import { FIRMWARE_CAUTION } from './emitCHeader.js';
import { emitModel, type EmittedChannel } from './internal/channels.js';
import { cFloatType, INDENT } from './internal/cText.js';
import { FIRMWARE_GENERATOR_VERSION } from './version.js';
import { readOptions } from './internal/codes.js';

/** Options of {@link emitTestProgram}: those of {@link emitCHeader} and the header's file name. */
export interface EmitTestProgramOptions extends EmitOptions {
  /** The name the header is included by (`#include "<header>"`), e.g. `'bath_constants.h'`. */
  readonly header: string;
}

const HEADER_NAME = /^[A-Za-z0-9_][A-Za-z0-9_.\-/]*\.h$/;

function channelCheck(prefix: string, ch: EmittedChannel): string[] {
  const id = `${prefix}_${ch.identifier}`;
  const P = id.toUpperCase();
  const out = [
    `${INDENT}for (k = 0; k < sizeof ${id}_vectors / sizeof ${id}_vectors[0]; k++) {`,
    `${INDENT}${INDENT}const struct ${id}_vector *v = &${id}_vectors[k];`,
    `${INDENT}${INDENT}checks++;`,
    `${INDENT}${INDENT}if (!${id}_in_range(v->code)) {`,
    `${INDENT}${INDENT}${INDENT}failures += report("${ch.identifier}", "in_range", v->code, "reports the code out of range");`,
    `${INDENT}${INDENT}${INDENT}continue;`,
    `${INDENT}${INDENT}}`,
  ];
  if (ch.fixed !== undefined) {
    out.push(
      `${INDENT}${INDENT}{`,
      `${INDENT}${INDENT}${INDENT}const int32_t y = ${id}_fixed(v->code);`,
      `${INDENT}${INDENT}${INDENT}if (y != v->fixed) failures += report("${ch.identifier}", "fixed", v->code, "differs from the expected output");`,
    );
    if (ch.totals.fixed !== undefined) {
      out.push(
        `${INDENT}${INDENT}${INDENT}if (!within((double)y * ${P}_FIXED_OUTPUT_UNIT, v->exact, ${P}_FIXED_TOTAL_ERROR)) failures += report("${ch.identifier}", "fixed", v->code, "is beyond the stated total error");`,
      );
    }
    out.push(`${INDENT}${INDENT}}`);
  }
  for (const [type, tag, bits, field] of [
    ['float32', 'F32', 'bits32', 'f32_bits'],
    ['float64', 'F64', 'bits64', 'f64_bits'],
  ] as const) {
    if (ch[type] === undefined) continue;
    const T = cFloatType(type);
    out.push(
      `${INDENT}${INDENT}{`,
      `${INDENT}${INDENT}${INDENT}const ${T} y = ${id}_${tag.toLowerCase()}(v->code);`,
      `${INDENT}${INDENT}${INDENT}if (${bits}(y) != v->${field}) failures += report("${ch.identifier}", "${tag.toLowerCase()}", v->code, "differs from the expected bits");`,
    );
    if (ch.totals[type] !== undefined) {
      out.push(
        `${INDENT}${INDENT}${INDENT}if (!within((double)y, v->exact, ${P}_${tag}_TOTAL_ERROR)) failures += report("${ch.identifier}", "${tag.toLowerCase()}", v->code, "is beyond the stated total error");`,
      );
    }
    out.push(`${INDENT}${INDENT}}`);
  }
  out.push(`${INDENT}}`);
  return out;
}

/**
 * Writes a small C99 program that checks a header's test vectors on the target: every function
 * must give the expected result at every vector code (fixed point exactly, floats bit for bit)
 * and stay within its stated total error of the exact map there.
 *
 * @remarks
 * The program defines `<PREFIX>_TEST_VECTORS`, includes the header written by {@link emitCHeader}
 * with the same options, and provides `int <prefix>_run_test_vectors(void)`, which prints each
 * failure and a summary with `printf` and returns the number of failures, and a `main` returning 0
 * when all pass (leave it out with `-D<PREFIX>_TEST_NO_MAIN` to call the function from a firmware
 * test harness). The total-error check computes |result − exact| in double and allows
 * 4·DBL_EPSILON·(|exact| + bound) for that computation's own rounding. Bit-exact float checks need
 * the header's conditions (IEEE 754 types, FLT_EVAL_METHOD 0, no contraction: `-std=c99` or
 * `-ffp-contract=off`). Channels without test vectors (maps assembled by hand) are skipped. It
 * compiles under `gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic`.
 *
 * @param options - The header's options and its file name.
 * @returns The C source text.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a bad header name; the codes of
 *   {@link emitCHeader}.
 * @example
 * ```ts
 * const program = emitTestProgram({ channels: [design], prefix: 'bath', header: 'bath_constants.h' });
 * // gcc -std=c99 … test.c && ./a.out   → "bath test vectors: 61 checked, 0 failed"
 * ```
 */
export function emitTestProgram(options: EmitTestProgramOptions): string {
  const o = readOptions(options, {
    known: ['channels', 'prefix', 'types', 'header'],
    required: ['channels', 'header'],
  });
  const header = o['header'];
  if (typeof header !== 'string' || !HEADER_NAME.test(header) || header.includes('..')) {
    throw new BridgeworkError(
      'invalid-option',
      `\`header\` must be a file name of letters, digits, '_', '-', '.' and '/' ending in .h; got ${formatValue(header)}`,
      { param: 'header', value: header },
    );
  }
  const { channels, prefix } = emitModel({
    channels: options.channels,
    ...(options.prefix === undefined ? {} : { prefix: options.prefix }),
    ...(options.types === undefined ? {} : { types: options.types }),
  });
  const checked = channels.filter((c) => c.testVectors.length > 0);
  const PREFIX = prefix.toUpperCase();
  const lines = [
    '/*',
    ` * Test program for ${header}: checks every test vector of the header on this target.`,
    ` * Generated by @bridgework/firmware ${FIRMWARE_GENERATOR_VERSION}; do not edit, regenerate instead.`,
    ' *',
    ` * Caution. ${FIRMWARE_CAUTION}`,
    ' *',
    ` * Build: cc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic this.c; define ${PREFIX}_TEST_NO_MAIN`,
    ` * to call ${prefix}_run_test_vectors() from a firmware test harness instead of main().`,
    ' */',
    `#define ${PREFIX}_TEST_VECTORS`,
    `#include "${header}"`,
    '',
    '#include <float.h>',
    '#include <stdio.h>',
    '#include <string.h>',
    '',
    'static uint32_t bits32(float x)',
    '{',
    `${INDENT}uint32_t u;`,
    `${INDENT}memcpy(&u, &x, sizeof u);`,
    `${INDENT}return u;`,
    '}',
    '',
    'static uint64_t bits64(double x)',
    '{',
    `${INDENT}uint64_t u;`,
    `${INDENT}memcpy(&u, &x, sizeof u);`,
    `${INDENT}return u;`,
    '}',
    '',
    '/* |result - exact| <= bound, allowing for the rounding of this check itself. */',
    'static int within(double result, double exact, double bound)',
    '{',
    `${INDENT}const double d = result > exact ? result - exact : exact - result;`,
    `${INDENT}const double size = (exact < 0.0 ? -exact : exact) + bound;`,
    `${INDENT}return d <= bound + 4.0 * DBL_EPSILON * size;`,
    '}',
    '',
    'static int report(const char *channel, const char *function, int32_t code, const char *what)',
    '{',
    `${INDENT}printf("FAIL %s %s at code %ld: %s\\n", channel, function, (long)code, what);`,
    `${INDENT}return 1;`,
    '}',
    '',
    `int ${prefix}_run_test_vectors(void)`,
    '{',
    `${INDENT}int failures = 0;`,
    `${INDENT}long checks = 0;`,
    `${INDENT}size_t k;`,
    ...checked.flatMap((c) => channelCheck(prefix, c)),
    `${INDENT}(void)k;`,
    `${INDENT}(void)bits32;`,
    `${INDENT}(void)bits64;`,
    `${INDENT}(void)within;`,
    `${INDENT}(void)report;`,
    `${INDENT}printf("${prefix} test vectors: %ld checked, %d failed\\n", checks, failures);`,
    `${INDENT}return failures;`,
    '}',
    '',
    `#ifndef ${PREFIX}_TEST_NO_MAIN`,
    'int main(void)',
    '{',
    `${INDENT}return ${prefix}_run_test_vectors() == 0 ? 0 : 1;`,
    '}',
    '#endif',
  ];
  return `${lines.join('\n')}\n`;
}
