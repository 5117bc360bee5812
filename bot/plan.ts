/**
 * The planning command: what a litre (or a given volume) of a fluid is expected to do to the
 * sodium, by Adrogué–Madias, with the free water deficit in hypernatraemia, checked against the
 * correction limits and the correction already logged for the case this shift.
 */
import { CAUTIONS } from "../core/cautions.js";
import {
  adrogueMadias,
  freeWaterDeficit,
  INFUSATES,
  tbwFraction,
  totalBodyWater,
  volumeChange,
} from "../core/fluids.js";
import { fmt, num, signed } from "../core/format.js";
import { readPlan } from "../core/plan-reader.js";
import { readMessage } from "../core/reader/index.js";
import type { Result } from "../core/results.js";
import type { Context, Conversation } from "./conversation.js";
import { errorCode, log } from "./log.js";
import { emptyReply, type Reply } from "./reply.js";
import { CORRECTION_LIMITS, sodiumTrend } from "./shift.js";

const PLAN_CAUTIONS = [
  "The Adrogué–Madias estimate is exact only for one litre given at once; it ignores ongoing losses, urine output and any other fluid. Once the cause is treated, a water diuresis can raise the sodium much faster than predicted.",
  "Recheck the sodium often while correcting (every few hours, more often with hypertonic saline) and adjust; follow local protocols and the treating team.",
];

const BASIS: Record<string, string> = {
  "child:": "child",
  "adult:male": "adult man",
  "adult:female": "adult woman",
  "elderly:male": "older man",
  "elderly:female": "older woman",
};

export async function plan(ctx: Context, bot: Conversation): Promise<Reply> {
  const { plan: p, problems, rest } = readPlan(ctx.rest);
  const reading = readMessage(rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  const reply = emptyReply("plan", "Fluid plan");
  reply.problems.push(...problems.map(({ code, message }) => ({ code, message })));
  reply.problems.push(...reading.problems.map(({ code, message }) => ({ code, message })));
  const na = reading.inputs.sodium;
  if (reading.echo) reply.readAs = reading.echo + (reading.tag ? ` — case ${reading.tag}` : "");

  // Total body water: given, or from weight, sex and age band.
  let tbw: Result | undefined;
  if (p.tbw !== undefined) {
    tbw = {
      id: "totalBodyWater",
      label: "Total body water",
      formula: "as given",
      value: p.tbw,
      unit: "L",
      working: `given: ${num(p.tbw)} L`,
      source: "as given",
    };
  } else if (p.weightKg !== undefined) {
    if (!p.age)
      reply.problems.push({
        code: "plan.ageMissing",
        message:
          "Say the age band — child, adult or elderly (65 or over) — or give the total body water (TBW 35 L).",
      });
    else {
      const fraction = tbwFraction(p.age, p.sex);
      if (fraction === undefined)
        reply.problems.push({
          code: "plan.sexMissing",
          message:
            "Say man or woman (it sets the fraction of weight that is water), or give the total body water (TBW 35 L).",
        });
      else tbw = totalBodyWater(p.weightKg, fraction, BASIS[`${p.age}:${p.age === "child" ? "" : p.sex}`]!);
    }
  } else if (!problems.some((x) => x.code.startsWith("plan.weight"))) {
    reply.problems.push({
      code: "plan.weightMissing",
      message: "Give the weight (70 kg), with sex and age band, or the total body water (TBW 35 L).",
    });
  }
  if (na === undefined && !reading.problems.some((x) => x.code.startsWith("value."))) {
    reply.problems.push({
      code: "plan.sodiumMissing",
      message: "Give the current sodium, like: plan Na 118 70 kg woman adult 1 L 0.9% NaCl.",
    });
  }
  const wantsFluid = !p.freeWater || p.infusate !== undefined;
  if (wantsFluid && !p.infusate) {
    reply.problems.push({
      code: "plan.fluidUnknown",
      message: `Which fluid? Name one of: ${Object.values(INFUSATES)
        .map((f) => f.name)
        .join(", ")} — or give its contents, like: fluid Na 77 K 20.`,
    });
  }
  // Anything refused in the plan itself (a weight, volume or fluid) stops it: no partial answers.
  if (na === undefined || !tbw || reply.problems.some((x) => x.code.startsWith("plan."))) {
    reply.headline = "Fluid plan: more is needed";
    return reply;
  }

  reply.facts.push({
    label: "Total body water",
    value: `${fmt(tbw.value)} L`,
    formula: tbw.formula === "as given" ? "as given" : tbw.working.split(" = ")[0]!,
  });
  reply.working.push(`${tbw.label}: ${tbw.working} — ${tbw.source}`);

  let change: number | undefined;
  if (p.infusate) {
    const infusate = { ...p.infusate, potassium: p.infusate.potassium + (p.addedPotassium ?? 0) };
    if (p.addedPotassium)
      infusate.name = `${p.infusate.name} with ${num(p.addedPotassium)} mmol/L potassium added`;
    const perLitre = adrogueMadias(na, tbw.value, infusate);
    reply.facts.push({
      label: `Per litre of ${infusate.name}`,
      value: `${signed(perLitre.value)} mmol/L`,
      formula: "Adrogué–Madias",
    });
    reply.working.push(`${perLitre.label}: ${perLitre.working} — ${perLitre.source}`);
    change = perLitre.value;
    if (p.litres !== undefined && p.litres !== 1) {
      const forVolume = volumeChange(na, tbw.value, infusate, p.litres);
      reply.facts.push({
        label: `For ${num(p.litres * 1000, 0)} mL`,
        value: `${signed(forVolume.value)} mmol/L`,
        formula: forVolume.formula,
      });
      reply.working.push(`${forVolume.label}: ${forVolume.working} — ${forVolume.source}`);
      change = forVolume.value;
    }
    reply.facts.push({
      label: "Expected sodium after",
      value: `about ${fmt(na + change)} mmol/L`,
      formula: `from ${num(na)}`,
    });
    reply.headline = `${num(p.litres !== undefined ? p.litres * 1000 : 1000, 0)} mL of ${infusate.name}: ${signed(change)} mmol/L expected (Na ${num(na)} → about ${fmt(na + change)})`;
    if (p.infusate.id === "saline-3") {
      reply.interpretation.push(
        "In severe symptoms, guidelines aim for a rise of about 5 mmol/L in the first hour (Spasovski 2014); bolus volumes per local protocol.",
      );
    }
  }

  if (na > 145) {
    const deficit = freeWaterDeficit(na, tbw.value);
    reply.facts.push({
      label: "Free water deficit",
      value: `${fmt(deficit.value)} L`,
      formula: deficit.formula,
    });
    reply.working.push(`${deficit.label}: ${deficit.working} — ${deficit.source}`);
    reply.interpretation.push(
      "The free water deficit leaves out ongoing losses (urine, stool, insensible): replace those too.",
    );
    if (!p.infusate)
      reply.headline = `Free water deficit: ${fmt(deficit.value)} L (Na ${num(na)}, TBW ${fmt(tbw.value)} L)`;
  } else if (p.freeWater) {
    reply.notes.push("A free water deficit applies to a sodium above 145 mmol/L.");
  }

  // Limits: the plan alone, and with the correction already logged for this case in 24 h.
  if (change !== undefined) {
    const highRisk = p.highRisk || na <= 105;
    let already = 0;
    if (reading.tag) {
      try {
        const trend = sodiumTrend(
          (await bot.store.listRecords(ctx.channel, bot.clock())).filter((r) => r.tag === reading.tag),
        );
        if (trend && trend.spanMs <= 24 * 3_600_000) {
          already = trend.change;
          reply.interpretation.push(
            `Logged for ${reading.tag} this shift: ${signed(already)} mmol/L over ${fmt(trend.spanMs / 3_600_000)} h.`,
          );
        }
      } catch (error) {
        log("warn", "store.log-unavailable", { code: errorCode(error) });
        reply.notes.push("The shift log is unavailable: the correction already made could not be counted.");
      }
    }
    const total = already + change;
    if (total > 0) {
      const limit = highRisk ? CORRECTION_LIMITS.highRisk : CORRECTION_LIMITS.standard;
      const sum = already !== 0 ? ` (${signed(already)} already + ${signed(change)} planned)` : "";
      if (total > CORRECTION_LIMITS.standard) {
        reply.interpretation.unshift(
          `Too fast: ${signed(total)} mmol/L${sum} would exceed the 10 mmol/L limit for the first 24 h (European guideline, Spasovski 2014; the US panel allows 10–12). Risk of osmotic demyelination.`,
        );
      } else if (total > CORRECTION_LIMITS.highRisk) {
        reply.interpretation.unshift(
          highRisk
            ? `Too fast for a high-risk patient: ${signed(total)} mmol/L${sum} would exceed 8 mmol/L in 24 h (Verbalis 2013).`
            : `${signed(total)} mmol/L${sum} is within 10 mmol/L for 24 h but above the 8 mmol/L limit for patients at high risk (Na ≤ 105, hypokalaemia, alcohol use disorder, malnutrition, liver disease).`,
        );
      } else {
        reply.interpretation.push(
          `${signed(total)} mmol/L${sum} is within the ${limit} mmol/L per 24 h limit${highRisk ? " for high risk" : ""}.`,
        );
      }
    } else if (change < 0 && na < 135) {
      reply.interpretation.unshift(
        `This fluid would lower an already low sodium (${signed(change)} mmol/L).`,
      );
    }
  }
  reply.cautions = [...(p.infusate ? PLAN_CAUTIONS : PLAN_CAUTIONS.slice(1)), CAUTIONS.general];
  reply.shareable = reading.identifiers.length === 0;
  return reply;
}

export function registerPlanCommand(bot: Conversation): void {
  bot.command(["plan", "fluids", "fluid"], plan);
}
