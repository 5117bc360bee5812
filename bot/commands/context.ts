/**
 * What every command shares: the request, its context and the small set of things a command may use
 * (the store, the configuration, the clock and the logger). A command never imports the
 * conversation: the conversation imports the table of commands (commands/index.ts).
 */
import type { UnitSystem } from "../../core/analytes.js";
import type { Config } from "../config.js";
import type { Logger } from "../log.js";
import type { Platform } from "../privacy.js";
import type { Reply } from "../reply.js";
import type { ChannelSettings, Store } from "../store.js";

export interface Request {
  text: string;
  /** The platform's channel (or conversation) ID; hashed before it reaches the store. */
  channel: string;
  platform: Platform;
  /** A button re-rendering an answer already given: it is answered, never logged again. */
  replay?: boolean;
  /** The start-up rehearsal (bot/warm.ts): answered on a throwaway store, never logged. */
  rehearsal?: boolean;
}

export type BotConfig = Pick<Config, "secret" | "shiftMs" | "osmolalityRange" | "defaultUnits"> & {
  /** The lab's anion-gap interval; the common modern one when absent. */
  anionGapRange?: Config["anionGapRange"];
  /** How long a case's sodium series lives; 48 h when absent. */
  seriesMs?: number;
  /** Messages per channel per minute; unlimited when absent. */
  rateLimitPerMinute?: number;
};

export interface Context {
  request: Request;
  /** HMAC of the channel. */
  channel: string;
  settings: ChannelSettings;
  unitSystem?: UnitSystem;
  /** The text after the command word. */
  rest: string;
  showWorking: boolean;
}

/** What a command may use. The clock is injected, so tests move time instead of sleeping. */
export interface Bot {
  readonly store: Store;
  readonly config: BotConfig;
  readonly clock: () => number;
  readonly log: Logger;
}

export type CommandHandler = (ctx: Context, bot: Bot) => Promise<Reply>;

export interface Command {
  /** The first words that call it; the first is its name. */
  words: readonly string[];
  run: CommandHandler;
}
