/** Builds the reply for a message with lab values: facts, interpretation, working, cautions. */

import { ANALYTES } from "../core/analytes.js";
import type { Assessment, AssessOptions, Finding } from "../core/assess.js";
import { sortFindings } from "../core/findings.js";
import { fmt, num } from "../core/format.js";
import type { Reading } from "../core/reader/index.js";
import type { Result } from "../core/results.js";
import { checkClaims } from "./claims.js";
import type { BotConfig } from "./commands/context.js";
import { emptyReply, type Fact, type Reply } from "./reply.js";
import { keyNumbersOf, verdictFindings, verdictOf, visibleCautionsOf, whyOf } from "./summary.js";

export function factsOf(a: Assessment): Fact[] {
  const r = a.results;
  const facts: Fact[] = [];
  const add = (label: string, result: Result | undefined) =>
    result && facts.push({ label, value: `${fmt(result.value)} ${result.unit}`, formula: result.formula });
  add("Calculated osmolality", r.calculatedOsmolality);
  add("Effective osmolality (tonicity)", r.effectiveOsmolality);
  add("Osmolal gap", r.osmolalGap);
  add("Anion gap", r.anionGap);
  if (r.correctedSodium) {
    facts.push({
      label: "Sodium corrected for glucose",
      value: `${fmt(r.correctedSodium.katz.value)} (Katz) · ${fmt(r.correctedSodium.hillier.value)} (Hillier) mmol/L`,
      formula: "Na + 1.6 or 2.4 × (glucose mg/dL − 100) ÷ 100",
    });
  }
  return facts;
}

export function workingOf(a: Assessment): string[] {
  const r = a.results;
  const main = [
    r.calculatedOsmolality,
    r.effectiveOsmolality,
    r.osmolalGap,
    r.anionGap,
    r.correctedSodium?.katz,
    r.correctedSodium?.hillier,
  ];
  return [...main.filter((x): x is Result => x !== undefined), ...a.alternatives].map(
    (x) => `${x.label} [${x.formula}]: ${x.working} — ${x.source}`,
  );
}

export function sortedFindings(a: Assessment): Finding[] {
  return sortFindings(a.findings);
}

export function headlineOf(a: Assessment): string {
  const r = a.results;
  const parts: string[] = [];
  if (r.calculatedOsmolality) parts.push(`calculated ${fmt(r.calculatedOsmolality.value)}`);
  if (r.effectiveOsmolality) parts.push(`effective ${fmt(r.effectiveOsmolality.value)}`);
  if (r.osmolalGap) parts.push(`gap ${fmt(r.osmolalGap.value)}`);
  const osm = parts.length > 0 ? `Osmolality: ${parts.join(" · ")} mOsm/kg` : "";
  if (osm) return osm;
  if (r.correctedSodium)
    return `Corrected sodium ${fmt(r.correctedSodium.katz.value)} (Katz) · ${fmt(r.correctedSodium.hillier.value)} (Hillier) mmol/L`;
  if (r.anionGap) return `Anion gap ${fmt(r.anionGap.value)} mmol/L`;
  const first = sortedFindings(a)[0];
  return first ? first.text : "Read, but nothing could be calculated from these values";
}

/** The values as read, compactly: units only where they are not the usual mmol/L or mOsm/kg. */
export function readShortOf(reading: Reading): string {
  return reading.values
    .map((v) => {
      const a = ANALYTES[v.analyte];
      const unit = v.unit === "pH" || v.unit === "mmol/L" || v.unit === "mOsm/kg" ? "" : ` ${v.unit}`;
      const gas = v.specimen === "bloodGas" ? " (gas)" : "";
      const label = v.key === "measuredOsmolality" ? "osm" : a.label;
      return `${label} ${v.below ? "<" : ""}${num(v.written, 6)}${unit}${gas}`;
    })
    .join(", ");
}

export function computeReply(reading: Reading, a: Assessment, showWorking: boolean): Reply {
  if (reading.values.length === 0) {
    const reply = emptyReply("nothing", "No lab values found in that message");
    reply.problems = reading.problems.map(({ code, message }) => ({ code, message }));
    reply.data = { reading, assessment: a };
    if (reply.problems.length === 0) {
      reply.problems.push({
        code: "input.empty",
        message:
          "Type values as you would write them, like: Na 128 glu 540 mg/dL urea 14 mmol/L osm 310. Type help for more.",
      });
    }
    return reply;
  }
  const interpreting = Object.keys(a.results).length > 0 || a.findings.length > 0;
  // Values a lab or an analyser calculated and printed are checked against ours, never used.
  const printed =
    reading.claims.length > 0 ? checkClaims(reading, a).map((v) => `As printed: ${v.text}`) : [];
  const said = verdictFindings(a.findings);
  const verdict = verdictOf(a.findings, said);
  const keyNumbers = keyNumbersOf(a);
  // Assembled by assignment: a conditional spread here is slow on the hot path.
  const reply: Reply = {
    kind: "result",
    headline: verdict ?? headlineOf(a),
    readShort: readShortOf(reading),
    why: whyOf(a.findings, said),
    visibleCautions: interpreting ? visibleCautionsOf(a.cautionIds) : [],
    readAs: reading.tag ? `${reading.echo} — case ${reading.tag}` : reading.echo,
    facts: factsOf(a),
    // assess() returns its findings sorted, danger first.
    interpretation: a.findings.map((f) => f.text),
    working: workingOf(a),
    problems: reading.problems.map(({ code, message }) => ({ code, message })),
    notes: printed.length > 0 ? [...printed, ...reading.notes] : reading.notes,
    cautions: interpreting ? a.cautions : [],
    shareable: interpreting && reading.identifiers.length === 0,
    showWorking,
    data: { reading, assessment: a },
  };
  if (keyNumbers && verdict) reply.keyNumbers = keyNumbers;
  return reply;
}

/**
 * How the engine reads this message: the channel's ranges, the glucose as written (each criterion
 * is compared in its own unit), and a lab range printed beside the measured osmolality, which then
 * takes the place of the configured one (the reading notes say so).
 */
export function assessOptions(
  reading: Reading,
  config: BotConfig,
  unitSystem?: "si" | "conventional",
): AssessOptions {
  const glucose = reading.values.find((v) => v.key === "glucose");
  const osm = reading.values.find((v) => v.key === "measuredOsmolality");
  const printed = osm?.labRange;
  let osmolalityRange = config.osmolalityRange;
  if (
    printed?.low !== undefined &&
    printed.high !== undefined &&
    printed.low >= 250 &&
    printed.high <= 330 &&
    printed.low < printed.high
  ) {
    osmolalityRange = { low: printed.low, high: printed.high };
    reading.notes.push(
      `Osmolality judged against the lab's printed range, ${printed.low}–${printed.high} mOsm/kg.`,
    );
  }
  // Numbers are shown first in the units the message was written in: the channel's setting, or
  // else the unit its glucose (or urea, or ethanol) was written in.
  const written = reading.values.find((v) => v.key === "glucose" || v.key === "urea" || v.key === "ethanol");
  const system =
    unitSystem ??
    (written?.unit === "mmol/L" ? "si" : written?.unit === "mg/dL" ? "conventional" : undefined);
  return {
    osmolalityRange,
    ...(system && { unitSystem: system }),
    ...(config.anionGapRange && { anionGapRange: config.anionGapRange }),
    ...(glucose && { glucoseWritten: { value: glucose.written, unit: glucose.unit } }),
  };
}
