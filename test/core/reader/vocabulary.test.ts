import { describe, expect, it } from "vitest";
import { ANALYTE_IDS } from "../../../core/analytes.js";
import {
  ANALYTE_ALIASES,
  BLOOD_GAS_ALIASES,
  CLAIM_ALIASES,
  SPECIMEN_WORDS,
} from "../../../core/reader/vocabulary.js";

describe("the vocabulary", () => {
  it("every analyte has a name people type", () => {
    for (const id of ANALYTE_IDS) expect(ANALYTE_ALIASES[id]?.length, id).toBeGreaterThan(0);
  });

  it("no spelling names two analytes, and none is also a claim", () => {
    const owner = new Map<string, string>();
    for (const [id, aliases] of Object.entries(ANALYTE_ALIASES)) {
      for (const a of aliases) {
        expect(owner.get(a), `${a}: ${owner.get(a)} and ${id}`).toBeUndefined();
        owner.set(a, id);
      }
    }
    for (const aliases of Object.values(CLAIM_ALIASES))
      for (const a of aliases) expect(owner.has(a), `${a} is an analyte and a claim`).toBe(false);
  });

  it("spellings are lower case, trimmed", () => {
    const all = [
      ...Object.values(ANALYTE_ALIASES).flat(),
      ...Object.values(BLOOD_GAS_ALIASES).flat(),
      ...Object.values(CLAIM_ALIASES).flat(),
      ...Object.values(SPECIMEN_WORDS).flat(),
    ];
    for (const a of all) expect(a, a).toBe(a.toLowerCase().trim());
  });

  it("urine sodium is never spelt like the serum one", () => {
    expect(ANALYTE_ALIASES.sodium).not.toContain("una");
    expect(ANALYTE_ALIASES.urineSodium).toContain("una");
  });
});
