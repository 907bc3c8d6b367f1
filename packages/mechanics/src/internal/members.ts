import { BridgeworkError } from '@bridgework/core';
import { sectionProperties, type SectionProperties } from '../sectionProperties.js';
import { checkExclusive, checkGeometry, checkModulus } from './inputs.js';

/**
 * Reads a section property given either directly (`direct` option) or through `section`: exactly
 * one of the two.
 */
export function sectionOrDirect(
  o: Record<string, unknown>,
  direct: string,
  pick: (p: SectionProperties) => number,
  power: 2 | 3,
  unit: string,
): number {
  checkExclusive(o, ['section', direct]);
  if (o['section'] !== undefined) return pick(sectionProperties(o['section'] as never));
  if (o[direct] === undefined) {
    throw new BridgeworkError('missing-option', `\`${direct}\` or \`section\` must be given; got neither`, {
      param: direct,
      value: undefined,
    });
  }
  return checkGeometry(direct, o[direct], power, unit);
}

/** Young's modulus option, required. */
export function readModulus(o: Record<string, unknown>): number {
  return checkModulus('modulusPascals', o['modulusPascals']);
}
