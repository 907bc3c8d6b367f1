/** Checks a {@link PiecewisePolynomial} given by a caller (it may have been built or edited by hand). */
import { BridgeworkError, checkFinite, checkInteger, checkOptions, formatValue } from '@bridgework/core';
import { MAX_PIECEWISE_DEGREE, type PiecewisePolynomial } from '../piecewisePolynomial.js';
import { checkCodeRange } from './codes.js';

const KEYS = ['codeMin', 'codeMax', 'segmentBase', 'segmentBits', 'segmentCount', 'degree', 'coefficients'];

/** Checks the fields and their consistency; returns the value typed. */
export function checkPiecewisePolynomial(param: string, value: unknown): PiecewisePolynomial {
  const o = checkOptions(param, value, { known: KEYS, required: KEYS });
  const { codeMin, codeMax } = checkCodeRange(o, `${param}.`);
  const segmentBits = checkInteger(`${param}.segmentBits`, o['segmentBits'], { min: 1, max: 31 });
  const length = 2 ** segmentBits;
  const segmentBase = checkInteger(`${param}.segmentBase`, o['segmentBase'], {
    min: Math.max(-(2 ** 31), codeMin - length + 1),
    max: codeMin,
  });
  const count = Math.floor((codeMax - segmentBase) / length) + 1;
  checkInteger(`${param}.segmentCount`, o['segmentCount'], { min: count, max: count });
  const degree = checkInteger(`${param}.degree`, o['degree'], { min: 0, max: MAX_PIECEWISE_DEGREE });
  const list = o['coefficients'];
  if (!Array.isArray(list) || list.length !== count) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}.coefficients\` must hold ${count} segments; got ${formatValue(list)}`,
      { param: `${param}.coefficients`, value: list, limit: count },
    );
  }
  list.forEach((row: unknown, i: number) => {
    const p = `${param}.coefficients[${i}]`;
    if (!Array.isArray(row) || row.length !== degree + 1) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`${p}\` must hold ${degree + 1} numbers; got ${formatValue(row)}`,
        {
          param: p,
          value: row,
          limit: degree + 1,
        },
      );
    }
    row.forEach((c: unknown, j: number) => checkFinite(`${p}[${j}]`, c));
  });
  return o as unknown as PiecewisePolynomial;
}
