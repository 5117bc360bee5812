/** The fast slice of `npm run soak`: a few seconds of mixed Slack and Teams traffic with Redis. */
import { describe, expect, it } from "vitest";
import { runSoak } from "../bench/soak.js";

describe("soak (fast slice)", () => {
  it("mixed traffic with Redis: zero errors, Slack acknowledged well inside 3 s, nothing leaks", async () => {
    const r = await runSoak({
      seconds: 3,
      rate: 40,
      server: [process.execPath, "--import", "tsx", "bot/main.ts"],
    });
    expect(r.errors).toBe(0);
    expect(r.non2xx).toBe(0);
    expect(r.requests.slack).toBeGreaterThan(20);
    expect(r.requests.teams).toBeGreaterThan(20);
    // Under tsx and a busy test run the first answers pay for loading; still inside Slack's 3 s.
    expect(r.slackAckMs.max).toBeLessThan(2500);
    expect(r.leaks).toEqual([]);
  }, 60_000);
});
