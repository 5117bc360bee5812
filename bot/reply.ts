/**
 * The neutral reply model every adapter renders in its own format (plain text, Block Kit, Adaptive
 * Card). It carries numbers already formatted for reading; the exact values travel in `data`.
 */
import type { Assessment } from "../core/assess.js";
import type { CorrectionTrend } from "../core/correction.js";
import type { Reading } from "../core/reader/index.js";
import type { Verdict } from "./claims.js";

export type ReplyKind =
  | "result"
  | "check"
  | "help"
  | "settings"
  | "handover"
  | "trend"
  | "plan"
  | "forget"
  | "nothing";

export interface Fact {
  label: string;
  /** Formatted value with unit, e.g. "300.0 mOsm/kg". */
  value: string;
  /** The formula's name, e.g. "2·Na + glucose + urea". */
  formula?: string;
}

export interface ReplyProblem {
  code: string;
  message: string;
}

export interface Reply {
  kind: ReplyKind;
  /** Line 1: what matters most, in words, danger first. */
  headline: string;
  /** Line 2: the key numbers, compactly. */
  keyNumbers?: string;
  /** How the message was read, compactly ("Na 128, glucose 540 mg/dL, urea 14 mmol/L, osm 310"). */
  readShort?: string;
  /** At most three short lines for the first view: why, and the next step. */
  why: string[];
  /** The cautions of the first view: at most two that fit, then the general one; one line each. */
  visibleCautions: string[];
  /** How the message was read ("Na 128 mmol/L, glucose 540 mg/dL = 29.97 mmol/L, …"). */
  readAs?: string;
  facts: Fact[];
  interpretation: string[];
  /** Step-by-step working, shown on request (a button, a show-card, or the word "working"). */
  working: string[];
  problems: ReplyProblem[];
  /** Notes on how something was read or done; not problems, not interpretation. */
  notes: string[];
  /** Every caution, in full with its source; every interpreting reply ends with the general one. */
  cautions: string[];
  /** Whether the reply may be posted for the whole channel (help and problems stay private). */
  shareable: boolean;
  /** A channel-wide change (units set, the log cleared): told to the whole channel, naming no one. */
  announce?: boolean;
  /** A destructive command that needs a confirmation first (forget). */
  confirm?: boolean;
  /** Whether the working should be shown inline (the user asked for it). */
  showWorking: boolean;
  /** Sodium courses to draw (trend, handover of one case); rendered only by a surface that shows pictures. */
  charts?: ChartRequest[];
  /** The machine-readable result, for the one-shot command's JSON and the shift log. */
  data?: { reading?: Reading; assessment?: Assessment; verdicts?: Verdict[]; trend?: CorrectionTrend };
}

/** One case's sodium course to draw: its tag (nothing else names it) and its trend. */
export interface ChartRequest {
  tag: string;
  trend: CorrectionTrend;
}

export function emptyReply(kind: ReplyKind, headline: string): Reply {
  return {
    kind,
    headline,
    why: [],
    visibleCautions: [],
    facts: [],
    interpretation: [],
    working: [],
    problems: [],
    notes: [],
    cautions: [],
    shareable: false,
    showWorking: false,
  };
}
