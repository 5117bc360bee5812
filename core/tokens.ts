/**
 * Splits a message into tokens with their offsets, in one linear pass (no regular expression runs
 * over the whole text, so no catastrophic backtracking). Separators: white space, ; = : , ( ) [ ]
 * | and quotes — except a comma or colon between two digits, which stays inside the token ("38,5",
 * "03:15"). A slash stays inside a token ("mg/dL"); a slash on its own is a separator.
 */
export interface Token {
  text: string;
  start: number;
  end: number;
}

/** Tokens longer than this are never matched against patterns; the reader reports them as unknown. */
export const MAX_TOKEN_LENGTH = 256;

const SEPARATORS = new Set([
  " ",
  "\t",
  "\n",
  "\r",
  "\f",
  "\v",
  ";",
  "=",
  ",",
  ":",
  "(",
  ")",
  "[",
  "]",
  "|",
  '"',
  "{",
  "}",
  "\u00a0",
  "\u2028",
  "\u2029",
]);

/** Separators below U+0080 by character code, for the scan below. */
const ASCII_SEPARATOR = new Uint8Array(128);
// Stryker disable next-line all: marking a code of 128 or more in a table of 128 is a no-op
for (const c of SEPARATORS) if (c.charCodeAt(0) < 128) ASCII_SEPARATOR[c.charCodeAt(0)] = 1;

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= "0" && c <= "9";
}

export function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let start = -1;
  for (let i = 0; i <= text.length; i++) {
    // Stryker disable next-line all: a fast path for the common case; the general test below gives the same result
    const code = i < text.length ? text.charCodeAt(i) : -1;
    // Stryker disable next-line all: a fast path for the common case; the general test below gives the same result
    if (code >= 0 && code < 128 && ASCII_SEPARATOR[code] === 0) {
      if (start < 0) start = i;
      continue;
    }
    const c = text[i];
    // Stryker disable next-line EqualityOperator: U+007F (delete) is no white space either way
    let separator = c === undefined || SEPARATORS.has(c) || (c > "\u007f" && /\s/.test(c));
    if (separator && (c === "," || c === ":") && isDigit(text[i - 1]) && isDigit(text[i + 1]) && start >= 0) {
      separator = false;
    }
    // "https://…" stays one token.
    if (separator && c === ":" && start >= 0 && text[i + 1] === "/" && text[i + 2] === "/") separator = false;
    if (!separator && start < 0) start = i;
    if (separator && start >= 0) {
      const piece = text.slice(start, i);
      if (piece !== "/" && piece !== "-" && piece !== "–" && piece !== "." && piece !== "&") {
        tokens.push({ text: piece, start, end: i });
      }
      start = -1;
    }
  }
  return tokens;
}
