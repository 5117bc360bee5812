/**
 * The neutral reply as an Adaptive Card (version 1.5, the most Teams renders). The body is the
 * first view a phone shows at once: the verdict, the key numbers and how it was read, why and the
 * next step, the problems and the cautions that fit. "More" is an Action.ShowCard with everything
 * else — every finding, the numbers with their formulas, the working, every caution with its
 * source — so it opens without a round trip. Card text is Markdown in Teams: every character that
 * carries meaning there is escaped. fallbackText carries the whole reply as plain text.
 */
import type { Reply } from "../../bot/reply.js";
import { cautionsOf, fullText, typeset, whyLines } from "../../bot/text.js";

export const CARD_VERSION = "1.5";

type Element = Record<string, unknown>;

export interface AdaptiveCard {
  type: "AdaptiveCard";
  $schema: string;
  version: string;
  fallbackText: string;
  body: Element[];
  actions?: Element[];
}

/**
 * Escapes what starts formatting in Teams' Markdown: \ * _ ~ ` [ ] anywhere; # > - + and "1." at
 * the start of a line. Other characters (brackets, ±, ÷) need nothing.
 */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/([\\`*_~[\]])/g, "\\$1")
    .replace(/^(\s*)([#>])/gm, "$1\\$2")
    .replace(/^(\s*)([-+])(\s)/gm, "$1\\$2$3")
    .replace(/^(\s*\d+)\.(\s)/gm, "$1\\.$2");
}

const text = (value: string, extra: Element = {}): Element => ({
  type: "TextBlock",
  text: escapeMarkdown(typeset(value)),
  wrap: true,
  ...extra,
});

/** Everything behind "More". */
function moreBlocks(reply: Reply): Element[] {
  const body: Element[] = [];
  if (reply.readAs) body.push(text(`Read as: ${reply.readAs}`, { isSubtle: true, size: "Small" }));
  if (reply.facts.length > 0) {
    body.push({
      type: "FactSet",
      facts: reply.facts.map((f) => ({
        title: escapeMarkdown(typeset(f.label)),
        value: escapeMarkdown(typeset(f.formula ? `${f.value} — ${f.formula}` : f.value)),
      })),
    });
  }
  for (const line of reply.interpretation) body.push(text(`• ${line}`, { spacing: "Small" }));
  for (const n of reply.notes) body.push(text(`Note: ${n}`, { isSubtle: true, spacing: "Small" }));
  if (reply.working.length > 0) {
    body.push(text("Working", { weight: "Bolder", separator: true }));
    for (const w of reply.working)
      body.push(text(w, { size: "Small", fontType: "Monospace", spacing: "Small" }));
  }
  if (reply.cautions.length > 0)
    body.push({
      type: "Container",
      separator: true,
      items: reply.cautions.map((c) => text(c, { isSubtle: true, size: "Small", spacing: "Small" })),
    });
  return body;
}

export function renderCard(reply: Reply, options: { working?: boolean } = {}): AdaptiveCard {
  const expanded = options.working ?? reply.showWorking;
  const body: Element[] = [text(reply.headline, { weight: "Bolder", size: "Medium", style: "heading" })];
  if (reply.keyNumbers) body.push(text(reply.keyNumbers, { spacing: "Small" }));
  if (reply.readShort)
    body.push(text(`Read: ${reply.readShort}`, { isSubtle: true, size: "Small", spacing: "Small" }));
  for (const line of whyLines(reply))
    if (line !== reply.headline) body.push(text(`• ${line}`, { spacing: "Small" }));
  for (const p of reply.problems) body.push(text(p.message, { color: "Attention", spacing: "Small" }));
  const cautions = cautionsOf(reply);
  if (cautions.length > 0) {
    body.push({
      type: "Container",
      spacing: "Small",
      items: cautions.map((c) => text(c, { isSubtle: true, size: "Small", spacing: "None" })),
    });
  }
  const more = moreBlocks(reply);
  if (expanded) body.push(...more);
  const card: AdaptiveCard = {
    type: "AdaptiveCard",
    $schema: "http://adaptivecards.io/schemas/adaptive-card.json",
    version: CARD_VERSION,
    fallbackText: fullText(reply),
    body,
  };
  if (!expanded && more.length > 0) {
    card.actions = [
      {
        type: "Action.ShowCard",
        title: "More",
        card: { type: "AdaptiveCard", version: CARD_VERSION, body: more },
      },
    ];
  }
  // The whole log is cleared only from this confirm card's button.
  if (reply.kind === "forget" && reply.confirm) {
    card.actions = [
      ...(card.actions ?? []),
      {
        type: "Action.Submit",
        title: "Clear the whole log",
        style: "destructive",
        data: { solute: "forget-all" },
      },
    ];
  }
  return card;
}
