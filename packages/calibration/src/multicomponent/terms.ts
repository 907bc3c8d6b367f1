/** The terms of a multi-component model: offset, linear, squares and products of load components. */

/** Which second-order terms a multi-component model may hold (AIAA R-091's interaction terms). */
export type InteractionTerms = 'none' | 'squares' | 'products' | 'second-order';

/** Every {@link InteractionTerms} choice. */
export const interactionTermChoices: readonly InteractionTerms[] = [
  'none',
  'squares',
  'products',
  'second-order',
];

/** One term g(F) of a multi-component model: reading_i = Σ_t b_it·g_t(F). */
export interface ModelTerm {
  /** `'offset'` (g = 1), `'linear'` (F_j), `'square'` (F_j²) or `'product'` (F_j·F_k, j < k). */
  readonly kind: 'offset' | 'linear' | 'square' | 'product';
  /** The component indices the term multiplies (none, [j], [j, j] or [j, k]). */
  readonly components: readonly number[];
  /** A readable name from the component names: `1`, `Fx`, `Fx²`, `Fx·My`. */
  readonly name: string;
}

/** The candidate terms in their fixed order: offset, linear, squares, products (j < k, row by row). */
export function candidateTerms(
  names: readonly string[],
  offset: boolean,
  interactions: InteractionTerms,
): ModelTerm[] {
  const m = names.length;
  const terms: ModelTerm[] = [];
  if (offset) terms.push({ kind: 'offset', components: [], name: '1' });
  for (let j = 0; j < m; j++) terms.push({ kind: 'linear', components: [j], name: names[j] as string });
  if (interactions === 'squares' || interactions === 'second-order') {
    for (let j = 0; j < m; j++) terms.push({ kind: 'square', components: [j, j], name: `${names[j]}²` });
  }
  if (interactions === 'products' || interactions === 'second-order') {
    for (let j = 0; j < m; j++) {
      for (let k = j + 1; k < m; k++) {
        terms.push({ kind: 'product', components: [j, k], name: `${names[j]}·${names[k]}` });
      }
    }
  }
  return terms;
}

/** The value of a term at a load state. */
export function termValue(term: ModelTerm, loads: ArrayLike<number>): number {
  const c = term.components;
  if (c.length === 0) return 1;
  if (c.length === 1) return loads[c[0] as number] as number;
  return (loads[c[0] as number] as number) * (loads[c[1] as number] as number);
}
