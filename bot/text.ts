/**
 * Plain-text rendering of a reply: the terminal's format, and the fallback text every chat
 * platform gets beside its rich format.
 */
import type { Reply } from "./reply.js";

export interface TextOptions {
  /** Include the working even when the user did not ask for it. */
  working?: boolean;
  /**
   * The short form, for a platform's notification fallback beside its rich format: headline,
   * reading, facts, problems and the general caution.
   */
  brief?: boolean;
}

export function renderText(reply: Reply, options: TextOptions = {}): string {
  if (options.brief) return briefText(reply);
  const lines: string[] = [reply.headline];
  if (reply.readAs) lines.push(`Read as: ${reply.readAs}`);
  if (reply.facts.length > 0) {
    lines.push("");
    for (const f of reply.facts) lines.push(`• ${f.label}: ${f.value}${f.formula ? `  [${f.formula}]` : ""}`);
  }
  if (reply.interpretation.length > 0) {
    lines.push("");
    for (const i of reply.interpretation) lines.push(`• ${i}`);
  }
  if (reply.problems.length > 0) {
    lines.push("");
    for (const p of reply.problems) lines.push(`! ${p.message}`);
  }
  if (reply.notes.length > 0) {
    lines.push("");
    for (const n of reply.notes) lines.push(`Note: ${n}`);
  }
  if ((reply.showWorking || options.working) && reply.working.length > 0) {
    lines.push("", "Working:");
    for (const w of reply.working) lines.push(`  ${w}`);
  } else if (reply.working.length > 0) {
    lines.push("", "(Add the word 'working' to your message to see every step.)");
  }
  if (reply.cautions.length > 0) {
    lines.push("");
    for (const c of reply.cautions) lines.push(`⚠ ${c}`);
  }
  return lines.join("\n");
}

function briefText(reply: Reply): string {
  const lines = [reply.headline];
  if (reply.readAs) lines.push(`Read as: ${reply.readAs}`);
  for (const f of reply.facts) lines.push(`${f.label}: ${f.value}`);
  for (const p of reply.problems) lines.push(`! ${p.message}`);
  const general = reply.cautions.at(-1);
  if (general) lines.push(`⚠ ${general}`);
  return lines.join("\n");
}
