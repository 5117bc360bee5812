import { describe, expect, it } from "vitest";
import { checkBlocks, LIMITS } from "../../../adapters/slack/limits.js";
import { escapeMrkdwn, render } from "../../../adapters/slack/render.js";
import { emptyReply } from "../../../bot/reply.js";

describe("Block Kit rendering", () => {
  it("keeps within Block Kit's limits however large the reply", () => {
    const reply = emptyReply("result", "x".repeat(5000));
    reply.readAs = "r".repeat(5000);
    reply.facts = Array.from({ length: 14 }, (_, i) => ({
      label: `fact ${i}`,
      value: "v".repeat(3000),
      formula: "f",
    }));
    reply.interpretation = Array.from({ length: 120 }, () => "i".repeat(900));
    reply.problems = Array.from({ length: 30 }, () => ({ code: "c", message: "p".repeat(4000) }));
    reply.working = Array.from({ length: 80 }, () => "w".repeat(500));
    reply.cautions = Array.from({ length: 14 }, () => "c".repeat(2500));
    reply.shareable = true;
    reply.why = ["why"];
    reply.visibleCautions = ["short caution"];
    for (const working of [false, true]) {
      const message = render(reply, { source: "Na 140", offerPost: true, working });
      expect(checkBlocks(message.blocks)).toEqual([]);
      expect(message.blocks.length).toBeLessThanOrEqual(LIMITS.blocksPerMessage);
      expect(message.text.length).toBeLessThanOrEqual(LIMITS.fallbackText);
      // The first view ends with the cautions, then the buttons.
      if (!working) expect(message.blocks.at(-1)!.type).toBe("actions");
      expect(message.blocks.some((b) => b.type === "context")).toBe(true);
    }
    // Past the block limit, the reply says how much is not shown.
    expect(JSON.stringify(render(reply, { working: true }).blocks.at(-1))).toMatch(
      /more parts are not shown/,
    );
  });

  it("escapes mrkdwn control characters", () => {
    expect(escapeMrkdwn("gap < 10 & > 14")).toBe("gap &lt; 10 &amp; &gt; 14");
  });

  it("checkBlocks reports what is broken", () => {
    expect(checkBlocks([{ type: "section", text: { type: "mrkdwn", text: "a".repeat(3001) } }])).toHaveLength(
      1,
    );
    expect(checkBlocks(Array.from({ length: 51 }, () => ({ type: "divider" as const })))).toHaveLength(1);
  });
});
