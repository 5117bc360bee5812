/** units: the channel's unit system for bare glucose, urea, alcohol and albumin values. */
import type { UnitSystem } from "../../core/analytes.js";
import { errorCode } from "../log.js";
import { emptyReply, type Reply } from "../reply.js";
import type { ChannelSettings } from "../store.js";
import type { Bot, Command, Context } from "./context.js";

export async function units(ctx: Context, bot: Bot): Promise<Reply> {
  const word = ctx.rest.toLowerCase().split(/\s+/)[0] ?? "";
  const choice: UnitSystem | "none" | undefined = ["si", "mmol", "mmol/l"].includes(word)
    ? "si"
    : ["conventional", "us", "mg", "mg/dl"].includes(word)
      ? "conventional"
      : ["none", "clear", "off"].includes(word)
        ? "none"
        : undefined;
  const describe = (u: UnitSystem | undefined) =>
    u === "si"
      ? "SI: a bare glucose, urea or alcohol is read in mmol/L, albumin in g/L"
      : u === "conventional"
        ? "conventional: a bare glucose or alcohol is read in mg/dL, albumin in g/dL (a bare urea is still asked about: BUN or urea?)"
        : "none: a bare glucose, urea, alcohol or albumin is asked about";
  if (!word || choice === undefined) {
    const reply = emptyReply(
      "settings",
      `This channel's units: ${describe(ctx.settings.unitSystem ?? bot.config.defaultUnits)}`,
    );
    reply.notes.push(
      "Set them with: units si, units conventional, or units none. Na, K, Cl, HCO3 (mmol/L), osmolality (mOsm/kg) and BUN (mg/dL) never need it.",
    );
    if (word && choice === undefined)
      reply.problems.push({ code: "units.unknown", message: "Units can be si, conventional or none." });
    return reply;
  }
  const next: ChannelSettings = { ...ctx.settings };
  if (choice === "none") delete next.unitSystem;
  else next.unitSystem = choice;
  try {
    await bot.store.setSettings(ctx.channel, next);
  } catch (error) {
    bot.log("warn", "store.settings-unsaved", { code: errorCode(error) });
    const reply = emptyReply("settings", "The units could not be saved just now");
    reply.problems.push({
      code: "store.unavailable",
      message:
        "The settings store is not answering; try again shortly. Calculations still work with units written out.",
    });
    return reply;
  }
  const reply = emptyReply(
    "settings",
    `Units for this channel set to ${describe(choice === "none" ? undefined : choice)}.`,
  );
  reply.shareable = true;
  // Everyone in the channel reads by this setting: the change is announced there.
  reply.announce = true;
  return reply;
}

export const unitsCommand: Command = { words: ["units", "unit"], run: units };
