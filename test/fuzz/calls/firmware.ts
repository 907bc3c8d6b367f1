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
});
const fixed = () => firmware.fixedPointMap(fixedOptions() as never);
const matrix = () =>
  firmware.matrixMap({
    matrix: [
      [2000, -30],
      [5, 1980],
    ],
    offsets: [-0.05, 0.03],
    inputRanges: [
      { min: -1.5, max: 1.5 },
      { min: -1.5, max: 1.5 },
    ],
    precision: 'float32',
  });
const affine = () => firmware.floatMap(affineOptions() as never);
// A gently curved map over 4096 codes: every designed function is verified over all its codes.
const curve = (code: number) => 20 + code / 100 + (code * code) / 4e6;
const polynomialFitOptions = () => ({ exact: curve, codeMin: 0, codeMax: 4095, segmentBits: 10, degree: 2 });
const piecewise = () => firmware.fitPiecewisePolynomial(polynomialFitOptions());
const fixedPiecewise = () => firmware.fixedPiecewiseMap({ polynomial: piecewise(), outputUnit: '0.001' });
const floatPiecewise = () => firmware.floatPiecewiseMap({ polynomial: piecewise(), precision: 'float32' });
const mobiusOptions = () => ({
  a: '0.01',
  b: '20',
  c: '1e-6',
  precision: 'float64',
  codeMin: 0,
  codeMax: 4095,
  quantityUnit: 'degC',
});
const floatMobius = () => firmware.floatMobiusMap(mobiusOptions() as never);
const designOptions = () => ({
  name: 'bath',
  exact: curve,
  codeMin: 0,
  codeMax: 4095,
  quantityUnit: 'degC',
  targetError: 0.01,
  types: ['fixed', 'float32', 'float64'],
  outputUnit: '0.001',
  verification: 'exhaustive',
});
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
  m('matrixMap', matrix, 'evaluate', () => [[0.1, -0.2]]),
  m('matrixMap', matrix, 'cSource', () => ['rig', 'coupling']),
  f('matrixMap', () => [
    {
      matrix: [
        [2000, -30],
        [5, 1980],
      ],
      offsets: [-0.05, 0.03],
      inputRanges: [
        { min: -1.5, max: 1.5 },
        { min: -1.5, max: 1.5 },
      ],
      precision: 'float32',
    },
  ]),
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
  f('fitPiecewisePolynomial', () => [polynomialFitOptions()]),
  f('segmentCodes', () => [piecewise(), 1]),
  f('fixedPiecewiseMap', () => [{ polynomial: piecewise(), outputUnit: '0.001', coefficientBits: 24 }]),
  f('floatPiecewiseMap', () => [{ polynomial: piecewise(), precision: 'float64', quantityUnit: 'degC' }]),
  f('floatMobiusMap', () => [mobiusOptions()]),
  f('firmwareCost', () => [fixedPiecewise()]),
  f('designFirmwareConstants', () => [designOptions()]),
  f('emitTestProgram', () => [
    {
      channels: [{ name: 'Bath', fixed: fixedPiecewise(), float32: floatPiecewise() }],
      prefix: 'bath',
      types: ['fixed', 'float32'],
      header: 'bath_constants.h',
    },
  ]),
  m('fixedPointMap', fixed, 'evaluate', () => [1234]),
  m('fixedPiecewiseMap', fixedPiecewise, 'evaluate', () => [1234]),
  m('floatPiecewiseMap', floatPiecewise, 'evaluate', () => [1234]),
  m('floatMobiusMap', floatMobius, 'evaluate', () => [1234]),
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
