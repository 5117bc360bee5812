/**
 * The planning command: what a litre (or a given volume) of a fluid is expected to do to the
 * sodium, by Adrogué–Madias, with the free water deficit in hypernatraemia — or, in reverse, the
 * volume for a wanted change. It is judged by the correction model (core/correction.ts) against
 * the case's logged episode plus the plan's own sodium, in the current 24 h window. High risk is
 * set by the words or by the values in the message and stays with the case. The verdict comes
 * first: a plan the limits forbid says so before its numbers.
 */
import { CAUTIONS, SHORT_CAUTIONS } from "../../core/cautions.js";
import { correctionTrend, planFits, type SodiumPoint } from "../../core/correction.js";
import {
  adrogueMadias,
  freeWaterDeficit,
  INFUSATES,
  tbwFraction,
  totalBodyWater,
  volumeChange,
} from "../../core/fluids.js";
import { fmt, num, signed } from "../../core/format.js";
import { readPlan } from "../../core/plan-reader.js";
import { readMessage } from "../../core/reader/index.js";
import type { Result } from "../../core/results.js";
import { readSeries } from "../../core/series.js";
import { errorCode } from "../log.js";
import { emptyReply, type Reply } from "../reply.js";
import { episodeOf, markHighRisk, pointsOf } from "../shift.js";
import type { Bot, Command, Context } from "./context.js";

const HOUR = 3_600_000;
/** Hypokalaemia below 3.5 mmol/L raises the risk of osmotic demyelination (REFERENCES §5 [M]). */
const HYPOKALAEMIA = 3.5;

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

export async function plan(ctx: Context, bot: Bot): Promise<Reply> {
  const { plan: p, problems, rest } = readPlan(ctx.rest);
  const reading = readMessage(rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  const reply = emptyReply("plan", "Fluid plan");
  reply.problems.push(...problems.map(({ code, message }) => ({ code, message })));
  // A series written in the message ("Na 118 at 22:00, 124 at 04:00 …") counts like a logged
  // one: its last sodium is the plan's own.
  const series = readSeries(rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  const written =
    series.timed && series.problems.length === 0 && series.points.length >= 2 ? series.points : undefined;
  const ownProblems = written
    ? reading.problems.filter((x) => !x.code.startsWith("columns.") && x.code !== "value.conflict")
    : reading.problems;
  reply.problems.push(...ownProblems.map(({ code, message }) => ({ code, message })));
  if (series.timed && !written)
    reply.problems.push(...series.problems.map(({ code, message }) => ({ code, message })));
  const na = written ? written.at(-1)!.sodium : reading.inputs.sodium;
  const k = reading.inputs.potassium;
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

  // High risk: said in words, or shown by the values (Na ≤ 105, hypokalaemia); it stays with the case.
  const riskByValues = na <= 105 || (k !== undefined && k < HYPOKALAEMIA);
  const now = bot.clock();
  let points: SodiumPoint[] = [];
  let firstAt = now;
  let loggedHighRisk = false;
  if (written) {
    // Hour 0 is the series' first value; now is its last.
    points = written.slice(0, -1);
    firstAt = now - written.at(-1)!.hours * HOUR;
  } else if (reading.tag) {
    try {
      const episode = episodeOf(await bot.store.listRecords(ctx.channel, now), reading.tag);
      const logged = pointsOf(episode);
      loggedHighRisk = episode.highRisk;
      if (logged.firstAt !== undefined) {
        firstAt = logged.firstAt;
        points = logged.points;
      }
    } catch (error) {
      bot.log("warn", "store.log-unavailable", { code: errorCode(error) });
      reply.notes.push("The shift log is unavailable: the correction already made could not be counted.");
    }
  }
  const highRisk = p.highRisk || riskByValues || loggedHighRisk;
  if (reading.tag && (p.highRisk || riskByValues) && !loggedHighRisk)
    await markHighRisk(ctx, bot, reading.tag);
  // The plan's own sodium is the latest point of the episode.
  const nowHours = (now - firstAt) / HOUR;
  const last = points.at(-1);
  if (!last || last.sodium !== na || nowHours - last.hours > 0.25)
    points.push({ hours: nowHours, sodium: na });
  const trend = points.length >= 2 ? correctionTrend(points, { highRisk, nowHours }) : undefined;
  const direction = na < 135 ? "raising" : na > 145 ? "lowering" : "none";

  reply.facts.push({
    label: "Total body water",
    value: `${fmt(tbw.value)} L`,
    formula: tbw.formula === "as given" ? "as given" : tbw.working.split(" = ")[0]!,
  });
  reply.working.push(`${tbw.label}: ${tbw.working} — ${tbw.source}`);

  let change: number | undefined;
  let litres = p.litres ?? 1;
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
    if (p.target !== undefined) {
      // Reverse planning: the volume for the wanted change, ΔT ÷ ΔNa per litre (REFERENCES §5 [D]).
      if (perLitre.value === 0 || Math.sign(perLitre.value) !== Math.sign(p.target)) {
        reply.problems.push({
          code: "plan.targetWrongWay",
          message: `${infusate.name} moves this sodium ${perLitre.value > 0 ? "up" : perLitre.value < 0 ? "down" : "not at all"}: it cannot give a change of ${signed(p.target)}.`,
        });
        reply.headline = "Fluid plan: that fluid cannot give that change";
        return reply;
      }
      litres = p.target / perLitre.value;
      reply.facts.push({
        label: `Volume for ${signed(p.target)} mmol/L`,
        value: `about ${num(litres * 1000, 0)} mL`,
        formula: "wanted change ÷ change per litre",
      });
      reply.working.push(
        `Volume for ${signed(p.target)} mmol/L: ${signed(p.target)} ÷ ${fmt(perLitre.value, 2)} = ${fmt(litres, 3)} L — from the Adrogué–Madias estimate per litre`,
      );
      change = p.target;
    } else {
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
    }
    reply.facts.push({
      label: "Expected sodium after",
      value: `about ${fmt(na + change)} mmol/L`,
      formula: `from ${num(na)}`,
    });
    reply.headline = `${num(litres * 1000, 0)} mL of ${infusate.name}: ${signed(change)} mmol/L expected (Na ${num(na)} → about ${fmt(na + change)})`;
    // A bolus target belongs to severe symptomatic hyponatraemia only.
    if (p.infusate.id === "saline-3" && na < 130)
      reply.interpretation.push(
        "With severe symptoms, guidelines aim for a rise of about 5 mmol/L in the first hour (Spasovski 2014); bolus volumes per local protocol.",
      );
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

  // Limits: the logged episode and the plan's own sodium, in the current window, plus the plan.
  if (change !== undefined) {
    const fits = planFits(trend, change, highRisk, na);
    const soFar = trend
      ? trend.findings.find((f) => f.code === "correction.tooFast" || f.code === "correction.worsening")
      : undefined;
    if (trend) {
      const w = trend.windows.find((x) => x.open) ?? trend.windows.at(-1)!;
      reply.interpretation.push(
        `${written ? "In the series written" : `Logged for ${reading.tag}`}: ${signed((trend.direction === "lowering" ? -1 : 1) * w.change)} mmol/L so far in hours ${num(w.fromHours)}–${num(w.toHours)} of the episode (limit ${w.limit}).`,
      );
    }
    const riskText = highRisk
      ? ` (high risk${riskByValues ? `: ${na <= 105 ? "Na ≤ 105" : "potassium below 3.5"}` : ""})`
      : "";
    if (direction === "raising" && change > 0) {
      if (soFar?.code === "correction.tooFast" || !fits.fits) {
        const sum =
          fits.already > 0 ? ` (${signed(fits.already)} already and ${signed(change)} planned)` : "";
        reply.interpretation.unshift(
          `Too fast: ${signed(fits.total)} mmol/L${sum} would exceed the limit of ${fits.limit} in this 24 h window${riskText} (European guideline, Spasovski 2014; Verbalis 2013 at high risk). ${fmt(fits.room)} more is allowed now. Risk of osmotic demyelination.`,
        );
        reply.headline = `Too fast: ${reply.headline}; only ${fmt(fits.room)} more is allowed in this window`;
      } else {
        reply.interpretation.push(
          `${signed(fits.total)} mmol/L${fits.already > 0 ? ` (${signed(fits.already)} already and ${signed(change)} planned)` : ""} is within the limit of ${fits.limit} for this 24 h window${riskText}; ${fmt(fits.room - change)} would be left.`,
        );
      }
    } else if (direction === "raising" && change < 0) {
      reply.interpretation.unshift(
        `This fluid would lower an already low sodium (${signed(change)} mmol/L).`,
      );
      reply.headline = `Lowers a low sodium: ${reply.headline}`;
    } else if (direction === "lowering" && change > 0) {
      reply.interpretation.unshift(
        `This fluid would raise an already high sodium (${signed(change)} mmol/L).`,
      );
      reply.headline = `Raises a high sodium: ${reply.headline}`;
    } else if (direction === "lowering" && change < 0) {
      if (soFar?.code === "correction.tooFast" || !fits.fits) {
        reply.interpretation.unshift(
          `Too fast: a fall of ${fmt(fits.total)} mmol/L would exceed about ${fits.limit} in 24 h for a chronic hypernatraemia (REFERENCES §5, to be confirmed locally; an acute one may be lowered faster).`,
        );
        reply.headline = `Too fast: ${reply.headline}`;
      } else {
        reply.interpretation.push(
          `A fall of ${fmt(fits.total)} mmol/L is within about ${fits.limit} in 24 h for a chronic hypernatraemia (about 0.5 mmol/L an hour; acute may be faster).`,
        );
      }
    }
    if (soFar?.code === "correction.worsening") reply.interpretation.unshift(soFar.text);
  }
  reply.cautions = [...(p.infusate ? PLAN_CAUTIONS : PLAN_CAUTIONS.slice(1)), CAUTIONS.general];
  reply.visibleCautions = [
    p.infusate
      ? "An estimate for one litre at once: it ignores losses and urine output — recheck the sodium often."
      : "It ignores ongoing losses: recheck the sodium often.",
    SHORT_CAUTIONS.general,
  ];
  reply.shareable = reading.identifiers.length === 0;
  if (trend) reply.data = { trend };
  return reply;
}

export const planCommand: Command = { words: ["plan", "fluids", "fluid"], run: plan };
