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

/** A picture for the card: a data URI (or URL) and what it shows in words. */
export interface CardImage {
  url: string;
  altText: string;
}

/**
 * Teams refuses a message over about 28 KB; a card stays under this with its pictures, or the
 * pictures are left out and the card says so.
 */
export const CARD_BYTES = 26 * 1024;

export function renderCard(
  reply: Reply,
  options: { working?: boolean; images?: CardImage[] } = {},
): AdaptiveCard {
  const card = cardOf(reply, options.working, options.images ?? []);
  if (options.images?.length && JSON.stringify(card).length > CARD_BYTES) {
    const without = cardOf(reply, options.working, []);
    without.body.splice(
      1,
      0,
      text("The chart did not fit in a Teams card; the numbers here say the same.", {
        isSubtle: true,
        size: "Small",
      }),
    );
    return without;
  }
  return card;
}

function cardOf(reply: Reply, working: boolean | undefined, images: CardImage[]): AdaptiveCard {
  const expanded = working ?? reply.showWorking;
  const body: Element[] = [text(reply.headline, { weight: "Bolder", size: "Medium", style: "heading" })];
  if (reply.keyNumbers) body.push(text(reply.keyNumbers, { spacing: "Small" }));
  if (reply.readShort)
    body.push(text(`Read: ${reply.readShort}`, { isSubtle: true, size: "Small", spacing: "Small" }));
  for (const line of whyLines(reply))
    if (line !== reply.headline) body.push(text(`• ${line}`, { spacing: "Small" }));
  for (const p of reply.problems) body.push(text(p.message, { color: "Attention", spacing: "Small" }));
  for (const image of images)
    body.push({ type: "Image", url: image.url, altText: image.altText, size: "Stretch", spacing: "Medium" });
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
