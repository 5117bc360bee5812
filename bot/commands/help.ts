/** The help reply: what Solute does, its commands, short examples from an invented night. */
import { CAUTIONS } from "../../core/cautions.js";
import { emptyReply, type Reply } from "../reply.js";
import type { Command } from "./context.js";

export const HELP_LINES = [
  "Type lab values the way you write them; Solute answers with the calculated and effective osmolality, the osmolal gap, the corrected sodium and what they suggest, with every formula named.",
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310 — a calculation.",
  "bed 12 Na 121 K 3.4 glu 6.2 mmol/L urea 3.1 mmol/L osm 254 — the same, tagged to a bed for the shift's handover (a bed or bay code only, never a name or number from the record).",
  "Paste a panel from the results viewer as it is: ranges, flags and units in any order; urine and blood-gas values are read by specimen.",
  "… working — add the word working to see every step.",
  "check Na 131 glu 22 mmol/L urea 9 mmol/L calc osm 300 — checks a colleague's result and names the slip if it does not hold.",
  "check Na 131 glu 22 mmol/L urea 9 mmol/L 2*131 + 22 + 9 — checks the arithmetic itself.",
  "units si · units conventional · units none — how this channel's bare glucose, urea and alcohol values are read. Units written in the message always win.",
  "handover — this channel's shift summary by bed or bay: latest values, what was flagged, sodium trends.",
  "trend bed 12 — that case's sodium course, judged in 24 h windows from its first sodium, with a chart; or write the series: trend Na 118 at 22:00, 121 at 04:00. handover bed 12 — one case, with its chart.",
  "bed 12 new — a new episode for a reused bed. forget bed 12 — removes that case from the log.",
  "plan Na 118 70 kg woman adult 1 L 0.9% NaCl — what a litre (or 500 mL …) of a fluid is expected to do to the sodium (Adrogué–Madias), checked against correction limits; with a sodium above 145, the free water deficit.",
  "forget — clears this channel's whole shift log now (it clears itself).",
];

export function helpReply(extra: string[] = []): Reply {
  const reply = emptyReply(
    "help",
    "Solute: osmolality, osmolal gap, tonicity and corrected sodium from the labs you type",
  );
  reply.interpretation = [...HELP_LINES, ...extra];
  reply.notes = ["Never type a name, a record number or a date of birth: tag cases by bed or bay."];
  reply.cautions = [CAUTIONS.general];
  return reply;
}

export const helpCommand: Command = { words: ["help", "?", "hello", "hi"], run: async () => helpReply() };
