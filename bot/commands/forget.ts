/** forget: one case, or (confirmed) the channel's whole shift log. */
import { errorCode } from "../log.js";
import { emptyReply, type Reply } from "../reply.js";
import { tagIn, unavailable } from "../shift.js";
import type { Bot, Command, Context } from "./context.js";

export async function forget(ctx: Context, bot: Bot): Promise<Reply> {
  const { tag, problem } = tagIn(ctx.rest);
  if (problem) {
    const reply = emptyReply("forget", "Which case?");
    reply.problems.push({ code: "tag.refused", message: problem });
    return reply;
  }
  try {
    if (tag) {
      const n = await bot.store.forgetTag(ctx.channel, tag);
      const reply = emptyReply(
        "forget",
        `${tag} cleared: ${n} record${n === 1 ? "" : "s"} removed; the rest of the log is kept.`,
      );
      reply.shareable = true;
      return reply;
    }
    // The whole log goes only when confirmed: "forget all", or the button's confirm dialog.
    if (!/^\s*(all|everything|confirm|yes)\b/i.test(ctx.rest)) {
      const records = await bot.store.listRecords(ctx.channel, bot.clock());
      const cases = new Set(records.map((r) => r.tag)).size;
      const reply = emptyReply(
        "forget",
        `Clear this channel's whole shift log? ${records.length} record${records.length === 1 ? "" : "s"} of ${cases} case${cases === 1 ? "" : "s"}.`,
      );
      reply.why = [
        "Type forget all to clear it (the channel is told, without naming you), or forget bed 12 to remove one case.",
      ];
      reply.confirm = true;
      return reply;
    }
    const n = await bot.store.forget(ctx.channel);
    const reply = emptyReply(
      "forget",
      `This channel's shift log was cleared: ${n} record${n === 1 ? "" : "s"} removed.`,
    );
    reply.shareable = true;
    reply.announce = true;
    return reply;
  } catch (error) {
    bot.log("warn", "store.forget-failed", { code: errorCode(error) });
    return unavailable("log clearing");
  }
}

export const forgetCommand: Command = { words: ["forget"], run: forget };
