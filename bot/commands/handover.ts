/** handover: this channel's shift summary by case tag, or one case with the chart of its course. */
import { CAUTIONS } from "../../core/cautions.js";
import { fmt, num } from "../../core/format.js";
import { emptyReply, type Reply } from "../reply.js";
import {
  ago,
  episodeOf,
  episodeTrend,
  HANDOVER_FLAGS,
  load,
  logGap,
  TREND_CAUTION,
  tagIn,
  unavailable,
} from "../shift.js";
import type { Bot, Command, Context } from "./context.js";

const HOUR = 3_600_000;

export async function handover(ctx: Context, bot: Bot): Promise<Reply> {
  // "handover bed 12": that case only, with the chart of its sodium course.
  const { tag: only, problem } = tagIn(ctx.rest);
  if (problem) {
    const reply = emptyReply("handover", "Which case?");
    reply.problems.push({ code: "tag.refused", message: problem });
    return reply;
  }
  const records = await load(bot, ctx);
  if (!records) return unavailable("handover");
  const now = bot.clock();
  const shiftFrom = now - bot.config.shiftMs;
  const tags = [...new Set(records.filter((r) => r.at >= shiftFrom).map((r) => r.tag))]
    .filter((t) => only === undefined || t === only)
    .sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
  const hours = Math.round(bot.config.shiftMs / HOUR);
  if (tags.length === 0 && only !== undefined) {
    const reply = emptyReply("handover", `Handover: nothing logged for ${only} in the last ${hours} h`);
    reply.shareable = true;
    return reply;
  }
  const calculations = records.filter((r) => r.at >= shiftFrom && Object.keys(r.inputs).length > 0).length;
  if (tags.length === 0) {
    const reply = emptyReply("handover", `Handover: nothing logged in this channel in the last ${hours} h`);
    reply.notes.push(
      "Calculations are logged when the message carries a bed or bay tag, like: bed 12 Na 121 glu 6.2 mmol/L urea 3.1 mmol/L osm 254.",
    );
    reply.shareable = true;
    return reply;
  }
  const reply = emptyReply(
    "handover",
    `Handover: ${tags.length} case${tags.length === 1 ? "" : "s"}, ${calculations} calculation${calculations === 1 ? "" : "s"} in the last ${hours} h`,
  );
  const dangers: string[] = [];
  for (const tag of tags) {
    const episode = episodeOf(records, tag);
    const list = episode.records.filter((r) => Object.keys(r.inputs).length > 0);
    const last = list.at(-1);
    if (!last) continue;
    const parts: string[] = [];
    const i = last.inputs;
    const r = last.results;
    if (i.sodium !== undefined) parts.push(`Na ${num(i.sodium)}`);
    if (r.calculatedOsmolality !== undefined) parts.push(`calculated osm ${fmt(r.calculatedOsmolality)}`);
    if (r.effectiveOsmolality !== undefined) parts.push(`effective ${fmt(r.effectiveOsmolality)}`);
    if (r.osmolalGap !== undefined) parts.push(`gap ${fmt(r.osmolalGap)}`);
    if (r.correctedSodiumKatz !== undefined)
      parts.push(
        `corrected Na ${fmt(r.correctedSodiumKatz)} (Katz), ${fmt(r.correctedSodiumHillier ?? r.correctedSodiumKatz)} (Hillier)`,
      );
    const began = episode.startedAt !== undefined ? `, episode began ${ago(now - episode.startedAt)}` : "";
    reply.facts.push({
      label: `${tag} (${list.length}, latest ${ago(now - last.at)}${began})`,
      value: parts.join(" · ") || "no results",
    });
    const flags = [...new Set(list.flatMap((x) => x.flags))].map((f) => HANDOVER_FLAGS[f]).filter(Boolean);
    if (flags.length > 0) reply.interpretation.push(`${tag}: ${flags.join("; ")}.`);
    const trend = episodeTrend(episode, now);
    if (trend && only !== undefined) reply.charts = [{ tag, trend }];
    if (trend) {
      const series = trend.points.map((p) => num(p.sodium)).join(" → ");
      const verdict = trend.findings[0];
      reply.interpretation.push(`${tag}: Na ${series}. ${verdict ? verdict.text : ""}`.trim());
      if (verdict && verdict.severity === "danger")
        dangers.push(
          `${tag}: ${verdict.code === "correction.tooFast" ? "correction too fast" : "sodium worsening"}`,
        );
    }
  }
  if (dangers.length > 0) reply.headline = `Handover — ${dangers.join("; ")}. ${reply.headline}`;
  const gone = await logGap(bot, ctx, shiftFrom);
  if (gone) reply.problems.push({ code: "store.logReset", message: gone });
  reply.notes.push(
    "forget bed 12 clears one case; forget clears this channel's log. Records clear themselves.",
  );
  reply.cautions = [TREND_CAUTION, CAUTIONS.general];
  reply.shareable = true;
  return reply;
}

export const handoverCommand: Command = { words: ["handover", "handoff"], run: handover };
