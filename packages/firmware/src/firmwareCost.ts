import { BridgeworkError, checkInteger, checkObject, checkOneOf, formatValue } from '@bridgework/core';
import type { FixedPiecewiseMap } from './fixedPiecewiseMap.js';
import type { FixedPointMap } from './fixedPointMap.js';
import type { FloatMap } from './floatMap.js';
import type { FloatMobiusMap } from './floatMobiusMap.js';
import type { FloatPiecewiseMap } from './floatPiecewiseMap.js';
import { fixedPointRoundings } from './roundShift.js';

/** A fixed-point map of any form. */
export type FirmwareFixedMap = FixedPointMap | FixedPiecewiseMap;

/** A float map of any form. */
export type FirmwareFloatMap = FloatMap | FloatPiecewiseMap | FloatMobiusMap;

/** Any firmware map. */
export type FirmwareMap = FirmwareFixedMap | FirmwareFloatMap;

/** What one conversion costs on a microcontroller, and the constant data it needs. */
export interface FirmwareCost {
  /** Bytes of constants: coefficient tables (and shift tables) or the scalar constants. */
  readonly tableBytes: number;
  /** Multiplications per conversion. */
  readonly multiplies: number;
  /** Additions and subtractions per conversion (integer and float). */
  readonly additions: number;
  /** Shifts and bit masks per conversion. */
  readonly shifts: number;
  /** Comparisons (sign tests of the integer floor shift) per conversion. */
  readonly comparisons: number;
  /** Divisions per conversion. */
  readonly divisions: number;
  /** Integer-to-float conversions per conversion. */
  readonly conversions: number;
  /** The arithmetic the operations run in, e.g. `'int32_t'`, `'int64_t products'`, `'float'`. */
  readonly arithmetic: string;
  /** Library calls the target may need, in words; `'none'` when the operations are all native. */
  readonly libraryCalls: string;
  /**
   * The figure the generator minimises: operations (a division counted as 8) plus table bytes / 32.
   * One operation is weighed like 32 bytes of table.
   */
  readonly cost: number;
}

function make(parts: Omit<FirmwareCost, 'cost'>): FirmwareCost {
  const ops =
    parts.multiplies +
    parts.additions +
    parts.shifts +
    parts.comparisons +
    parts.conversions +
    8 * parts.divisions;
  return Object.freeze({ ...parts, cost: ops + parts.tableBytes / 32 });
}

/** Bytes of one stored coefficient word of a fixed piecewise map. */
export function coefficientWordBytes(coefficientBits: number): 1 | 2 | 4 {
  return coefficientBits <= 8 ? 1 : coefficientBits <= 16 ? 2 : 4;
}

/**
 * The operation count per conversion and the constant bytes of a firmware map, as the emitted C
 * evaluates it.
 *
 * @remarks
 * Counts follow the emitted code: the segment index and centred t (one subtraction, one shift, one
 * mask, one subtraction); per Horner step one multiply and one addition (float) or one multiply,
 * one floor shift (a sign test and a shift) and one addition (fixed); the affine fixed map's
 * rounding helper (floor: a test and a shift; half-away: two more additions; half-even: an
 * addition, a mask and a parity test). Table bytes count the coefficient and shift tables of a
 * piecewise map, or the scalar constants of the other forms (32-bit words 4 bytes, 64-bit 8).
 * The library-call note names what a core without the matching hardware needs: a 64-bit multiply
 * on a Cortex-M0/M0+ is the integer helper `__aeabi_lmul`; double-precision operations on a
 * single-precision FPU (Cortex-M4F) and every float operation on a core without FPU are
 * software floating-point calls.
 *
 * @param map - A map from {@link fixedPointMap}, {@link fixedPiecewiseMap}, {@link floatMap},
 *   {@link floatPiecewiseMap} or {@link floatMobiusMap}.
 * @returns The counts, the table bytes and the weighted cost.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an object that is none of these.
 * @example
 * ```ts
 * firmwareCost(fixedPointMap({ scale: '0.001', outputUnit: '0.001', codeMin: 0, codeMax: 1000 })).multiplies; // 1
 * ```
 */
export function firmwareCost(map: FirmwareMap): FirmwareCost {
  const o = checkObject('map', map);
  // The figures the counts are made of: each checked, so an edited map cannot give NaN.
  const int = (key: string, min: number, max: number) => checkInteger(`map.${key}`, o[key], { min, max });
  const m = map as FirmwareMap & { precision?: string };
  if (m.precision !== undefined) checkOneOf('map.precision', m.precision, ['float32', 'float64'] as const);
  if (m.kind === 'piecewise-polynomial') {
    int('degree', 0, 5);
    int('segmentCount', 1, 2 ** 32);
  }
  if (m.precision === undefined) {
    const fixed = map as FirmwareFixedMap;
    if (fixed.kind === 'affine') {
      int('accumulatorBits', 8, 64);
      int('shift', 0, 63);
      checkOneOf('map.rounding', fixed.rounding, fixedPointRoundings);
      const wide = fixed.accumulatorBits > 32;
      const rounding = fixed.shift === 0 ? 0 : 1;
      const extraAdds =
        fixed.shift === 0 ? 0 : fixed.rounding === 'floor' ? 0 : fixed.rounding === 'half-away' ? 2 : 1;
      const extraShifts = fixed.rounding === 'half-even' && fixed.shift > 0 ? 1 : 0;
      return make({
        tableBytes: 4 + (wide ? 16 : 8),
        multiplies: 1,
        additions: 2 + extraAdds,
        shifts: rounding + extraShifts,
        comparisons: rounding + extraShifts,
        divisions: 0,
        conversions: 0,
        arithmetic: wide ? 'int64_t accumulator (32 x 32 -> 64-bit multiply)' : 'int32_t',
        libraryCalls: wide
          ? 'none on Cortex-M3/M4/M7 (SMULL); the integer helper __aeabi_lmul on Cortex-M0/M0+'
          : 'none',
      });
    }
    if (fixed.kind === 'piecewise-polynomial') {
      int('coefficientBits', 2, 32);
      const n = fixed.degree;
      const words = coefficientWordBytes(fixed.coefficientBits);
      return make({
        tableBytes: fixed.segmentCount * ((n + 1) * words + (n + 1)),
        multiplies: n,
        additions: 2 + n,
        shifts: 2 + n + 1,
        comparisons: n + 1,
        divisions: 0,
        conversions: 0,
        arithmetic: 'int32_t (32 x 32 -> 32-bit multiplies)',
        libraryCalls: 'none',
      });
    }
  } else {
    const float = map as FirmwareFloatMap;
    const bytes = float.precision === 'float32' ? 4 : 8;
    const type = float.precision === 'float32' ? 'float' : 'double';
    const soft =
      float.precision === 'float32'
        ? 'none with a single-precision FPU (Cortex-M4F/M7); software float calls on cores without one'
        : 'none with a double-precision FPU (Cortex-M7 with FPv5-D16, x86-64); software float calls elsewhere (Cortex-M4F included)';
    if (float.kind === 'affine') {
      return make({
        tableBytes: 2 * bytes,
        multiplies: 1,
        additions: 1,
        shifts: 0,
        comparisons: 0,
        divisions: 0,
        conversions: 1,
        arithmetic: type,
        libraryCalls: soft,
      });
    }
    if (float.kind === 'polynomial') {
      if (!Array.isArray(float.coefficients) || float.coefficients.length === 0) {
        throw new BridgeworkError('invalid-option', '`map.coefficients` must be a non-empty list', {
          param: 'map.coefficients',
        });
      }
      const n = float.coefficients.length - 1;
      return make({
        tableBytes: (n + 2) * bytes,
        multiplies: n,
        additions: n + 1,
        shifts: 0,
        comparisons: 0,
        divisions: 0,
        conversions: 1,
        arithmetic: type,
        libraryCalls: soft,
      });
    }
    if (float.kind === 'piecewise-polynomial') {
      const n = float.degree;
      return make({
        tableBytes: float.segmentCount * (n + 1) * bytes,
        multiplies: n,
        additions: 2 + n,
        shifts: 2,
        comparisons: 0,
        divisions: 0,
        conversions: 1,
        arithmetic: `${type} (segment index in integers)`,
        libraryCalls: soft,
      });
    }
    if (float.kind === 'mobius') {
      return make({
        tableBytes: 3 * bytes,
        multiplies: 2,
        additions: 3,
        shifts: 0,
        comparisons: 0,
        divisions: 1,
        conversions: 1,
        arithmetic: `${type} with a hardware divide`,
        libraryCalls: soft,
      });
    }
  }
  throw new BridgeworkError('invalid-option', `\`map\` must be a firmware map; got ${formatValue(map)}`, {
    param: 'map',
  });
}
