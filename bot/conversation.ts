/**
 * The conversation, shared by every chat platform: a request (text, channel, platform) goes in,
 * a neutral reply comes out. The first word picks a command from commands/index.ts; anything else
 * with lab values is a calculation (commands/calculate.ts). Calculations never depend on the store:
 * if it fails, they still answer.
 */
import { loadUnits } from "../core/units.js";
import { calculate } from "./commands/calculate.js";
import type { Bot, BotConfig, CommandHandler, Context, Request } from "./commands/context.js";
import { COMMANDS } from "./commands/index.js";
import { errorCode, type Logger, log as processLog } from "./log.js";
import { channelKey } from "./privacy.js";
import { emptyReply, type Reply } from "./reply.js";
import type { ChannelSettings, Store } from "./store.js";

export type { BotConfig, Context, Request } from "./commands/context.js";

/** Longest message read; anything longer is refused before reading. */
export const MAX_MESSAGE_LENGTH = 4000;

export class Conversation implements Bot {
  private readonly commands = new Map<string, CommandHandler>();

  constructor(
    readonly store: Store,
    readonly config: BotConfig,
    readonly clock: () => number = Date.now,
    /** Where log lines go; the process-wide structured log (bot/log.ts) unless a test passes one. */
    readonly log: Logger = processLog,
  ) {
    for (const c of COMMANDS) for (const w of c.words) this.commands.set(w, c.run);
  }

  /** Whether a word is one of the conversation's command words (help, units, check, plan …). */
  isCommand(word: string): boolean {
    return this.commands.has(word.toLowerCase());
  }

  async handle(request: Request): Promise<Reply> {
    const started = performance.now();
    await loadUnits();
    const text = request.text.trim();
    if (text.length > MAX_MESSAGE_LENGTH) {
      const reply = emptyReply("nothing", "That message is too long");
      reply.problems.push({
        code: "input.tooLong",
        message: `Send at most ${MAX_MESSAGE_LENGTH} characters: just the lab values.`,
      });
      return reply;
    }
    const channel = this.keyOf(request);
    if (!(await this.withinRate(channel))) {
      const reply = emptyReply("nothing", "Too many messages in this channel just now");
      reply.problems.push({
        code: "rate.limited",
        message: "Solute is answering too many messages from this channel; try again in a minute.",
      });
      this.log("warn", "rate-limited", { platform: request.platform });
      return reply;
    }
    const settings = await this.settingsFor(channel);
    const working = /(^|\s)(working|--working|show working|more)(\s|$)/i;
    const showWorking = working.test(text);
    const cleaned = text.replace(/(^|\s)(show working|--working|working|more)(?=\s|$)/gi, " ").trim();
    const first = cleaned.split(/\s+/)[0] ?? "";
    // An empty message (a bare /solute) is a request for help.
    const handler = cleaned === "" ? this.commands.get("help") : this.commands.get(first.toLowerCase());
    const ctx: Context = {
      request,
      channel,
      settings,
      rest: handler ? cleaned.slice(first.length).trim() : cleaned,
      showWorking,
      ...((settings.unitSystem ?? this.config.defaultUnits) && {
        unitSystem: settings.unitSystem ?? this.config.defaultUnits,
      }),
    };
    const reply = handler ? await handler(ctx, this) : await this.calculate(ctx);
    // "working" (or "more") in the message shows everything, whatever the command.
    if (showWorking) reply.showWorking = true;
    if (!request.rehearsal)
      this.log("info", "reply", {
        platform: request.platform,
        code: reply.kind,
        ms: performance.now() - started,
        count: reply.problems.length,
      });
    return reply;
  }

  /** The default: read the values and compute everything that can be computed. */
  calculate(ctx: Context): Promise<Reply> {
    return calculate(ctx, this);
  }

  /** Channel keys, remembered (in this process only) so each message costs no HMAC. */
  private readonly keys = new Map<string, string>();
  private keyOf(request: Request): string {
    const id = `${request.platform}\u0000${request.channel}`;
    let key = this.keys.get(id);
    if (key === undefined) {
      if (this.keys.size >= 10_000) this.keys.clear();
      key = channelKey(this.config.secret, request.platform, request.channel);
      this.keys.set(id, key);
    }
    return key;
  }

  /** Per-channel rate limit through the store, so every replica counts together; open if it fails. */
  private async withinRate(channel: string): Promise<boolean> {
    const limit = this.config.rateLimitPerMinute;
    if (!limit) return true;
    try {
      return await this.store.hit(channel, limit, 60_000);
    } catch (error) {
      this.log("warn", "store.rate-unavailable", { code: errorCode(error) });
      return true;
    }
  }

  private async settingsFor(channel: string): Promise<ChannelSettings> {
    try {
      return await this.store.getSettings(channel);
    } catch (error) {
      this.log("warn", "store.settings-unavailable", { code: errorCode(error) });
      return {};
    }
  }
}
