import { describe, expect, it } from "vitest";
import { math } from "../../core/unit-math.js";

describe("the unit-only mathjs instance", () => {
  it("converts mass concentrations (1 g/L is 100 mg/dL)", () => {
    expect(math.unit(1, "g/L").toNumber("mg/dL")).toBeCloseTo(100, 12);
  });

  it("has units but not the expression parser (the full import is not loaded)", () => {
    expect(typeof math.unit).toBe("function");
    expect((math as { evaluate?: unknown }).evaluate).toBeUndefined();
  });
});
