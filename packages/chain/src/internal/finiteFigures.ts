/**
 * True when every number in a design check's figures is finite: a check whose figure is not
 * finite is never ok. (The documented domains keep every figure finite for accepted inputs; this
 * makes the rule hold by construction, not only by those bounds.)
 */
export function finiteFigures(value: unknown, depth = 0): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (typeof value !== 'object' || value === null || depth > 6) return true;
  if (Array.isArray(value)) return value.every((v) => finiteFigures(v, depth + 1));
  return Object.values(value).every((v) => typeof v === 'function' || finiteFigures(v, depth + 1));
}
