/**
 * Every literal the emitters write is a valid C99 constant of its type that denotes exactly the
 * value the generator holds: float32 values over every magnitude from the smallest subnormal
 * (1.4e-45) to the largest finite (3.4e38), the integers near 2^24 … 2^31 and the nine-digit
 * integers (1e8 ≤ x < 1e9, which once came out as `215786624f`), and doubles likewise. gcc parses
 * the literals and the program compares their bit patterns with the ones TypeScript expects.
 */
import { describe, expect, it } from 'vitest';
import { emitCHeader, floatMap } from '@bridgework/firmware';
import { doubleLiteral, floatLiteral, intLiteral } from '../src/internal/cLiterals.js';
import { compile, needCompiler, run, scratch, STRICT_FLAGS, writeFiles } from './support/cc.js';

const view = new DataView(new ArrayBuffer(8));
const bits32 = (x: number) => {
  view.setFloat32(0, x);
  return view.getUint32(0);
};
const bits64 = (x: number) => {
  view.setFloat64(0, x);
  return view.getBigUint64(0);
};

/** float32 values: every decade, both signs, subnormals, the extremes and the awkward integers. */
function floatValues(): number[] {
  const values = new Set<number>([
    0,
    1.401298464324817e-45,
    2 ** -149 * 3,
    1.1754942106924411e-38,
    3.4028234663852886e38,
  ]);
  for (let e = -45; e <= 38; e++) {
    for (const m of [1, 1.5, 2.5, 3.14159265, 9.99]) {
      const x = Math.fround(m * 10 ** e);
      if (Number.isFinite(x) && x !== 0) values.add(x);
    }
  }
  for (let k = 24; k <= 31; k++) {
    for (let d = -3; d <= 3; d++) values.add(Math.fround(2 ** k + d));
  }
  // Nine-digit integers, the issue's among them, and the float32 neighbours of 1e8 and 1e9.
  for (const x of [
    215786624, 123456789, 100000000, 999999936, 999999999, 1e9, 99999999, 16777217, 33554431,
  ]) {
    values.add(Math.fround(x));
  }
  for (let x = 1e8; x < 1e9; x += 12345679) values.add(Math.fround(x));
  return [...values].flatMap((x) => (x === 0 ? [0, -0] : [x, -x]));
}

function doubleValues(): number[] {
  const values = new Set<number>([
    5e-324,
    2.2250738585072014e-308,
    1.7976931348623157e308,
    2 ** 53,
    2 ** 53 + 2,
  ]);
  for (let e = -323; e <= 308; e += 7) values.add(1.2345678901234567 * 10 ** e);
  for (let k = 24; k <= 63; k++) values.add(2 ** k - 1);
  for (const x of [215786624, 123456789, 1e8, 1e15, 1e21, 1e22, 0.1, 1 / 3]) values.add(x);
  return [...values].filter(Number.isFinite).flatMap((x) => [x, -x]);
}

describe('C literals (issue 15, item 2): valid C99 for their type, exactly the value held', () => {
  it('writes a point or an exponent before every f, nine significant digits, and round-trips', () => {
    for (const x of floatValues()) {
      const text = floatLiteral(x);
      expect(text, `${x}`).toMatch(/^\(?-?(\d+\.\d*|\d*\.\d+)(e[+-]\d+)?f\)?$/);
      expect(Math.fround(Number(text.replace(/[()f]/g, '')))).toBe(x); // JavaScript reads it back to x
    }
    expect(floatLiteral(215786624)).toBe('215786624.0f');
    expect(floatLiteral(-123456792)).toBe('(-123456792.0f)');
    for (const x of doubleValues()) {
      const text = doubleLiteral(x);
      expect(text).toMatch(/[.e]/);
      expect(Number(text.replace(/[()]/g, ''))).toBe(x);
    }
  });

  it('gcc -std=c99 -pedantic -Werror parses every literal to the same bits (all magnitudes 1e-45 … 3.4e38)', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const floats = floatValues();
    const doubles = doubleValues();
    const program = `#include <stdint.h>
#include <stdio.h>
#include <string.h>
static const float f[] = {
${floats.map((x) => `    ${floatLiteral(x)},`).join('\n')}
};
static const uint32_t fb[] = {
${floats.map((x) => `    UINT32_C(0x${bits32(x).toString(16)}),`).join('\n')}
};
static const double d[] = {
${doubles.map((x) => `    ${doubleLiteral(x)},`).join('\n')}
};
static const uint64_t db[] = {
${doubles.map((x) => `    UINT64_C(0x${bits64(x).toString(16)}),`).join('\n')}
};
static const int64_t i[] = { ${[0, 1, -1, 2 ** 31 - 1, -(2 ** 31)].map((x) => intLiteral(x, 64)).join(', ')}, ${intLiteral(-(2n ** 63n), 64)} };
int main(void)
{
    size_t k;
    int bad = 0;
    for (k = 0; k < sizeof f / sizeof f[0]; k++) {
        uint32_t u;
        memcpy(&u, &f[k], sizeof u);
        if (u != fb[k]) { printf("float %lu\\n", (unsigned long)k); bad++; }
    }
    for (k = 0; k < sizeof d / sizeof d[0]; k++) {
        uint64_t u;
        memcpy(&u, &d[k], sizeof u);
        if (u != db[k]) { printf("double %lu\\n", (unsigned long)k); bad++; }
    }
    printf("%d %ld\\n", bad, (long)(i[5] < 0));
    return 0;
}
`;
    const { dir, remove } = scratch();
    try {
      writeFiles(dir, { 'literals.c': program });
      compile('gcc', [...STRICT_FLAGS, 'literals.c', '-o', 'literals'], dir);
      expect(run(`${dir}/literals`, '', dir)).toBe('0 1\n');
    } finally {
      remove();
    }
  });

  it('the issue’s float32 offset 123456789 makes a header that compiles and evaluates as TypeScript does', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    // 123456789 is not a float32: it rounds to 123456792, a nine-digit integer.
    const map = floatMap({
      kind: 'affine',
      scale: '0.5',
      offset: '123456789',
      precision: 'float32',
      codeMin: 0,
      codeMax: 1000,
    });
    expect(map.offset).toBe(123456792);
    const header = emitCHeader({ channels: [{ name: 'offset', float32: map }], prefix: 'lit' });
    expect(header).toContain('#define LIT_OFFSET_F32_OFFSET 123456792.0f');
    const { dir, remove } = scratch();
    try {
      writeFiles(dir, {
        'constants.h': header,
        'main.c':
          '#include <stdio.h>\n#include "constants.h"\nint main(void) { printf("%.9g\\n", (double)lit_offset_f32(1000)); return 0; }\n',
      });
      compile('gcc', [...STRICT_FLAGS, 'main.c', '-o', 'main'], dir);
      expect(Number(run(`${dir}/main`, '', dir))).toBe(map.evaluate(1000));
    } finally {
      remove();
    }
  });
});
