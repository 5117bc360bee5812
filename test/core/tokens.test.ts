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
