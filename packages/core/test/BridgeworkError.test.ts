import { describe, expect, it } from 'vitest';
import { BridgeworkError, errorCodeDescriptions, errorCodes, isBridgeworkError } from '@bridgework/core';

describe('BridgeworkError', () => {
  it('is an Error with a stable code and machine-readable fields', () => {
    const e = new BridgeworkError('not-positive', '`excitationVolts` must be > 0; got -5', {
      param: 'excitationVolts',
      value: -5,
      limit: 0,
    });
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('BridgeworkError');
    expect(e.code).toBe('not-positive');
    expect(e.param).toBe('excitationVolts');
    expect(e.value).toBe(-5);
    expect(e.limit).toBe(0);
    expect(e.issues).toEqual([]);
    expect(e.message).toBe('`excitationVolts` must be > 0; got -5');
  });

  it('carries spec issues and a cause', () => {
    const cause = new Error('inner');
    const e = new BridgeworkError('invalid-spec', 'channel spec has 2 problems', {
      issues: [
        { path: 'adc.bits', message: '`adc.bits` must be an integer; got 2.5' },
        { path: 'excitation.volts', message: '`excitation.volts` must be > 0; got 0' },
      ],
      cause,
    });
    expect(e.issues).toHaveLength(2);
    expect(e.issues[0]?.path).toBe('adc.bits');
    expect(e.cause).toBe(cause);
  });

  it('lists every code once, each with a description', () => {
    expect(new Set(errorCodes).size).toBe(errorCodes.length);
    expect(errorCodes).toEqual(Object.keys(errorCodeDescriptions));
    for (const code of errorCodes) expect(errorCodeDescriptions[code].length).toBeGreaterThan(20);
    expect(Object.isFrozen(errorCodes)).toBe(true);
  });

  it('isBridgeworkError narrows by class and optionally by code', () => {
    const e = new BridgeworkError('overflow', 'x');
    expect(isBridgeworkError(e)).toBe(true);
    expect(isBridgeworkError(e, 'overflow')).toBe(true);
    expect(isBridgeworkError(e, 'singular')).toBe(false);
    expect(isBridgeworkError(new Error('x'))).toBe(false);
    expect(isBridgeworkError('overflow')).toBe(false);
  });
});
