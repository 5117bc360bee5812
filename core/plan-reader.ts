/**
 * Reads a planning request: "plan Na 118 70 kg woman elderly 1 L 0.9% NaCl", "plan Na 160 TBW 34 L
 * free water", "plan bed 12 Na 121 80 kg man adult 500 mL fluid Na 77 K 20". The words it takes
 * are blanked; the rest (sodium, case tag, identifiers, unknown words) goes to the ordinary reader.
 * Every regular expression here is linear: no nested or overlapping repetition.
 */
import type { AgeBand, Sex } from "./fluids.js";
import { INFUSATES, TBW_RANGE, VOLUME_RANGE, WEIGHT_RANGE } from "./fluids.js";
import { num } from "./format.js";
import type { Problem } from "./reader/index.js";

export interface PlanInputs {
  weightKg?: number;
  tbw?: number;
  sex?: Sex;
  age?: AgeBand;
  infusate?: { id?: string; name: string; sodium: number; potassium: number };
  addedPotassium?: number;
  litres?: number;
  freeWater: boolean;
  highRisk: boolean;
  /** Reverse planning: the change wanted, mmol/L (negative to lower). */
  target?: number;
}

export interface PlanReading {
  plan: PlanInputs;
  problems: Problem[];
  /** The message with the planning words blanked out, for the ordinary reader. */
  rest: string;
}

const NUM = "(\\d{1,5}(?:[.,]\\d{1,4})?)";

// Half-normal saline before normal saline: "half normal saline" holds "normal saline".
const FLUIDS: [RegExp, string][] = [
  [
    /\b(?:0[.,]45\s?%|half[-\s]normal saline|half normal)(?:\s?(?:nacl|saline|sodium chloride))?/i,
    "saline-0.45",
  ],
  [/\b(?:0[.,]9\s?%|normal saline|\bns\b)(?:\s?(?:nacl|saline|sodium chloride))?/i, "saline-0.9"],
  [/\b(?:3\s?%\s?(?:nacl|saline|sodium chloride)?|hypertonic saline)/i, "saline-3"],
  [/\b5\s?%\s?(?:nacl|saline|sodium chloride)/i, "saline-5"],
  [/\b(?:lactated ringer'?s?|ringer'?s? lactate|\blr\b|\brl\b)/i, "lactated-ringers"],
  [/\bhartmann'?s?\b/i, "hartmanns"],
  [/\bbalanced(?:\s(?:multi-?electrolyte|crystalloid|solution))*/i, "balanced"],
  [/\b(?:5\s?%\s?(?:dextrose|glucose)|d5w|dextrose 5\s?%)/i, "dextrose-5"],
  [/\b(?:8[.,]4\s?%\s?(?:sodium )?(?:bicarbonate|bicarb|nahco3))/i, "bicarbonate-8.4"],
];

const number = (s: string) => Number(s.replace(",", "."));

export function readPlan(text: string): PlanReading {
  let rest = text;
  const problems: Problem[] = [];
  const plan: PlanInputs = { freeWater: false, highRisk: false };
  const take = (re: RegExp): RegExpExecArray | null => {
    const m = re.exec(rest);
    // Each word taken becomes "+" (a filler the reader skips), so the reader still counts words
    // as they were written when it names one it did not understand.
    const blank = (span: string) => span.replace(/\S+/g, (w) => `+${" ".repeat(w.length - 1)}`);
    if (m) rest = rest.slice(0, m.index) + blank(m[0]) + rest.slice(m.index + m[0].length);
    return m;
  };

  // A custom infusate first ("fluid Na 77 K 20"), so its Na is not read as the serum sodium.
  const custom = take(
    new RegExp(
      `\\b(?:fluid|infusate|bag)\\s*[:=]?\\s*na\\+?\\s*[:=]?\\s*${NUM}(?:\\s*(?:mmol/l|meq/l))?(?:\\s*,?\\s*k\\+?\\s*[:=]?\\s*${NUM}(?:\\s*(?:mmol/l|meq/l))?)?`,
      "i",
    ),
  );
  if (custom) {
    plan.infusate = {
      name: `a fluid with Na ${num(number(custom[1]!))}${custom[2] ? ` and K ${num(number(custom[2]))}` : ""} mmol/L`,
      sodium: number(custom[1]!),
      potassium: custom[2] ? number(custom[2]) : 0,
    };
    if (plan.infusate.sodium > 1000 || plan.infusate.potassium > 200) {
      problems.push({
        code: "plan.infusateImplausible",
        message: "That fluid's sodium or potassium is not plausible (Na up to 1000, K up to 200 mmol/L).",
      });
      delete plan.infusate;
    }
  }
  for (const [re, id] of FLUIDS) {
    if (plan.infusate) break;
    if (take(re)) plan.infusate = { ...INFUSATES[id]! };
  }

  // Added potassium, in the usual spellings: "+ KCl 20", "KCl 20 mmol", "+ 20 mmol KCl",
  // "NS + 40 KCl", "with 20 mmol/L KCl", "20 mmol/L KCl added".
  const added = take(
    new RegExp(
      `(?:\\+\\s*|\\badd(?:ed)?\\s+|\\bwith\\s+)(?:kcl|k\\+?|potassium(?: chloride)?)\\s*[:=]?\\s*${NUM}\\s*(?:mmol(?:/l)?|meq(?:/l)?)?|\\bkcl\\s*[:=]?\\s*${NUM}\\s*(?:mmol(?:/l)?|meq(?:/l)?)?|(?:\\+\\s*|\\badd(?:ed)?\\s+|\\bwith\\s+)?${NUM}\\s*(?:mmol(?:/l)?|meq(?:/l)?)?\\s*(?:of\\s+)?(?:kcl|potassium chloride)(?:\\s+added)?\\b`,
      "i",
    ),
  );
  if (added) {
    plan.addedPotassium = number(added[1] ?? added[2] ?? added[3]!);
    if (plan.addedPotassium > 200) {
      problems.push({
        code: "plan.potassiumImplausible",
        message: "Added potassium above 200 mmol/L is not plausible.",
      });
      delete plan.addedPotassium;
    }
  }

  const tbw = take(new RegExp(`\\btbw\\s*[:=]?\\s*${NUM}\\s*(?:l|litres?|liters?)?\\b`, "i"));
  if (tbw) {
    const v = number(tbw[1]!);
    if (v < TBW_RANGE.min || v > TBW_RANGE.max)
      problems.push({
        code: "plan.tbwImplausible",
        message: `Total body water ${num(v)} L is not plausible (${TBW_RANGE.min}–${TBW_RANGE.max} L).`,
      });
    else plan.tbw = v;
  }

  const weight = take(new RegExp(`(?:\\b(?:weight|wt)\\s*[:=]?\\s*)?${NUM}\\s*(kg|kgs|lb|lbs)\\b`, "i"));
  if (weight) {
    const kg = number(weight[1]!) * (/^lb/i.test(weight[2]!) ? 0.45359237 : 1);
    if (kg < WEIGHT_RANGE.min || kg > WEIGHT_RANGE.max) {
      problems.push({
        code: "plan.weightImplausible",
        message: `A weight of ${weight[1]} ${weight[2]} is not plausible (${WEIGHT_RANGE.min}–${WEIGHT_RANGE.max} kg): not used. Check for a typo.`,
      });
    } else plan.weightKg = kg;
  } else if (take(new RegExp(`\\b(?:weight|wt)\\s*[:=]?\\s*${NUM}`, "i"))) {
    problems.push({
      code: "plan.weightUnit",
      message: "The weight has no unit: write kg or lb (e.g. 70 kg).",
    });
  }

  const volume = take(new RegExp(`\\b${NUM}\\s*(ml|l|litres?|liters?)\\b`, "i"));
  if (volume) {
    const litres = number(volume[1]!) / (/^ml$/i.test(volume[2]!) ? 1000 : 1);
    if (litres < VOLUME_RANGE.min || litres > VOLUME_RANGE.max) {
      problems.push({
        code: "plan.volumeImplausible",
        message: `A volume of ${volume[1]} ${volume[2]} is outside ${VOLUME_RANGE.min * 1000} mL–${VOLUME_RANGE.max} L: not used.`,
      });
    } else plan.litres = litres;
  }

  const sex = take(/\b(male|man|boy|female|woman|girl)\b/i);
  if (sex) plan.sex = /^(male|man|boy)$/i.test(sex[1]!) ? "male" : "female";
  if (sex && /^(boy|girl)$/i.test(sex[1]!)) plan.age = "child";
  const ageWord = take(/\b(child|paediatric|pediatric|adult|elderly|older adult|older)\b/i);
  if (ageWord)
    plan.age = /^(child|p(a)?ediatric)$/i.test(ageWord[1]!)
      ? "child"
      : /^adult$/i.test(ageWord[1]!)
        ? "adult"
        : "elderly";
  const ageYears = take(/\bage[d]?\s*[:=]?\s*(\d{1,2})\b/i);
  if (ageYears && !plan.age) {
    const years = Number(ageYears[1]);
    // 18 and 65 as the bands' edges: common practice.
    plan.age = years < 18 ? "child" : years >= 65 ? "elderly" : "adult";
  }

  // Reverse planning: "how much 3% for +5", "to raise it by 5", "to bring it down 4", "to lower
  // it by 3", "target +6". The direction comes from the words or the sign; when they disagree
  // ("to lower it by +4") nothing is guessed.
  const target = take(
    /\b(?:how\s+much\b[^\d+\-−]{0,40}?)?(?:for|by|target|to\s+(?:raise|lift|increase|lower|reduce|decrease|drop)(?:\s+it)?(?:\s+by)?|to\s+(?:bring|take)(?:\s+it)?\s+(down|up)(?:\s+by)?)\s*([+\-−]?\s*\d{1,2}(?:[.,]\d)?)\s*(?:mmol(?:\/l)?)?(?=\s|$)/i,
  );
  if (target) {
    const written = target[2]!.trim();
    const magnitude = Math.abs(number(written.replace(/[\s+]/g, "").replace("−", "-")));
    const saysDown = /\b(?:down|lower|reduce|decrease|drop)\b/i.test(target[0]);
    const saysUp = /\b(?:up|raise|lift|increase)\b/i.test(target[0]);
    const signDown = /^[-−]/.test(written);
    const signUp = written.startsWith("+");
    plan.target = saysDown || signDown ? -magnitude : magnitude;
    if ((saysDown && signUp) || (saysUp && signDown)) {
      problems.push({
        code: "plan.targetUnclear",
        message: "The words and the sign of the change disagree: write it one way, like +5 or -4.",
      });
      delete plan.target;
    } else if (magnitude < 0.5 || magnitude > 20) {
      problems.push({
        code: "plan.targetImplausible",
        message: "A target change should be between 0.5 and 20 mmol/L.",
      });
      delete plan.target;
    }
  }
  if (take(/\bhow\s+much\b/i) && plan.target === undefined) {
    problems.push({
      code: "plan.targetMissing",
      message: 'Say the change wanted, like "how much 3% for +5" or "to bring it down 4".',
    });
  }

  if (take(/\bfree\s*water(?:\s*deficit)?\b/i)) plan.freeWater = true;
  while (
    take(
      /\bhigh[-\s]?risk\b|\balcohol(?:\s*use)?\b|\bmalnutrition\b|\bmalnourished\b|\bliver disease\b|\bcirrhosis\b|\bhypokal(?:a)?emia\b/i,
    )
  )
    plan.highRisk = true;

  return { plan, problems, rest };
}
