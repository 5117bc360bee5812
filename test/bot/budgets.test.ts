/**
 * Budgets of a reply's first view, on a phone (invented messages, one or more per command): a
 * calculation's plain text without working is at most 10 lines and 700 characters; at most three
 * caution lines are visible; Slack shows at most 8 blocks before the expand button; and every
 * finding of severity danger is in line 1 or 2 of every surface. The Teams card's height is
 * measured in headless Chromium by `npm run bench -- --only=card` (docs/benchmarks.md).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { render as renderSlack } from "../../adapters/slack/render.js";
import { MemoryStore } from "../../adapters/store/memory.js";
import { renderCard } from "../../adapters/teams/render.js";
import { BUDGET_MESSAGES } from "../../bench/corpus.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import type { Reply } from "../../bot/reply.js";
import { shortOf } from "../../bot/summary.js";
import { FIRST_VIEW, renderText } from "../../bot/text.js";

let bot: Conversation;
const replies = new Map<string, Reply>();
beforeAll(async () => {
  bot = new Conversation(new MemoryStore(), loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" }));
  for (const m of BUDGET_MESSAGES)
    replies.set(m, await bot.handle({ text: m, channel: "budget", platform: "console" }));
});

const lines = (t: string) => t.split("\n");

describe("first-view budgets", () => {
  it.each(BUDGET_MESSAGES)("%j", (message) => {
    const reply = replies.get(message)!;
    const text = renderText(reply);
    if (reply.kind === "result") {
      expect(lines(text).length, text).toBeLessThanOrEqual(FIRST_VIEW.lines);
      expect(text.length, text).toBeLessThanOrEqual(FIRST_VIEW.characters);
    }
    expect(lines(text).filter((l) => l.startsWith("⚠")).length).toBeLessThanOrEqual(3);
    // Slack: at most 8 blocks before the expand button.
    const blocks = renderSlack(reply, { source: message, offerPost: true }).blocks;
    const button = blocks.findIndex((b) => b.type === "actions");
    expect(button === -1 ? blocks.length : button).toBeLessThanOrEqual(8);
    // Every danger finding is in line 1 or 2 of every surface.
    const dangers = [
      ...(reply.data?.assessment?.findings ?? []),
      ...(reply.data?.trend?.findings ?? []),
    ].filter((f) => f.severity === "danger");
    const card = renderCard(reply);
    const cardTop = card.body
      .slice(0, 2)
      .map((b) => String((b as { text?: string }).text ?? ""))
      .join("\n")
      .replace(/\\(.)/g, "$1");
    const slackTop = JSON.stringify(blocks.slice(0, 2));
    for (const f of dangers) {
      const said = shortOf(f).split(" (")[0]!.toLowerCase();
      expect(lines(text).slice(0, 2).join(" ").toLowerCase(), `${f.code} in text`).toContain(said);
      expect(slackTop.toLowerCase(), `${f.code} in Slack`).toContain(said);
      expect(cardTop.toLowerCase(), `${f.code} in Teams`).toContain(said);
    }
  });

  it("covers every command", () => {
    const kinds = new Set([...replies.values()].map((r) => r.kind));
    for (const kind of ["result", "check", "plan", "trend", "handover", "help", "nothing"])
      expect(kinds).toContain(kind);
  });

  it("typography: true minus signs, no one-value ranges, no doubled plus", () => {
    for (const [m, reply] of replies) {
      const text = renderText(reply, { working: true });
      expect(text, m).not.toMatch(/(^|\s)-\d/m);
      expect(text, m).not.toMatch(/\+ \+/);
      expect(text, m).not.toMatch(/\b(\d+\.\d)–\1\b/);
    }
  });

  it("a problem reply offers no post button, and its headline is not repeated as the first bullet", () => {
    const reply = replies.get("glucose 30 Na 1280")!;
    const blocks = JSON.stringify(renderSlack(reply, { source: "x", offerPost: true }).blocks);
    expect(blocks).not.toContain("solute_post");
    const text = lines(renderText(reply));
    expect(text[1]?.replace(/^• /, "")).not.toBe(text[0]);
  });
});
