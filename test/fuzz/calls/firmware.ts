import * as firmware from '@bridgework/firmware';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('firmware', firmware, name, args, extra);
const m = (creator: string, make: () => unknown, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('firmware', creator, make, name, args, extra);

// Small code ranges keep every map's verification over all its codes quick.
const fixedOptions = () => ({
  scale: '50/2147483.648',
  offset: '0.25',
  outputUnit: '0.00001',
  codeMin: -4096,
  codeMax: 4095,
  quantityUnit: 'kg',
  coefficientBits: 31,
  accumulatorBits: 63,
  outputBits: 32,
  rounding: 'half-even',
  verification: 'exhaustive',
});
const affineOptions = () => ({
  kind: 'affine',
  scale: '50/2147483.648',
  offset: '0.125',
  precision: 'float32',
  codeMin: -4096,
  codeMax: 4095,
  quantityUnit: 'kg',
  verification: 'auto',
});
const polynomialOptions = () => ({
  kind: 'polynomial',
  coefficients: ['0.5', '0.001', '1e-9'],
  offset: '0',
  precision: 'float64',
  codeMin: -1000,
  codeMax: 1000,
  exact: (code: number) => 0.5 + 0.001 * code + 1e-9 * code * code,
});
const fixed = () => firmware.fixedPointMap(fixedOptions() as never);
const affine = () => firmware.floatMap(affineOptions() as never);
const mobius = () => ({
  form: 'mobius',
  coefficients: { a: 2, b: 1, c: 0.001, d: 1 },
  validCodes: { min: -10, max: 10 },
});

/** Base calls of @bridgework/firmware. */
export const firmwareCalls: readonly BaseCall[] = [
  f('cIdentifierFromName', () => ['Wägezelle 2 "links"']),
  f('roundShift', () => [7n, 1, 'half-even']),
  f('fixedPointMap', () => [fixedOptions()]),
  f('floatMap', () => [affineOptions()]),
  f('floatMap', () => [polynomialOptions()], { variant: 'polynomial' }),
  f('emitCHeader', () => [
    {
      channels: [{ name: 'Weight', fixed: fixed(), float32: affine() }],
      prefix: 'hopper',
      types: ['fixed', 'float32'],
    },
  ]),
  f('emitJson', () => [{ channels: [{ name: 'Weight', fixed: fixed() }], prefix: 'hopper' }]),
  f('sqlExpression', () => [mobius(), '"hook"', 'postgresql']),
  f('emitSql', () => [
    [{ name: 'hook', unit: 'N', codeColumn: 'code', map: mobius() }],
    { dialect: 'duckdb', table: 'rig_codes', keepColumns: ['t'] },
  ]),
  m('fixedPointMap', fixed, 'evaluate', () => [1234]),
  m('floatMap', affine, 'evaluate', () => [1234]),
  m(
    'floatMap',
    () => firmware.floatMap(polynomialOptions() as never),
    'evaluate',
    () => [12],
    { variant: 'polynomial' },
  ),
];

/** Exports of @bridgework/firmware that are not fuzzed as calls. */
export const firmwareNotCalled: Readonly<Record<string, string>> = {};
