/**
 * The table of commands, by first word. A message whose first word is none of these is a
 * calculation (commands/calculate.ts). Add a command as a file of its own here, exporting a
 * `Command`; it may use the shift log (bot/shift.ts) and core/, never the conversation.
 */
import { checkCommand } from "./check.js";
import type { Command } from "./context.js";
import { forgetCommand } from "./forget.js";
import { handoverCommand } from "./handover.js";
import { helpCommand } from "./help.js";
import { planCommand } from "./plan.js";
import { trendCommand } from "./trend.js";
import { unitsCommand } from "./units.js";

export const COMMANDS: readonly Command[] = [
  helpCommand,
  unitsCommand,
  checkCommand,
  handoverCommand,
  trendCommand,
  forgetCommand,
  planCommand,
];
