import { describe, expect, it } from 'vitest';
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkLength,
  checkNonNegative,
  checkObject,
  checkOneOf,
  checkPositive,
  checkRange,
  describeRange,
  formatValue,
  requireOption,
} from '@bridgework/core';

function caught(fn: () => unknown): BridgeworkError {
  try {
    fn();
  } catch (e) {
    if (e instanceof BridgeworkError) return e;
    throw e;
  }
  throw new Error('nothing was thrown');
}

describe('message grammar', () => {
  it('reads "`param` must be <requirement>; got <value>"', () => {
    expect(caught(() => checkPositive('excitationVolts', -5)).message).toBe(
      '`excitationVolts` must be > 0; got -5',
    );
    expect(caught(() => checkFinite('strain', Number.NaN)).message).toBe(
      '`strain` must be a finite number; got NaN',
    );
    expect(caught(() => checkRange('temperatureCelsius', 900, { min: -200, max: 850 })).message).toBe(
      '`temperatureCelsius` must be in [-200, 850]; got 900',
    );
    expect(caught(() => checkOneOf('wiring', 'tw0-wire', ['two-wire', 'three-wire'])).message).toBe(
      "`wiring` must be one of 'two-wire', 'three-wire'; got 'tw0-wire'",
    );
    expect(caught(() => requireOption('poissonRatio', undefined, "for 'half-poisson'")).message).toBe(
      "`poissonRatio` must be given for 'half-poisson'; got undefined",
    );
  });

  it('formats values for messages', () => {
    expect(formatValue(-0)).toBe('-0');
    expect(formatValue(-Infinity)).toBe('-Infinity');
    expect(formatValue('a')).toBe("'a'");
    expect(formatValue(3n)).toBe('3n');
    expect(formatValue(null)).toBe('null');
    expect(formatValue([1, 2])).toBe('an array of length 2');
    expect(formatValue({})).toBe('an object');
    expect(formatValue(() => 1)).toBe('function');
  });
});

describe('checkFinite', () => {
  it('returns finite numbers unchanged', () => {
    expect(checkFinite('x', -1.5)).toBe(-1.5);
    expect(checkFinite('x', 0)).toBe(0);
  });
  it.each([Number.NaN, Infinity, -Infinity])('rejects %s as not-finite', (v) => {
    expect(() => checkFinite('x', v)).toThrowBridgeworkError('not-finite', { param: 'x' });
  });
  it.each(['1', null, undefined, 1n, {}])('rejects %s as wrong-type', (v) => {
    expect(() => checkFinite('x', v)).toThrowBridgeworkError('wrong-type', { param: 'x' });
  });
});

describe('checkPositive', () => {
  it('accepts positive numbers and, when allowed, +Infinity', () => {
    expect(checkPositive('r', 1e-300)).toBe(1e-300);
    expect(checkPositive('r', Infinity, { allowInfinity: true })).toBe(Infinity);
  });
  it('rejects zero, negatives and -0 as not-positive, with the limit', () => {
    for (const v of [0, -0, -1]) {
      const e = caught(() => checkPositive('r', v));
      expect(e.code).toBe('not-positive');
      expect(e.limit).toBe(0);
    }
  });
  it('rejects NaN and infinities as not-finite', () => {
    expect(() => checkPositive('r', Number.NaN)).toThrowBridgeworkError('not-finite');
    expect(() => checkPositive('r', Infinity)).toThrowBridgeworkError('not-finite');
    expect(() => checkPositive('r', -Infinity, { allowInfinity: true })).toThrowBridgeworkError('not-finite');
  });
});

describe('checkNonNegative', () => {
  it('accepts zero and positives, rejects negatives', () => {
    expect(checkNonNegative('r', 0)).toBe(0);
    expect(checkNonNegative('r', 2)).toBe(2);
    expect(() => checkNonNegative('r', -1e-9)).toThrowBridgeworkError('negative', { param: 'r' });
    expect(() => checkNonNegative('r', Infinity)).toThrowBridgeworkError('not-finite');
  });
});

describe('checkRange and describeRange', () => {
  it('honours open and closed ends', () => {
    const nu = { min: -1, max: 0.5, minExclusive: true };
    expect(checkRange('nu', 0.5, nu)).toBe(0.5);
    expect(() => checkRange('nu', -1, nu)).toThrowBridgeworkError('out-of-range');
    expect(() => checkRange('nu', 0.5000001, nu)).toThrowBridgeworkError('out-of-range');
    expect(caught(() => checkRange('nu', 0.6, nu)).limit).toEqual([-1, 0.5]);
    expect(describeRange(nu)).toBe('in (-1, 0.5]');
    expect(describeRange({ min: 0 })).toBe('in [0, Infinity)');
    expect(describeRange({ max: 1, maxExclusive: true })).toBe('in (-Infinity, 1)');
  });
});

describe('checkInteger', () => {
  it('requires integers inside the range', () => {
    expect(checkInteger('bits', 24, { min: 1, max: 32 })).toBe(24);
    expect(() => checkInteger('bits', 2.5)).toThrowBridgeworkError('not-integer');
    expect(() => checkInteger('bits', 0, { min: 1 })).toThrowBridgeworkError('out-of-range');
  });
});

describe('checkOneOf, requireOption, checkLength, checkObject', () => {
  it('checkOneOf narrows and reports the choices', () => {
    expect(checkOneOf('w', 'a', ['a', 'b'])).toBe('a');
    expect(caught(() => checkOneOf('w', 3, ['a', 'b'])).limit).toEqual(['a', 'b']);
  });
  it('requireOption rejects undefined and null only', () => {
    expect(requireOption('x', 0)).toBe(0);
    expect(() => requireOption('x', null)).toThrowBridgeworkError('missing-option', { param: 'x' });
  });
  it('checkLength requires an array of the exact length', () => {
    expect(checkLength('a', [1, 2, 3, 4], 4)).toEqual([1, 2, 3, 4]);
    expect(() => checkLength('a', [1, 2, 3], 4)).toThrowBridgeworkError('invalid-shape');
    expect(() => checkLength('a', 'abcd', 4)).toThrowBridgeworkError('invalid-shape');
  });
  it('checkObject rejects null, arrays and primitives', () => {
    expect(checkObject('options', { a: 1 })).toEqual({ a: 1 });
    for (const v of [null, [], 3, undefined]) {
      expect(() => checkObject('options', v)).toThrowBridgeworkError('wrong-type', { param: 'options' });
    }
  });
});
