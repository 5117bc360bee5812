import { describe, expect, it } from "vitest";
import { MemoryStore } from "../../adapters/store/memory.js";
import { loadConfig } from "../../bot/config.js";
import { setLogSink } from "../../bot/log.js";
import type { Reply } from "../../bot/reply.js";
import { rehearse } from "../../bot/warm.js";

describe("the start-up rehearsal", () => {
  it("runs each message through reading, rules and every renderer, logging and keeping nothing elsewhere", async () => {
    const logs: string[] = [];
    setLogSink((l) => logs.push(l));
    const rendered: Reply[] = [];
    const store = new MemoryStore();
    try {
      await rehearse(
        loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" }),
        "slack",
        [(r) => rendered.push(r)],
        store,
      );
    } finally {
      setLogSink(() => {});
    }
    expect(rendered.length).toBeGreaterThanOrEqual(2);
    // Real answers, not empty ones: the panel is computed and the pasted report read.
    expect(rendered[0]!.headline).not.toBe("");
    expect(JSON.stringify(rendered[0])).toContain("300.0");
    expect(JSON.stringify(rendered[1])).toContain("lab range 275–295");
    expect(logs).toEqual([]);
  });
});
