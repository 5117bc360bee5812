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

export const ACTIONS = { post: "solute_post", working: "solute_working", forget: "solute_forget" } as const;

/** The reply's rendered fields, as kept for its buttons: no `data`, so no reading of the message. */
export function viewOf(reply: Reply): Reply {
  const { data: _data, ...view } = reply;
  return view;
}

/** The App Home tab: how to use Solute, privacy in one paragraph, settings are per channel. */
export function homeBlocks(command: string): Block[] {
  const p = (text: string): Block => ({ type: "section", text: { type: "mrkdwn", text } });
  return [
    { type: "header", text: { type: "plain_text", text: "Solute" } },
    p(
      `Type lab values the way you write them — in a channel with ${command} or by mentioning @Solute, or here in a direct message: *Na 128 glu 540 mg/dL urea 14 mmol/L osm 310*. Paste a panel from the results viewer as it is. The answer leads with what matters most; *More* shows every finding, the working and the sources.`,
    ),
    p(
      `*${command} check* … checks a colleague's result · *${command} plan* … what a litre of a fluid does to the sodium · *${command} trend bed 12* · *${command} handover* · *${command} help*. On any message, *Check with Solute* (the message menu) checks it privately for you.`,
    ),
    p(
      "*Privacy.* Solute never keeps message text, names, record numbers, dates of birth or user IDs. Tag a case by bed or bay (bed 12, #4B); only tagged numbers go into the channel's shift log, which clears itself. Delete a message that names a patient.",
    ),
    p(
      `*Settings are per channel*: ${command} units si, units conventional or units none, in the channel they are for.`,
    ),
    {
      type: "context",
      elements: [
        { type: "mrkdwn", text: "Decision support only; local protocols and the treating clinician decide." },
      ],
    },
  ];
}

/** The welcome when the bot joins a channel. */
export function welcomeText(command: string): string {
  return `Solute is here: type lab values with ${command} or mention @Solute (Na 128 glu 540 mg/dL urea 14 mmol/L osm 310). Tag cases by bed or bay, never by name. ${command} help for more; ${command} units si or units conventional sets this channel's units.`;
}

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

/** Slack reads *, _ and ~ as formatting and has no escape for them: "2*131" shows as 2∗131. */
const md = (text: string) => escapeMrkdwn(typeset(text)).replace(/\*/g, "∗");

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
  if (value && reply.kind === "forget" && reply.confirm) {
    buttons.push({
      type: "button",
      text: { type: "plain_text", text: "Clear the whole log" },
      action_id: ACTIONS.forget,
      value: "all",
      style: "danger",
      confirm: {
        title: { type: "plain_text", text: "Clear the shift log?" },
        text: {
          type: "plain_text",
          text: "Every case of this channel's shift log will be removed at once. The channel is told, without naming you.",
        },
        confirm: { type: "plain_text", text: "Clear it" },
        deny: { type: "plain_text", text: "Keep it" },
      },
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
