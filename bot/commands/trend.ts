/**
 * trend: one case's sodium course, judged by the correction model (core/correction.ts) — from the
 * shift log or from a series written in the message.
 */
import { CAUTIONS, SHORT_CAUTIONS } from "../../core/cautions.js";
import { type CorrectionTrend, correctionTrend } from "../../core/correction.js";
import { fmt, num } from "../../core/format.js";
import { checkTag } from "../../core/reader/index.js";
import { clockAt, readSeries } from "../../core/series.js";
import { emptyReply, type Reply } from "../reply.js";
import {
  ago,
  episodeOf,
  episodeTrend,
  load,
  logGap,
  TREND_CAUTION,
  TREND_SHORT,
  tagIn,
  trendHeadline,
  unavailable,
} from "../shift.js";
import type { Bot, Command, Context } from "./context.js";

const RISK_WORDS =
  /\bhigh[-\s]?risk\b|\balcohol(?:\s*use)?\b|\bmalnutrition\b|\bmalnourished\b|\bliver disease\b|\bcirrhosis\b|\bhypokal(?:a)?emia\b/i;

export async function trend(ctx: Context, bot: Bot): Promise<Reply> {
  const { tag, rest, problem } = tagIn(ctx.rest);
  const highRisk = RISK_WORDS.test(rest);
  const series = readSeries(rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  let t: CorrectionTrend | undefined;
  let source: string;
  let shownName: string | undefined;
  let logNote: string | undefined;
  if (series.timed || series.problems.length > 0) {
    // A series written in the message: answered exactly as a logged one.
    if (series.points.length < 2) {
      const reply = emptyReply("trend", "Trend: the series could not be read");
      reply.problems.push(...series.problems.map(({ code, message }) => ({ code, message })));
      if (series.problems.length === 0)
        reply.problems.push({
          code: "trend.tooFew",
          message:
            "Give at least two sodiums, each with its time, like: trend Na 118 at 22:00, 121 at 04:00.",
        });
      return reply;
    }
    const firstClock = series.firstClock;
    t = correctionTrend(series.points, {
      highRisk,
      ...(firstClock !== undefined && { clock: (h: number) => clockAt(firstClock, h) }),
    });
    source = "as written in the message";
  } else {
    let name = tag;
    let refused = problem;
    const word = rest.trim();
    if (!name && word && !/\s/.test(word)) {
      const checked = checkTag(word.replace(/^#/, ""));
      if (checked.ok) name = checked.tag;
      else refused = checked.reason;
    }
    if (!name) {
      const reply = emptyReply("trend", "Which case? Name its tag, or write the series");
      reply.problems.push({
        code: "trend.noTag",
        message: `Write the tag, like trend bed 12 — or the series itself: trend Na 118 at 22:00, 121 at 04:00, 126 at 09:30.${refused ? ` ${refused}` : ""}`,
      });
      return reply;
    }
    const records = await load(bot, ctx);
    if (!records) return unavailable("trend");
    const episode = episodeOf(records, name);
    t = episodeTrend(episode, bot.clock(), highRisk);
    const gone = t ? await logGap(bot, ctx, bot.clock() - bot.config.shiftMs) : undefined;
    if (gone) logNote = gone;
    source =
      episode.startedAt !== undefined
        ? `logged for ${name}, episode began ${ago(bot.clock() - episode.startedAt)}`
        : `logged for ${name}`;
    if (!t) {
      const reply = emptyReply("trend", `Trend for ${name}: fewer than two sodiums logged in this episode`);
      reply.notes.push(
        `Log sodiums with the tag, like: ${name} Na 121 — or write the series: trend Na 118 at 22:00, 121 at 04:00.`,
      );
      return reply;
    }
    shownName = name;
  }
  const name = tag ?? shownName ?? "this series";
  const reply = emptyReply("trend", trendHeadline(name, t!));
  for (const p of t!.points) {
    const corrected = p.corrected
      ? ` · corrected ${fmt(p.corrected.katz)} (Katz), ${fmt(p.corrected.hillier)} (Hillier)`
      : "";
    reply.facts.push({ label: `hour ${num(p.hours, 1)}`, value: `Na ${num(p.sodium)} mmol/L${corrected}` });
  }
  reply.interpretation.push(...t!.findings.map((f) => f.text));
  if (t!.highRisk && t!.direction === "raising")
    reply.notes.push("High risk of osmotic demyelination: the 8 mmol/L limit applies in every 24 h.");
  reply.notes.push(`Series ${source}; windows count from the first sodium (hour 0).`);
  if (logNote) reply.problems.push({ code: "store.logReset", message: logNote });
  reply.cautions = [TREND_CAUTION, CAUTIONS.general];
  reply.visibleCautions = [TREND_SHORT, SHORT_CAUTIONS.general];
  reply.why = t!.findings.slice(0, 3).map((f) =>
    f.text
      .split(/(?<=\.)\s+(?=[A-Z])/)
      .slice(0, 2)
      .join(" "),
  );
  reply.shareable = true;
  reply.data = { trend: t! };
  reply.charts = [{ tag: name, trend: t! }];
  return reply;
}

export const trendCommand: Command = { words: ["trend"], run: trend };
