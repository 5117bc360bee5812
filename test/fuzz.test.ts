/** The fast slice of `npm run fuzz`: the same generators and checks, a few thousand inputs. */
import { describe, expect, it } from "vitest";
import { oracle, runFuzz } from "../bench/fuzz.js";

describe("fuzzing (fast slice)", () => {
  it("the oracle evaluates plain arithmetic and refuses the rest", () => {
    expect(oracle("2*128 + 540/18 + 14")).toBe(300);
    expect(oracle("2 × (128 + 4) − 3")).toBe(261);
    expect(oracle("cos(1)")).toBeUndefined();
  });

  // Time budgets are npm run fuzz's; here only correctness, so a loaded machine cannot fail it.
  it("no exception escapes; every answer is a correct result or a clear problem", async () => {
    const reports = await runFuzz({ count: 6000, seconds: 60, seed: 20261201, timeBudgets: false });
    for (const r of reports) {
      expect(r.failures, r.target).toEqual([]);
      // HTTP bodies are real requests over loopback: a twentieth of the count.
      expect(r.runs, r.target).toBeGreaterThan(r.target.startsWith("HTTP") ? 200 : 1000);
    }
  }, 120_000);
});
