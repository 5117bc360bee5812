/**
 * The neutral reply in Block Kit: the headline, how it was read, the key facts as fields, the
 * interpretation, problems, the working (shown on request, else behind a button), and the cautions
 * in a context block. Always with a plain-text fallback. Stays within Block Kit's limits.
 */
import type { Reply } from "../../bot/reply.js";
import { renderText } from "../../bot/text.js";
import { type Block, LIMITS } from "./limits.js";

export const ACTIONS = { post: "solute_post", working: "solute_working" } as const;

const NEEDS_ESCAPE = /[&<>]/;

/** Slack's mrkdwn needs &, < and > escaped. */
export function escapeMrkdwn(text: string): string {
  // Most lines have nothing to escape; skip the three replacements for them.
  if (!NEEDS_ESCAPE.test(text)) return text;
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");
}

function cut(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

/** Splits lines into section-sized chunks, each within the text limit. */
function sections(lines: string[], prefix = "• "): Block[] {
  const blocks: Block[] = [];
  let chunk = "";
  for (const line of lines) {
    const item = cut(`${prefix}${escapeMrkdwn(line)}`, LIMITS.sectionText);
    if (chunk && chunk.length + 1 + item.length > LIMITS.sectionText) {
      blocks.push({ type: "section", text: { type: "mrkdwn", text: chunk } });
      chunk = "";
    }
    chunk = chunk ? `${chunk}\n${item}` : item;
  }
  if (chunk) blocks.push({ type: "section", text: { type: "mrkdwn", text: chunk } });
  return blocks;
}

export interface RenderOptions {
  /** The text to recompute from when a button is pressed (button values are Slack's, not stored). */
  source?: string;
  /** Offer "Post to channel" (the private answer to a slash command). */
  offerPost?: boolean;
  /** Show the working inline. */
  working?: boolean;
}

export interface SlackMessage {
  text: string;
  blocks: Block[];
}

export function render(reply: Reply, options: RenderOptions = {}): SlackMessage {
  const showWorking = options.working ?? reply.showWorking;
  const blocks: Block[] = [
    { type: "section", text: { type: "mrkdwn", text: `*${escapeMrkdwn(cut(reply.headline, 2900))}*` } },
  ];
  if (reply.readAs)
    blocks.push({
      type: "context",
      elements: [{ type: "mrkdwn", text: cut(`Read as: ${escapeMrkdwn(reply.readAs)}`, LIMITS.contextText) }],
    });
  if (reply.facts.length > 0) {
    blocks.push({
      type: "section",
      fields: reply.facts.slice(0, LIMITS.sectionFields).map((f) => ({
        type: "mrkdwn" as const,
        text: cut(
          `*${escapeMrkdwn(f.label)}*\n${escapeMrkdwn(f.value)}${f.formula ? `\n_${escapeMrkdwn(f.formula)}_` : ""}`,
          LIMITS.fieldText,
        ),
      })),
    });
  }
  blocks.push(...sections(reply.interpretation));
  if (reply.problems.length > 0)
    blocks.push(
      ...sections(
        reply.problems.map((p) => p.message),
        "⚠︎ ",
      ),
    );
  if (reply.notes.length > 0) blocks.push(...sections(reply.notes, "Note: "));
  if (showWorking && reply.working.length > 0) {
    blocks.push(
      { type: "divider" },
      { type: "section", text: { type: "mrkdwn", text: "*Working*" } },
      ...sections(reply.working, ""),
    );
  }
  const buttons: Extract<Block, { type: "actions" }>["elements"] = [];
  // A message that seemed to carry an identifier is never echoed back, not even in a button.
  const identifying = reply.problems.some((p) => p.code === "privacy.identifier");
  const value =
    options.source && !identifying && options.source.length <= LIMITS.buttonValue
      ? options.source
      : undefined;
  if (value && options.offerPost && reply.shareable) {
    buttons.push({
      type: "button",
      text: { type: "plain_text", text: "Post to channel" },
      action_id: ACTIONS.post,
      value,
      style: "primary",
    });
  }
  if (value && !showWorking && reply.working.length > 0) {
    buttons.push({
      type: "button",
      text: { type: "plain_text", text: "Show working" },
      action_id: ACTIONS.working,
      value,
    });
  }
  if (buttons.length > 0) blocks.push({ type: "actions", elements: buttons });
  if (reply.cautions.length > 0) {
    blocks.push({
      type: "context",
      elements: reply.cautions
        .slice(0, LIMITS.contextElements)
        .map((c) => ({ type: "mrkdwn" as const, text: cut(escapeMrkdwn(c), LIMITS.contextText) })),
    });
  }
  // Keep within the block count: the cautions (last) always stay.
  if (blocks.length > LIMITS.blocksPerMessage) {
    const last = blocks.at(-1)!;
    blocks.splice(LIMITS.blocksPerMessage - 2);
    blocks.push(
      { type: "section", text: { type: "mrkdwn", text: "(Shortened to fit a Slack message.)" } },
      last,
    );
  }
  // The fallback is what notifications and old clients show; the blocks carry the whole answer.
  return { text: cut(renderText(reply, { brief: true }), LIMITS.fallbackText), blocks };
}
