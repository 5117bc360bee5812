/**
 * The default when no command word leads: read the values, compute everything that can be computed,
 * and log a tagged calculation for the handover (never a replayed one).
 */
import { assess } from "../../core/assess.js";
import { readMessage } from "../../core/reader/index.js";
import { assessOptions, computeReply } from "../compute.js";
import type { Reply } from "../reply.js";
import { logCalculation } from "../shift.js";
import type { Bot, Context } from "./context.js";

export async function calculate(ctx: Context, bot: Bot): Promise<Reply> {
  const reading = readMessage(ctx.rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  const assessment = assess(reading.inputs, assessOptions(reading, bot.config, ctx.unitSystem));
  const reply = computeReply(reading, assessment, ctx.showWorking);
  if (!ctx.request.replay) await logCalculation(ctx, reply, bot);
  return reply;
}
