import { describe, expect, it } from "vitest";
import { entryOf, isName } from "../../../core/reader/names.js";

describe("the table of names", () => {
  it.each([
    ["na", { kind: "analyte", id: "sodium" }],
    ["sodium", { kind: "analyte", id: "sodium" }],
    ["glu", { kind: "analyte", id: "glucose" }],
    ["bun", { kind: "analyte", id: "bun" }],
    ["una", { kind: "analyte", id: "urineSodium", specimen: "urine" }],
    ["uosm", { kind: "analyte", id: "urineOsmolality", specimen: "urine" }],
    ["cna+", { kind: "analyte", id: "sodium", specimen: "bloodGas" }],
  ])("%s is %j", (word, entry) => {
    expect(entryOf(word)).toMatchObject(entry);
  });

  it("knows a specimen word and a claim", () => {
    expect(entryOf("urine")).toMatchObject({ kind: "specimen", specimen: "urine" });
    expect(entryOf("gap")?.kind).toBe("claim");
  });

  it("does not take ordinary words for names", () => {
    for (const w of ["the", "patient", "bed", "hello"]) expect(isName(w), w).toBe(false);
  });
});
