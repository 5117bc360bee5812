import { describe, expect, it } from "vitest";
import { CAUTION_PRIORITY, CAUTIONS, SHORT_CAUTIONS } from "../../core/cautions.js";

describe("cautions", () => {
  it("every caution has a short form that is shorter than it", () => {
    for (const id of Object.keys(CAUTIONS) as (keyof typeof CAUTIONS)[]) {
      expect(SHORT_CAUTIONS[id], id).toBeTruthy();
      expect(SHORT_CAUTIONS[id].length, id).toBeLessThan(CAUTIONS[id].length);
    }
  });

  it("the general caution defers to local protocols and the treating clinician", () => {
    expect(CAUTIONS.general).toMatch(/local protocol/i);
    expect(CAUTIONS.general).toMatch(/clinician|treating team/i);
  });

  it("the first view's priority names known cautions, each once, the critical value first", () => {
    expect(new Set(CAUTION_PRIORITY).size).toBe(CAUTION_PRIORITY.length);
    for (const id of CAUTION_PRIORITY) expect(Object.keys(CAUTIONS)).toContain(id);
    expect(CAUTION_PRIORITY[0]).toBe("criticalValue");
  });
});
