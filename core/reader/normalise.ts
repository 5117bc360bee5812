/**
 * What a results viewer, a phone keyboard or a word processor puts into pasted text, folded to
 * plain characters before reading: full-width digits and letters (NFKC), curly quotes, every kind
 * of dash and minus, non-breaking and thin spaces, zero-width characters, the micro sign, "mg / dl", dot leaders.
 * Linear; plain ASCII without a spaced unit is returned as it is.
 */
const DASHES = /[\u2010-\u2015\u2212\uFE58\uFE63\uFF0D]/g;
const QUOTES_SINGLE = /[\u2018\u2019\u201A\u201B\u2032]/g;
const QUOTES_DOUBLE = /[\u201C\u201D\u201E\u201F\u2033]/g;
const ZERO_WIDTH = /[\u200B-\u200D\u2060\uFEFF\u00AD]/g;
const SPACES = /[\u00A0\u2000-\u200A\u202F\u205F\u3000]/g;
/** "mg / dl", "mmol /L", "mOsm/ kg": a unit written with a space beside its slash. */
const SPACED_UNIT = /\b(m?g|mmol|umol|µmol|meq|mosm|mosmol|ng|pmol|nmol)(?:\s+\/\s*|\/\s+)(dl|l|kg|ml)\b/gi;

/** Three or more full stops (or an ellipsis, after NFKC) in a row. */
const LEADER = /\.{3,}/g;

// Stryker disable all: a fast path; on plain ASCII the replacements below change nothing anyway
function isAscii(text: string): boolean {
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) > 0x7f) return false;
  return true;
}
// Stryker restore all

export function normalise(text: string): string {
  let out = text;
  // Stryker disable next-line ConditionalExpression,LogicalOperator: a fast path; the replacement changes nothing when this is false
  if (!isAscii(out)) {
    out = out
      .normalize("NFKC")
      .replace(ZERO_WIDTH, "")
      .replace(SPACES, " ")
      .replace(DASHES, "-")
      .replace(QUOTES_SINGLE, "'")
      .replace(QUOTES_DOUBLE, '"')
      .replace(/[µμ]/g, "u")
      .replace(/\u2028|\u2029/g, "\n");
  }
  // Stryker disable next-line ConditionalExpression,LogicalOperator: a fast path; the replacement changes nothing when this is false
  if (out.includes("\r")) out = out.replace(/\r\n?/g, "\n");
  // Stryker disable next-line ConditionalExpression,LogicalOperator: a fast path; the replacement changes nothing when this is false
  if (out.includes(" /") || out.includes("/ ")) out = out.replace(SPACED_UNIT, "$1/$2");
  // Dot leaders of printed reports ("Sodium..........128") are spacing.
  // Stryker disable next-line ConditionalExpression,LogicalOperator: a fast path; the replacement changes nothing when this is false
  if (out.includes("...")) out = out.replace(LEADER, " ");
  return out;
}
