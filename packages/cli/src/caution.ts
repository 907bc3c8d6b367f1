/**
 * The safety caution that every report written by the command carries (text, JSON and HTML).
 *
 * @remarks
 * The wording is that of docs/safety.md: strain and load results decide whether structures and
 * lifting gear are safe, and weighing for trade is regulated, so a computed result is never the
 * last word.
 */
export const SAFETY_CAUTION =
  'Results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.';
