/**
 * The options rule (issue 15, item 5) over every public function of the package that takes an
 * options object: a misspelt key is `unknown-option` naming the closest known key, never read as
 * absent; each required key, left out, is `missing-option` naming that key.
 */
import { describe, expect, it } from 'vitest';
import {
  designFirmwareConstants,
  emitCHeader,
  emitJson,
  emitTestProgram,
  fitPiecewisePolynomial,
  fixedPiecewiseMap,
  fixedPointMap,
  floatMap,
  floatMobiusMap,
  floatPiecewiseMap,
} from '@bridgework/firmware';

const polynomial = fitPiecewisePolynomial({
  exact: (c) => c / 100,
  codeMin: 0,
  codeMax: 255,
  segmentBits: 7,
  degree: 1,
});
const fixed = fixedPointMap({ scale: '0.01', outputUnit: '0.01', codeMin: 0, codeMax: 255 });

/** Each function with a valid options object and the keys it requires. */
const cases: [string, (o: never) => unknown, Record<string, unknown>, string[]][] = [
  [
    'fixedPointMap',
    fixedPointMap as never,
    { scale: '0.01', outputUnit: '0.01', codeMin: 0, codeMax: 255 },
    ['scale', 'outputUnit', 'codeMin', 'codeMax'],
  ],
  [
    'floatMap',
    floatMap as never,
    { kind: 'affine', scale: '0.01', precision: 'float32', codeMin: 0, codeMax: 255 },
    ['kind', 'precision', 'codeMin', 'codeMax'],
  ],
  [
    'fitPiecewisePolynomial',
    fitPiecewisePolynomial as never,
    { exact: (c: number) => c, codeMin: 0, codeMax: 255, segmentBits: 7, degree: 1 },
    ['exact', 'codeMin', 'codeMax', 'segmentBits', 'degree'],
  ],
  [
    'fixedPiecewiseMap',
    fixedPiecewiseMap as never,
    { polynomial, outputUnit: '0.01' },
    ['polynomial', 'outputUnit'],
  ],
  [
    'floatPiecewiseMap',
    floatPiecewiseMap as never,
    { polynomial, precision: 'float64' },
    ['polynomial', 'precision'],
  ],
  [
    'floatMobiusMap',
    floatMobiusMap as never,
    { a: 1, b: 0, c: 0, precision: 'float64', codeMin: 0, codeMax: 255 },
    ['a', 'b', 'c', 'precision', 'codeMin', 'codeMax'],
  ],
  [
    'designFirmwareConstants',
    designFirmwareConstants as never,
    {
      name: 'x',
      exact: (c: number) => c / 100,
      codeMin: 0,
      codeMax: 255,
      targetError: 0.01,
      types: ['float64'],
    },
    ['name', 'exact', 'codeMin', 'codeMax', 'targetError'],
  ],
  ['emitCHeader', emitCHeader as never, { channels: [{ name: 'x', fixed }] }, ['channels']],
  ['emitJson', emitJson as never, { channels: [{ name: 'x', fixed }] }, ['channels']],
  [
    'emitTestProgram',
    emitTestProgram as never,
    { channels: [{ name: 'x', fixed }], header: 'x.h' },
    ['channels', 'header'],
  ],
];

describe('every options object follows one rule', () => {
  it.for(cases)(
    '%s: the valid options work; a misspelt key names the closest; a missing required key is named',
    ([, fn, valid, required]) => {
      expect(() => fn(valid as never)).not.toThrow();
      const first = Object.keys(valid)[0] as string;
      const misspelt = `${first.slice(0, -1)}${first.endsWith('x') ? 'y' : 'x'}`;
      try {
        fn({ ...valid, [misspelt]: valid[first] } as never);
        expect.unreachable();
      } catch (e) {
        expect((e as { code: string }).code).toBe('unknown-option');
        expect((e as { param: string }).param).toBe(`options.${misspelt}`);
        expect((e as Error).message).toContain(`did you mean \`${first}\``);
      }
      for (const key of required) {
        const { [key]: _, ...rest } = valid;
        expect(() => fn(rest as never), key).toThrowBridgeworkError('missing-option', { param: key });
      }
    },
  );

  it('checks nested objects too: a channel entry of the emitters, a reference error, a piecewise polynomial', () => {
    expect(() => emitCHeader({ channels: [{ name: 'x', fixd: fixed } as never] })).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'channels[0].fixd',
      },
    );
    expect(() =>
      designFirmwareConstants({
        name: 'x',
        exact: (c) => c,
        codeMin: 0,
        codeMax: 9,
        targetError: 1,
        types: ['float64'],
        referenceError: { bound: 0, sorce: 'x' } as never,
      }),
    ).toThrowBridgeworkError('unknown-option', { param: 'referenceError.sorce' });
    expect(() =>
      floatPiecewiseMap({ polynomial: { ...polynomial, degre: 1 } as never, precision: 'float64' }),
    ).toThrowBridgeworkError('unknown-option', { param: 'polynomial.degre' });
  });
});
