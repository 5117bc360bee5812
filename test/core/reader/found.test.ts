// Inputs that once made the reader wrong (test/fixtures/found/reader.json), replayed on every run,
// and the seeded property that found the first of them.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readMessage } from "../../../core/reader/index.js";

interface Found {
  input: string;
  found: string;
  inputs: Record<string, number>;
  problems: string[];
  neverEchoed: string[];
}

const { cases } = JSON.parse(
  readFileSync(join(import.meta.dirname, "..", "..", "fixtures", "found", "reader.json"), "utf8"),
) as { cases: Found[] };

describe("inputs found once, kept as fixtures", () => {
  it.each(cases.map((c) => [c.input, c] as const))("%j", (_, c) => {
    const reading = readMessage(c.input);
    expect(reading.inputs).toEqual(c.inputs);
    const codes = reading.problems.map((p) => p.code);
    for (const code of c.problems) expect(codes).toContain(code);
    const out = JSON.stringify(reading);
    for (const part of c.neverEchoed) expect(out).not.toContain(part);
  });
});

describe("an e-mail address beside lab values", () => {
  it("is never read as a value, and never echoed (property)", () => {
    fc.assert(
      fc.property(
        fc.emailAddress(),
        fc.constantFrom("", "Na 131 ", "K 4.2 Na 131 "),
        fc.boolean(),
        (email, panel, before) => {
          const message = before ? `${email} ${panel}` : `${panel}${email}`;
          const reading = readMessage(message);
          const expected = readMessage(panel).inputs;
          expect(reading.inputs, message).toEqual(expected);
          expect(JSON.stringify(reading), message).not.toContain(email);
        },
      ),
      { numRuns: 500 },
    );
  });
});
