import { createRequire } from "node:module";
import type { AdaptiveCard } from "../../adapters/teams/render.js";

// A general-purpose Adaptive Cards implementation from the npm registry (Microsoft's renderer
// library); its ESM build needs a bundler, so the UMD build is loaded.
const AC = createRequire(import.meta.url)("adaptivecards/dist/adaptivecards.js");

/** Every parse and validation problem the Adaptive Cards library finds, plus our own version rule. */
export function cardProblems(card: AdaptiveCard | Record<string, unknown>): string[] {
  const problems: string[] = [];
  if (card.version === undefined) problems.push("no version");
  else if (Number(card.version) > 1.5) problems.push(`version ${card.version} > 1.5`);
  const parsed = new AC.AdaptiveCard();
  const ctx = new AC.SerializationContext();
  parsed.parse(card, ctx);
  for (let i = 0; i < ctx.eventCount; i++) problems.push(ctx.getEventAt(i).message);
  for (const e of parsed.validateProperties().validationEvents) problems.push(e.message);
  return problems;
}
