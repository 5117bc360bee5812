import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MAX_TOKEN_LENGTH, tokenize } from "../../core/tokens.js";

describe("the privacy guard's tokenizer", () => {
  it("splits on spaces and keeps each token's place", () => {
    const text = "Na 128  bed 4";
    const tokens = tokenize(text);
    expect(tokens.map((t) => t.text)).toEqual(["Na", "128", "bed", "4"]);
    for (const t of tokens) expect(text.slice(t.start, t.end)).toBe(t.text);
  });

  it("every token is a slice of the text at its place (property)", () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (text) => {
        for (const t of tokenize(text)) expect(text.slice(t.start, t.end)).toBe(t.text);
      }),
    );
  });

  it("tokens come in order and never overlap (property)", () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (text) => {
        let end = 0;
        for (const t of tokenize(text)) {
          expect(t.start).toBeGreaterThanOrEqual(end);
          end = t.end;
        }
      }),
    );
  });

  it("reads a very long run without failing", () => {
    const tokens = tokenize("x".repeat(MAX_TOKEN_LENGTH * 4));
    expect(tokens.length).toBeGreaterThan(0);
  });
});

describe("what splits a token and what stays inside one", () => {
  // Each row: the text, and the tokens it gives (our own rules, written in core/tokens.ts).
  it.each([
    // Every separator, one at a time, between two words.
    ...[" ", "\t", "\n", "\r", "\f", "\v", ";", "=", ",", ":", "(", ")", "[", "]", "|", '"', "{", "}"].map(
      (sep) => [`Na${sep}K`, ["Na", "K"]] as const,
    ),
    // White space outside ASCII: no-break, line and paragraph separators, thin and ideographic spaces.
    ["Na\u00a0128", ["Na", "128"]],
    ["Na\u2028128", ["Na", "128"]],
    ["Na\u2029128", ["Na", "128"]],
    ["Na\u2009128", ["Na", "128"]],
    ["Na\u3000128", ["Na", "128"]],
    // Letters outside ASCII are not separators.
    ["µmol/L", ["µmol/L"]],
    ["Näße", ["Näße"]],
    // A comma or colon between two digits stays: a decimal comma, a time.
    ["38,5", ["38,5"]],
    ["03:15", ["03:15"]],
    // … but not beside a letter or at either end.
    ["Na,128", ["Na", "128"]],
    ["128,K", ["128", "K"]],
    ["Na:128", ["Na", "128"]],
    ["12:a", ["12", "a"]],
    ["12,", ["12"]],
    [",12", ["12"]],
    // A web address stays one token; a colon before "//" with nothing before it does not.
    ["https://a.b/c", ["https://a.b/c"]],
    [" ://a", ["//a"]],
    ["a:/b", ["a", "/b"]],
    // A slash inside a token stays; lone pieces of punctuation are dropped.
    ["mg/dL", ["mg/dL"]],
    ["Na / K", ["Na", "K"]],
    ["Na - K", ["Na", "K"]],
    ["Na – K", ["Na", "K"]],
    ["Na . K", ["Na", "K"]],
    ["Na & K", ["Na", "K"]],
    ["Na -- K", ["Na", "--", "K"]],
    ["Na // K", ["Na", "//", "K"]],
    // The last token ends at the end of the text.
    ["a", ["a"]],
    ["", []],
    ["   ", []],
  ] as [string, string[]][])("%j gives %j", (text, expected) => {
    const tokens = tokenize(text);
    expect(tokens.map((t) => t.text)).toEqual(expected);
    for (const t of tokens) expect(text.slice(t.start, t.end)).toBe(t.text);
  });

  it("keeps each token's offsets in a line of several separators", () => {
    expect(tokenize("(Na: 128)")).toEqual([
      { text: "Na", start: 1, end: 3 },
      { text: "128", start: 5, end: 8 },
    ]);
  });
});

describe("digits beside a comma or colon", () => {
  // Every digit on each side keeps the decimal comma or the time inside its token.
  it.each(["0", "1", "5", "8", "9"].flatMap((d) => [`${d},${d}`, `${d}:${d}5`]))(
    "%s is one token",
    (text) => {
      expect(tokenize(text).map((t) => t.text)).toEqual([text]);
    },
  );
  it.each([
    ["a,9", ["a", "9"]],
    ["9,a", ["9", "a"]],
    ["/,9", ["9"]],
    ["9:/", ["9"]],
  ])("%s is split: %j", (text, expected) => {
    expect(tokenize(text).map((t) => t.text)).toEqual(expected);
  });
});
