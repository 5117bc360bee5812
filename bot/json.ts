/**
 * The one-shot command's JSON contract (documented in the README). Values are at full precision,
 * inputs in canonical units; results are absent when they cannot be computed.
 */
import { ANALYTES } from "../core/analytes.js";
import { INPUT_KEYS } from "../core/inputs.js";
import type { Result } from "../core/results.js";
import type { Reply } from "./reply.js";
import { trendJson } from "./shift.js";

export interface JsonResult {
  value: number;
  unit: string;
  formula: string;
  working: string;
  source: string;
}

export interface JsonReply {
  kind: Reply["kind"];
  readAs: string;
  tag?: string;
  inputs: Record<string, { value: number; unit: string }>;
  results: {
    calculatedOsmolality?: JsonResult;
    effectiveOsmolality?: JsonResult;
    osmolalGap?: JsonResult;
    anionGap?: JsonResult;
    correctedSodium?: { katz: JsonResult; hillier: JsonResult };
  };
  alternatives: (JsonResult & { id: string })[];
  /** Every interpretation as a stable code, a severity and a text; danger first (README lists the codes). */
  findings: { code: string; severity: "danger" | "warning" | "info"; text: string }[];
  /** A check's verdict on each claim: `claimed` as the colleague wrote it; `computed` by the default method. */
  verdicts?: {
    claim: string;
    claimed: number;
    computed?: number;
    holds: boolean;
    status: string;
    method?: string;
    slip?: string;
  }[];
  /** A trend's episode, windows and room left (trend, and a plan for a tagged case). */
  trend?: ReturnType<typeof trendJson>;
  interpretation: string[];
  problems: { code: string; message: string }[];
  notes: string[];
  cautions: string[];
}

const slim = (r: Result): JsonResult => ({
  value: r.value,
  unit: r.unit,
  formula: r.formula,
  working: r.working,
  source: r.source,
});

export function toJson(reply: Reply): JsonReply {
  const reading = reply.data?.reading;
  const a = reply.data?.assessment;
  const inputs: JsonReply["inputs"] = {};
  if (a) {
    for (const key of INPUT_KEYS) {
      const value = a.inputs[key];
      if (value !== undefined) inputs[key] = { value, unit: ANALYTES[key].canonicalUnit };
    }
  }
  const r = a?.results;
  return {
    kind: reply.kind,
    readAs: reading?.echo ?? "",
    ...(reading?.tag !== undefined && { tag: reading.tag }),
    inputs,
    results: {
      ...(r?.calculatedOsmolality && { calculatedOsmolality: slim(r.calculatedOsmolality) }),
      ...(r?.effectiveOsmolality && { effectiveOsmolality: slim(r.effectiveOsmolality) }),
      ...(r?.osmolalGap && { osmolalGap: slim(r.osmolalGap) }),
      ...(r?.anionGap && { anionGap: slim(r.anionGap) }),
      ...(r?.correctedSodium && {
        correctedSodium: { katz: slim(r.correctedSodium.katz), hillier: slim(r.correctedSodium.hillier) },
      }),
    },
    alternatives: (a?.alternatives ?? []).map((x) => ({ id: x.id, ...slim(x) })),
    findings: [...(reply.data?.trend?.findings ?? []), ...(a?.findings ?? [])].map(
      ({ code, severity, text }) => ({
        code,
        severity,
        text,
      }),
    ),
    ...(reply.data?.trend && { trend: trendJson(reply.data.trend) }),
    ...(reply.data?.verdicts && {
      verdicts: reply.data.verdicts.map((v) => ({
        claim: v.kind,
        claimed: v.claimed,
        ...(v.ours !== undefined && { computed: v.ours }),
        holds: v.holds,
        status: v.status,
        ...(v.method && { method: v.method }),
        ...(v.slip && { slip: v.slip }),
      })),
    }),
    interpretation: reply.interpretation,
    problems: reply.problems,
    notes: reply.notes,
    cautions: reply.cautions,
  };
}

/** Whether a reply computed anything (the one-shot command exits 0 then, 2 otherwise). */
export function computedAnything(reply: Reply): boolean {
  if (reply.kind === "help" || reply.kind === "settings") return true;
  // A plan, a trend or a handover computed something when it has numbers to show.
  if (reply.kind === "plan" || reply.kind === "trend" || reply.kind === "handover")
    return reply.facts.length > 0;
  return reply.data?.assessment !== undefined && Object.keys(reply.data.assessment.results).length > 0;
}
