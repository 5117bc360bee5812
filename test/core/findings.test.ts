import { describe, expect, it } from "vitest";
import { contradictions, EXCLUSIVE, type Finding, sortFindings } from "../../core/findings.js";

const f = (code: string, severity: Finding["severity"]): Finding => ({ code, severity, text: code });

describe("findings", () => {
  it("sorts danger, then warning, then info, keeping the order within a severity", () => {
    const sorted = sortFindings([
      f("a", "info"),
      f("b", "warning"),
      f("c", "danger"),
      f("d", "warning"),
      f("e", "danger"),
    ]);
    expect(sorted.map((x) => x.code)).toEqual(["c", "e", "b", "d", "a"]);
  });

  it("never sorts in place", () => {
    const list = [f("a", "info"), f("b", "danger")];
    sortFindings(list);
    expect(list.map((x) => x.code)).toEqual(["a", "b"]);
    expect(sortFindings([f("x", "info")])).not.toBe(list);
  });

  it("finds contradicting pairs, and none in a coherent reading", () => {
    expect(contradictions(["gap.raised", "gap.normal", "tonicity.low"])).toEqual([
      ["gap.raised", "gap.normal"],
    ]);
    expect(contradictions(["gap.raised", "toxicAlcohol.possible", "hyponatraemia.hypotonic"])).toEqual([]);
    expect(contradictions(["correction.tooFast", "correction.withinLimits"])).toHaveLength(1);
  });

  it("every pair is two different codes, listed once", () => {
    const seen = new Set<string>();
    for (const [a, b] of EXCLUSIVE) {
      expect(a).not.toBe(b);
      const key = [a, b].sort().join("|");
      expect(seen.has(key), key).toBe(false);
      seen.add(key);
    }
  });
});
