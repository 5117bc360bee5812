/** The fast slice of `npm run soak`: a few seconds of mixed Slack and Teams traffic with Redis. */
import { describe, expect, it } from "vitest";
import { runSoak } from "../bench/soak.js";

describe("soak (fast slice)", () => {
  it("mixed traffic with Redis: zero errors, malformed bodies refused, nothing leaks", async () => {
    const r = await runSoak({
      seconds: 3,
      rate: 40,
      server: [process.execPath, "--import", "tsx", "bot/main.ts"],
    });
    expect(r.errors).toBe(0);
    expect(r.non2xx).toBe(0);
    // Bodies no platform sends, mixed in: every one refused with 400, the rest answered.
    expect(r.refused.sent).toBeGreaterThan(0);
    expect(r.refused.otherwise).toBe(0);
    // (a few may still be in flight when the run's time is up)
    expect(r.refused.answered400).toBeGreaterThan(0);
    expect(r.requests.slack).toBeGreaterThan(20);
    expect(r.requests.teams).toBeGreaterThan(20);
    // Latency budgets (Slack's 3 s) are npm run soak's, measured and reported there.
    expect(r.leaks).toEqual([]);
  }, 60_000);
});
