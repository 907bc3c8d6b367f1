import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { C_NAME_MAX_LENGTH, cIdentifierFromName } from '@bridgework/firmware';

describe('cIdentifierFromName', () => {
  it('folds accents, transliterates, and joins words with single underscores', () => {
    expect(cIdentifierFromName('Wägezelle 2 "links"')).toBe('wagezelle_2_links');
    expect(cIdentifierFromName('Øresund µε gauge')).toBe('oresund_ue_gauge');
    expect(cIdentifierFromName('Straße */ ??/ \\n')).toBe('strasse_n');
    expect(cIdentifierFromName('__init__')).toBe('init');
    expect(cIdentifierFromName('1st stage')).toBe('1st_stage');
  });

  it('gives only [a-z0-9_] without leading, trailing or doubled underscores, for any text (property)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 60 }), (name) => {
        let id: string;
        try {
          id = cIdentifierFromName(name);
        } catch (e) {
          // Only a name without any letter or digit that survives folding is refused.
          expect((e as { code: string }).code).toBe('invalid-option');
          return;
        }
        expect(id).toMatch(/^[a-z0-9](?:[a-z0-9_]*[a-z0-9])?$/);
        expect(id).not.toContain('__');
        expect(id.length).toBeLessThanOrEqual(C_NAME_MAX_LENGTH);
      }),
      { numRuns: 1000 },
    );
  });

  it('cuts long names to 32 characters without a trailing underscore', () => {
    expect(cIdentifierFromName(`${'a'.repeat(31)} b`)).toBe('a'.repeat(31));
  });

  it('rejects names with nothing left and non-strings', () => {
    expect(() => cIdentifierFromName('*/ ??')).toThrowBridgeworkError('invalid-option', { param: 'name' });
    expect(() => cIdentifierFromName('')).toThrowBridgeworkError('invalid-option', { param: 'name' });
    expect(() => cIdentifierFromName(42 as unknown as string)).toThrowBridgeworkError('wrong-type', {
      param: 'name',
    });
  });
});
