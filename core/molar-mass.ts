/**
 * Molar masses from IUPAC conventional atomic weights (IUPAC, Standard Atomic Weights, abridged
 * to five significant figures). Each analyte's molar mass is derived from its formula here, so a
 * reader can check it by hand.
 */
export const ATOMIC_WEIGHTS = {
  H: 1.008,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  Na: 22.99,
  K: 39.098,
  Cl: 35.45,
} as const;

export type Element = keyof typeof ATOMIC_WEIGHTS;

/** Sum of atomic weights for a formula given as element counts, e.g. { C: 6, H: 12, O: 6 }. */
export function molarMass(formula: Partial<Record<Element, number>>): number {
  let total = 0;
  for (const [element, count] of Object.entries(formula) as [Element, number][]) {
    total += ATOMIC_WEIGHTS[element] * count;
  }
  return total;
}

/** Hill-order text of a formula, e.g. "C6H12O6", for display and docs. */
export function formulaText(formula: Partial<Record<Element, number>>): string {
  return (Object.entries(formula) as [Element, number][])
    .map(([element, count]) => (count === 1 ? element : `${element}${count}`))
    .join("");
}
