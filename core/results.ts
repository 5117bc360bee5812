/** The shape of every computed number: its value at full precision, unit, formula and working. */
export interface Result {
  /** Stable key, e.g. "calculatedOsmolality" or "calculatedOsmolality.dorwartChalmers". */
  id: string;
  /** Plain label for replies. */
  label: string;
  /** Full precision; replies round, the JSON contract does not. */
  value: number;
  unit: string;
  /** The formula's name as replies show it. */
  formula: string;
  /** The numbers substituted, step by step, so a colleague can check it by hand. */
  working: string;
  /** Where the formula is published, or "common practice". */
  source: string;
}
