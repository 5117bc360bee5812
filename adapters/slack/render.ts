/**
 * The neutral reply in Block Kit. The first view is what a phone shows at once: the verdict, the
 * key numbers and how it was read, why and the next step, the problems, the cautions that fit —
 * then the buttons. "More" expands the same message in place with everything else: every finding,
 * the numbers with their formulas, the working and every caution with its source. Nothing is cut
 * silently: facts are split across as many sections as they need, and past Block Kit's block limit
 * the reply says how many lines are not shown and how to see them. Always with a plain-text
 * fallback.
 */
import type { Reply } from "../../bot/reply.js";
import { cautionsOf, renderText, typeset, whyLines } from "../../bot/text.js";
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

const md = (text: string) => escapeMrkdwn(typeset(text));

/** Splits lines into section-sized chunks, each within the text limit. */
function sections(lines: string[], prefix = "• "): Block[] {
  const blocks: Block[] = [];
  let chunk = "";
  for (const line of lines) {
    const item = cut(`${prefix}${md(line)}`, LIMITS.sectionText);
    if (chunk && chunk.length + 1 + item.length > LIMITS.sectionText) {
      blocks.push({ type: "section", text: { type: "mrkdwn", text: chunk } });
      chunk = "";
    }
    chunk = chunk ? `${chunk}\n${item}` : item;
  }
  if (chunk) blocks.push({ type: "section", text: { type: "mrkdwn", text: chunk } });
  return blocks;
}

/** Context blocks of at most ten elements each. */
function contexts(lines: string[]): Block[] {
  const blocks: Block[] = [];
  for (let i = 0; i < lines.length; i += LIMITS.contextElements) {
    blocks.push({
      type: "context",
      elements: lines
        .slice(i, i + LIMITS.contextElements)
        .map((c) => ({ type: "mrkdwn" as const, text: cut(md(c), LIMITS.contextText) })),
    });
  }
  return blocks;
}

export interface RenderOptions {
  /** The value the buttons carry to recompute from (never stored by Solute). */
  source?: string;
  /** Offer "Post to channel" (the private answer to a slash command). */
  offerPost?: boolean;
  /** Show everything: the expanded view. */
  working?: boolean;
}

export interface SlackMessage {
  text: string;
  blocks: Block[];
}

/** The first view: at most six blocks, then the buttons. */
function firstView(reply: Reply): Block[] {
  const blocks: Block[] = [
    { type: "section", text: { type: "mrkdwn", text: `*${md(cut(reply.headline, 2900))}*` } },
  ];
  const context = [reply.keyNumbers, reply.readShort && `Read: ${reply.readShort}`].filter(
    Boolean,
  ) as string[];
  if (context.length > 0) blocks.push(...contexts(context));
  const why = whyLines(reply).filter((w) => w !== reply.headline);
  if (why.length > 0) blocks.push(...sections(why).slice(0, 1));
  if (reply.problems.length > 0)
    blocks.push(
      ...sections(
        reply.problems.map((p) => p.message),
        "⚠︎ ",
      ).slice(0, 1),
    );
  const cautions = cautionsOf(reply);
  if (cautions.length > 0) blocks.push(...contexts(cautions));
  return blocks;
}

/** Everything behind "More": how it was read, the numbers with formulas, every finding, notes, working, every caution. */
function moreView(reply: Reply): Block[] {
  const blocks: Block[] = [{ type: "divider" }];
  if (reply.readAs) blocks.push(...contexts([`Read as: ${reply.readAs}`]));
  for (let i = 0; i < reply.facts.length; i += LIMITS.sectionFields) {
    blocks.push({
      type: "section",
      fields: reply.facts.slice(i, i + LIMITS.sectionFields).map((f) => ({
        type: "mrkdwn" as const,
        text: cut(
          `*${md(f.label)}*\n${md(f.value)}${f.formula ? `\n${md(f.formula)}` : ""}`,
          LIMITS.fieldText,
        ),
      })),
    });
  }
  if (reply.interpretation.length > 0) blocks.push(...sections(reply.interpretation));
  if (reply.notes.length > 0) blocks.push(...sections(reply.notes, "Note: "));
  if (reply.working.length > 0)
    blocks.push(
      { type: "section", text: { type: "mrkdwn", text: "*Working*" } },
      ...sections(reply.working, ""),
    );
  if (reply.cautions.length > 0) blocks.push(...contexts(reply.cautions));
  return blocks;
}

export function render(reply: Reply, options: RenderOptions = {}): SlackMessage {
  const expanded = options.working ?? reply.showWorking;
  const blocks = firstView(reply);
  const buttons: Extract<Block, { type: "actions" }>["elements"] = [];
  // A message that seemed to carry an identifier is never echoed back, not even in a button.
  const identifying = reply.problems.some((p) => p.code === "privacy.identifier");
  const value =
    options.source && !identifying && options.source.length <= LIMITS.buttonValue
      ? options.source
      : undefined;
  const more = moreView(reply);
  if (value && !expanded && more.length > 1) {
    buttons.push({
      type: "button",
      text: { type: "plain_text", text: "More" },
      action_id: ACTIONS.working,
      value,
    });
  }
  if (value && options.offerPost && reply.shareable) {
    buttons.push({
      type: "button",
      text: { type: "plain_text", text: "Post to channel" },
      action_id: ACTIONS.post,
      value,
      style: "primary",
    });
  }
  if (buttons.length > 0) blocks.push({ type: "actions", elements: buttons });
  if (expanded) blocks.push(...more);
  // Past the block limit: say how many blocks are not shown, and how to see everything.
  if (blocks.length > LIMITS.blocksPerMessage) {
    const hidden = blocks.length - (LIMITS.blocksPerMessage - 1);
    blocks.splice(LIMITS.blocksPerMessage - 1);
    blocks.push({
      type: "context",
      elements: [
        {
          type: "mrkdwn",
          text: `${hidden} more part${hidden === 1 ? " is" : "s are"} not shown (Slack's limit per message): ask for one case, like handover bed 12, or use the one-shot command's JSON.`,
        },
      ],
    });
  }
  // The fallback is what notifications and old clients show; the blocks carry the whole answer.
  return { text: cut(renderText(reply, { brief: true }), LIMITS.fallbackText), blocks };
}
