/**
 * Plain-text rendering of a reply: the terminal's format, and the fallback text every chat
 * platform gets beside its rich format.
 *
 * The first view reads on a phone: the verdict, the key numbers, how the message was read, at most
 * three short lines of why and next step, the problems, at most two fitting cautions and the
 * general one. "more" (or the word "working" in the message) shows everything else: every
 * finding, the numbers with their formulas, the working, every caution with its source.
 */
import { CAUTIONS, SHORT_CAUTIONS } from "../core/cautions.js";
import type { Reply } from "./reply.js";

export interface TextOptions {
  /** Everything: every finding, the facts with formulas, the working, every caution. */
  working?: boolean;
  /** The short form, for a platform's notification fallback: verdict, numbers, problems, caution. */
  brief?: boolean;
}

/** The terminal's pointer to everything else. */
export const MORE_HINT = '(Type "more": every finding, formulas, working, sources.)';

/** Budgets of the first view, checked by test/bot/budgets.test.ts. */
export const FIRST_VIEW = { lines: 10, characters: 700 } as const;

/** Typography for reading: true minus signs before numbers. */
export function typeset(text: string): string {
  // A scan for "-" rather than a regular expression with a look-ahead: this runs on every reply.
  let at = text.indexOf("-");
  if (at < 0) return text;
  let out = "";
  let from = 0;
  while (at >= 0) {
    const before = at === 0 ? " " : text[at - 1]!;
    const after = text.charCodeAt(at + 1);
    if (after >= 48 && after <= 57 && (before === "(" || before === "/" || /\s/.test(before))) {
      out += `${text.slice(from, at)}−`;
      from = at + 1;
    }
    at = text.indexOf("-", at + 1);
  }
  return out + text.slice(from);
}

/** The why lines that fit the first view beside the problems. */
export function whyLines(reply: Reply): string[] {
  const why = reply.why.length > 0 ? reply.why : reply.interpretation.slice(0, 3);
  const fixed =
    1 +
    (reply.keyNumbers ? 1 : 0) +
    (reply.readShort ? 1 : 0) +
    reply.problems.length +
    cautionsOf(reply).length +
    1;
  return why.slice(0, Math.max(1, Math.min(3, FIRST_VIEW.lines - fixed)));
}

/** The first view's cautions: the chosen ones, or the general one alone. */
export function cautionsOf(reply: Reply): string[] {
  if (reply.visibleCautions.length > 0) return reply.visibleCautions;
  const general = reply.cautions.at(-1);
  if (!general) return [];
  return [general === CAUTIONS.general ? SHORT_CAUTIONS.general : general];
}

/** Whether there is more to show than the first view. */
export function hasMore(reply: Reply): boolean {
  return (
    reply.working.length > 0 ||
    reply.facts.length > 0 ||
    reply.interpretation.length > whyLines(reply).length ||
    reply.notes.length > 0 ||
    reply.cautions.length > cautionsOf(reply).length
  );
}

export function renderText(reply: Reply, options: TextOptions = {}): string {
  if (options.brief) return briefText(reply);
  if (options.working || reply.showWorking) return fullText(reply);
  const lines: string[] = [reply.headline];
  if (reply.keyNumbers) lines.push(reply.keyNumbers);
  if (reply.readShort) lines.push(`Read: ${reply.readShort}`);
  for (const w of whyLines(reply)) if (w !== reply.headline) lines.push(`• ${w}`);
  for (const p of reply.problems) lines.push(`! ${p.message}`);
  for (const c of cautionsOf(reply)) lines.push(`⚠ ${c}`);
  if (hasMore(reply)) lines.push(MORE_HINT);
  return typeset(lines.join("\n"));
}

/** Everything, grouped: the verdict, how it was read, the numbers, every finding, the working, every caution. */
export function fullText(reply: Reply): string {
  const lines: string[] = [reply.headline];
  if (reply.keyNumbers) lines.push(reply.keyNumbers);
  if (reply.readAs) lines.push(`Read as: ${reply.readAs}`);
  if (reply.facts.length > 0) {
    lines.push("");
    for (const f of reply.facts) lines.push(`• ${f.label}: ${f.value}${f.formula ? ` (${f.formula})` : ""}`);
  }
  if (reply.interpretation.length > 0) {
    lines.push("", "What it means:");
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
  if (reply.working.length > 0) {
    lines.push("", "Working:");
    for (const w of reply.working) lines.push(`  ${w}`);
  }
  if (reply.cautions.length > 0) {
    lines.push("", "Cautions:");
    for (const c of reply.cautions) lines.push(`⚠ ${c}`);
  }
  return typeset(lines.join("\n"));
}

function briefText(reply: Reply): string {
  const lines = [reply.headline];
  if (reply.keyNumbers) lines.push(reply.keyNumbers);
  for (const p of reply.problems) lines.push(`! ${p.message}`);
  const general = reply.cautions.at(-1);
  if (general) lines.push(`⚠ ${general}`);
  return typeset(lines.join("\n"));
}
