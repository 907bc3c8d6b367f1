import { describe, expect, it } from 'vitest';
import {
  BridgeworkError,
  checkInterval,
  checkOptions,
  closestName,
  editDistance,
  isBridgeworkError,
  BRIDGEWORK_ERROR_BRAND,
} from '@bridgework/core';

describe('checkOptions', () => {
  const keys = { known: ['whiteDensity', 'cornerHertz', 'bandwidthHertz'], required: ['whiteDensity'] };

  it('returns a clean options object as given', () => {
    const o = { whiteDensity: 1e-8, cornerHertz: 2 };
    expect(checkOptions('options', o, keys)).toBe(o);
  });

  it('names the closest known key for a misspelt one', () => {
    expect(() => checkOptions('options', { whiteDensty: 1e-8 }, keys)).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'options.whiteDensty',
      },
    );
    let caught: unknown;
    try {
      checkOptions('options', { whiteDensity: 1, cornerHerz: 2 }, keys);
    } catch (e) {
      caught = e;
    }
    expect((caught as BridgeworkError).message).toBe(
      '`options.cornerHerz` is not a known option; did you mean `cornerHertz`?',
    );
    expect((caught as BridgeworkError).limit).toEqual(keys.known);
    expect(() => checkOptions('options', { whiteDensity: 1, zzz: 2 }, keys)).toThrow(
      '`options.zzz` is not a known option (known: whiteDensity, cornerHertz, bandwidthHertz)',
    );
  });

  it('treats prototype-named keys as unknown, never as inherited members', () => {
    for (const key of ['constructor', 'toString', 'hasOwnProperty', '__proto__', 'valueOf']) {
      const o = JSON.parse(`{"whiteDensity": 1, "${key}": 2}`) as unknown;
      expect(() => checkOptions('options', o, keys)).toThrowBridgeworkError('unknown-option');
    }
  });

  it('reports a required key that is absent or undefined', () => {
    expect(() => checkOptions('options', {}, keys)).toThrowBridgeworkError('missing-option', {
      param: 'options.whiteDensity',
    });
    expect(() => checkOptions('options', { whiteDensity: undefined }, keys)).toThrowBridgeworkError(
      'missing-option',
    );
  });

  it('rejects what is not an options object', () => {
    for (const bad of [null, undefined, 3, 'x', [], [1]]) {
      expect(() => checkOptions('options', bad, keys)).toThrowBridgeworkError('wrong-type');
    }
  });
});

describe('closestName', () => {
  it('finds near misses and letter-case slips, and nothing for far ones', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3); // the textbook Levenshtein example
    expect(closestName('whiteDensty', ['whiteDensity', 'cornerHertz'])).toBe('whiteDensity');
    expect(closestName('GAIN', ['gain', 'bits'])).toBe('gain');
    expect(closestName('xyz', ['whiteDensity'])).toBeUndefined();
    // Two adjacent letters swapped are one typo (optimal string alignment), even in a short name.
    expect(closestName('ta', ['at', 'monteCarlo', 'limits'])).toBe('at');
    expect(closestName('kidn', ['kind', 'name'])).toBe('kind');
    expect(closestName('ab', ['cd'])).toBeUndefined();
    expect(editDistance('ta', 'at')).toBe(2); // editDistance itself stays Levenshtein
    expect(closestName('a'.repeat(10_000), ['a'])).toBeUndefined();
  });
});

describe('checkInterval', () => {
  it('accepts finite ordered ends and rejects the rest', () => {
    expect(checkInterval('span', { min: -1, max: 1 })).toEqual({ min: -1, max: 1 });
    expect(checkInterval('span', { min: 1, max: 1 })).toEqual({ min: 1, max: 1 });
    expect(() => checkInterval('span', { min: 1, max: 1 }, { strict: true })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'span.max' },
    );
    expect(() => checkInterval('span', { min: 2, max: 1 })).toThrowBridgeworkError('out-of-range');
    expect(() => checkInterval('span', { min: Number.NaN, max: 1 })).toThrowBridgeworkError('not-finite');
    expect(() => checkInterval('span', { low: 0, high: 1 })).toThrowBridgeworkError('unknown-option');
    expect(() => checkInterval('span', [0, 1])).toThrowBridgeworkError('wrong-type');
  });
});

describe('error brand', () => {
  it('recognises an error from another copy of core by its registered brand', () => {
    // A second copy of the class, as another installed version of @bridgework/core would define it.
    class OtherCopy extends Error {
      readonly code = 'not-positive';
      constructor() {
        super('from another copy');
        Object.defineProperty(this, Symbol.for('@bridgework/core/BridgeworkError'), { value: true });
      }
    }
    const foreign = new OtherCopy();
    expect(isBridgeworkError(foreign)).toBe(true);
    expect(isBridgeworkError(foreign, 'not-positive')).toBe(true);
    expect(isBridgeworkError(foreign, 'negative')).toBe(false);
    expect(foreign instanceof BridgeworkError).toBe(true);
    expect(new Error('plain') instanceof BridgeworkError).toBe(false);
    expect(isBridgeworkError({ code: 'not-positive' })).toBe(false);
    expect(BRIDGEWORK_ERROR_BRAND).toBe(Symbol.for('@bridgework/core/BridgeworkError'));
  });
});
