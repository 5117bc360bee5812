/**
 * The neutral reply as an Adaptive Card (version 1.5, the most Teams renders): the headline, how
 * it was read, the key facts, interpretation, problems, the cautions, and the working behind a
 * show-card action. Every block wraps, so it reads on a phone. fallbackText carries the plain text.
 */
import type { Reply } from "../../bot/reply.js";
import { renderText } from "../../bot/text.js";

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

const text = (value: string, extra: Element = {}): Element => ({
  type: "TextBlock",
  text: value,
  wrap: true,
  ...extra,
});

function workingBlocks(reply: Reply): Element[] {
  return reply.working.map((w) => text(w, { size: "Small", fontType: "Monospace", spacing: "Small" }));
}

export function renderCard(reply: Reply, options: { working?: boolean } = {}): AdaptiveCard {
  const showWorking = options.working ?? reply.showWorking;
  const body: Element[] = [text(reply.headline, { weight: "Bolder", size: "Medium", style: "heading" })];
  if (reply.readAs)
    body.push(text(`Read as: ${reply.readAs}`, { isSubtle: true, size: "Small", spacing: "Small" }));
  if (reply.facts.length > 0) {
    body.push({
      type: "FactSet",
      facts: reply.facts.map((f) => ({
        title: f.label,
        value: f.formula ? `${f.value} — ${f.formula}` : f.value,
      })),
    });
  }
  for (const line of reply.interpretation) body.push(text(`• ${line}`, { spacing: "Small" }));
  for (const p of reply.problems) body.push(text(p.message, { color: "Attention", spacing: "Small" }));
  for (const n of reply.notes) body.push(text(`Note: ${n}`, { isSubtle: true, spacing: "Small" }));
  if (showWorking && reply.working.length > 0) {
    body.push(text("Working", { weight: "Bolder", separator: true }), ...workingBlocks(reply));
  }
  if (reply.cautions.length > 0) {
    body.push({
      type: "Container",
      separator: true,
      spacing: "Medium",
      items: reply.cautions.map((c) => text(c, { isSubtle: true, size: "Small", spacing: "Small" })),
    });
  }
  const card: AdaptiveCard = {
    type: "AdaptiveCard",
    $schema: "http://adaptivecards.io/schemas/adaptive-card.json",
    version: CARD_VERSION,
    fallbackText: renderText(reply, { working: showWorking }),
    body,
  };
  if (!showWorking && reply.working.length > 0) {
    card.actions = [
      {
        type: "Action.ShowCard",
        title: "Show working",
        card: { type: "AdaptiveCard", version: CARD_VERSION, body: workingBlocks(reply) },
      },
    ];
  }
  return card;
}
