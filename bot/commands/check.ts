/**
 * check: a colleague's result (or their arithmetic) checked against Solute's own. The arithmetic is
 * evaluated in the sandbox (bot/expression.ts) and its value put where it stood; every claim then
 * gets one verdict (bot/claims.ts).
 */
import { assess } from "../../core/assess.js";
import { fmt, num } from "../../core/format.js";
import { readMessage } from "../../core/reader/index.js";
import { checkClaims, checkHeadline } from "../claims.js";
import { assessOptions, computeReply } from "../compute.js";
import { evaluateExpression } from "../expression.js";
import { emptyReply, type Reply } from "../reply.js";
import { verdictOf } from "../summary.js";
import type { Bot, Command, Context } from "./context.js";

export async function check(ctx: Context, bot: Bot): Promise<Reply> {
  // A colleague's own arithmetic: evaluate it in the sandbox and put its value where it stood.
  const notes: string[] = [];
  const problems: { code: string; message: string }[] = [];
  let text = ctx.rest;
  let arithmetic: { text: string; value: number; claimed: number } | undefined;
  const expression = findExpression(text);
  if (expression) {
    const evaluated = await evaluateExpression(expression.text);
    if (!evaluated.ok) {
      problems.push({ code: "expression.refused", message: evaluated.reason });
      text = `${text.slice(0, expression.start)} ${text.slice(expression.end)}`;
    } else {
      const claimed = expression.claimed;
      // The colleague's written total is what they claimed; their own arithmetic is checked too.
      if (claimed !== undefined && Math.abs(claimed - evaluated.value) > 0.5) {
        arithmetic = {
          text: evaluated.text.replace(/\*/g, "×").replace(/\//g, "÷"),
          value: evaluated.value,
          claimed,
        };
        notes.push(`Arithmetic: ${evaluated.text} is ${fmt(evaluated.value)}, not ${fmt(claimed)}.`);
      } else {
        notes.push(`Arithmetic: ${evaluated.text} = ${fmt(evaluated.value)}.`);
      }
      const before = text.slice(0, expression.start);
      const labelled =
        /(calc(ulated)?\s+osm\w*|gap|osmolal\s+gap|osm\s+gap|eff(ective)?\s+osm\w*|tonicity|corr(ected)?\s+(na|sodium)|anion\s+gap|ag|og)\s*$/i.test(
          before.trimEnd(),
        );
      const value = claimed ?? Number(evaluated.value.toFixed(6));
      text = `${before} ${labelled ? "" : "calc osm "}${value} ${text.slice(expression.end)}`;
    }
  }
  const reading = readMessage(text, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  const assessment = assess(reading.inputs, assessOptions(reading, bot.config, ctx.unitSystem));
  const base = computeReply(reading, assessment, ctx.showWorking);
  if (reading.claims.length === 0) {
    const reply = emptyReply("check", "Nothing to check");
    reply.problems.push(...problems, {
      code: "check.noClaim",
      message:
        "Add the result to check, like: check Na 128 glu 540 mg/dL urea 14 mmol/L calc osm 300 — or the arithmetic itself: check Na 128 glu 540 mg/dL urea 14 mmol/L 2*128 + 540/18 + 14",
    });
    reply.problems.push(...base.problems);
    return reply;
  }
  const verdicts = checkClaims(reading, assessment);
  if (arithmetic) {
    // The sum itself was added up wrong: say so on the claim it made, and whether the formula was right.
    const v = verdicts.find((x) => x.claimed === arithmetic!.claimed);
    if (v && v.status !== "cannotCheck" && v.ours !== undefined) {
      const formulaRight = Math.abs(arithmetic.value - v.ours) <= 1;
      v.status = "doesNotHold";
      v.holds = false;
      v.slip = `the sum is added up wrong: ${arithmetic.text} is ${fmt(arithmetic.value)}`;
      v.text = `The total ${num(arithmetic.claimed, 6)} is wrong: ${arithmetic.text} is ${fmt(arithmetic.value)}${formulaRight ? `, which matches Solute's ${fmt(v.ours)} — the formula was right, the adding up was not` : `; Solute gives ${fmt(v.ours)}`}.`;
    }
  }
  // Line 1 is the verdict on the claim; a danger in the values themselves leads line 2.
  const danger = assessment.findings.some((f) => f.severity === "danger")
    ? verdictOf(assessment.findings)
    : undefined;
  const keyNumbers = [danger, base.keyNumbers].filter(Boolean).join(" · ");
  return {
    ...base,
    kind: "check",
    headline: checkHeadline(verdicts, arithmetic),
    ...(keyNumbers && { keyNumbers }),
    why: verdicts.map((v) => v.text).slice(0, 2),
    interpretation: [...verdicts.map((v) => v.text), ...base.interpretation],
    problems: [...problems, ...base.problems],
    notes: [...notes, ...base.notes.filter((n) => !n.startsWith("As printed:"))],
    cautions: base.cautions.length > 0 ? base.cautions : assessment.cautions,
    ...(base.data && { data: { ...base.data, verdicts } }),
  };
}

export const checkCommand: Command = { words: ["check", "verify"], run: check };

/** The first run of arithmetic in a message: numbers joined by operators, with an optional "= N". */
export function findExpression(
  text: string,
): { text: string; start: number; end: number; claimed?: number } | undefined {
  const run = /[\d.,()+\-*/×÷−^\s]{3,400}/g;
  for (let m = run.exec(text); m; m = run.exec(text)) {
    // The expression starts at the first number (or bracket) that an operator follows; a lone
    // number before it belongs to a name ("urea 14 2*128 + …").
    const begin = /\(*\s*\d[\d.,]*\s*[+\-*/×÷−^]\s*[\d(]/.exec(m[0]);
    if (!begin) continue;
    const expr = m[0].slice(begin.index).trimEnd();
    const start = m.index + begin.index;
    let end = start + expr.length;
    let claimed: number | undefined;
    const after = /^\s*=\s*(\d{1,6}(?:[.,]\d{1,6})?)/.exec(text.slice(end));
    if (after) {
      claimed = Number(after[1]!.replace(",", "."));
      end += after[0].length;
    }
    return { text: expr.trim(), start, end, ...(claimed !== undefined && { claimed }) };
  }
  return undefined;
}
