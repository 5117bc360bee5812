/**
 * The conversation, shared by every chat platform: a request (text, channel, platform) goes in,
 * a neutral reply comes out. Commands are the first word: help, units, check; anything else with
 * lab values is a calculation. Calculations never depend on the store: if it fails, they still
 * answer.
 */
import type { UnitSystem } from "../core/analytes.js";
import { type AssessOptions, assess } from "../core/assess.js";
import { fmt, num } from "../core/format.js";
import { type Reading, readMessage } from "../core/reader/index.js";
import { loadUnits } from "../core/units.js";
import { checkClaims, checkHeadline } from "./check.js";
import { computeReply } from "./compute.js";
import type { Config } from "./config.js";
import { evaluateExpression } from "./expression.js";
import { helpReply } from "./help.js";
import { errorCode, log } from "./log.js";
import { registerPlanCommand } from "./plan.js";
import { channelKey, type Platform } from "./privacy.js";
import { emptyReply, type Reply } from "./reply.js";
import { registerShiftCommands } from "./shift.js";
import type { ChannelSettings, Store } from "./store.js";
import { verdictOf } from "./summary.js";

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

export type CommandHandler = (ctx: Context, bot: Conversation) => Promise<Reply>;

/** Longest message read; anything longer is refused before reading. */
export const MAX_MESSAGE_LENGTH = 4000;

export class Conversation {
  private readonly commands = new Map<string, CommandHandler>();

  constructor(
    readonly store: Store,
    readonly config: BotConfig,
    readonly clock: () => number = Date.now,
  ) {
    this.command(["help", "?", "hello", "hi"], async () => helpReply());
    this.command(["units", "unit"], (ctx) => this.units(ctx));
    this.command(["check", "verify"], async (ctx) => this.check(ctx));
    registerShiftCommands(this);
    registerPlanCommand(this);
  }

  /** Whether a word is one of the conversation's command words (help, units, check, plan …). */
  isCommand(word: string): boolean {
    return this.commands.has(word.toLowerCase());
  }

  /** Registers a command under one or more first words. */
  command(words: string[], handler: CommandHandler): void {
    for (const w of words) this.commands.set(w, handler);
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
      log("warn", "rate-limited", { platform: request.platform });
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
      log("info", "reply", {
        platform: request.platform,
        code: reply.kind,
        ms: performance.now() - started,
        count: reply.problems.length,
      });
    return reply;
  }

  /** The default: read the values and compute everything that can be computed. */
  async calculate(ctx: Context): Promise<Reply> {
    const reading = readMessage(ctx.rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
    const assessment = assess(reading.inputs, assessOptions(reading, this.config, ctx.unitSystem));
    const reply = computeReply(reading, assessment, ctx.showWorking);
    if (!ctx.request.replay) for (const hook of this.afterCalculation) await hook(ctx, reply);
    return reply;
  }

  /** Called after every calculation (the shift log hooks in here). */
  readonly afterCalculation: ((ctx: Context, reply: Reply) => Promise<void>)[] = [];

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
      log("warn", "store.rate-unavailable", { code: errorCode(error) });
      return true;
    }
  }

  private async settingsFor(channel: string): Promise<ChannelSettings> {
    try {
      return await this.store.getSettings(channel);
    } catch (error) {
      log("warn", "store.settings-unavailable", { code: errorCode(error) });
      return {};
    }
  }

  private async units(ctx: Context): Promise<Reply> {
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
        `This channel's units: ${describe(ctx.settings.unitSystem ?? this.config.defaultUnits)}`,
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
      await this.store.setSettings(ctx.channel, next);
    } catch (error) {
      log("warn", "store.settings-unsaved", { code: errorCode(error) });
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

  private async check(ctx: Context): Promise<Reply> {
    // A colleague's own arithmetic: evaluate it in the sandbox and put its value where it stood.
    const notes: string[] = [];
    const problems: { code: string; message: string }[] = [];
    let text = ctx.rest;
    let arithmetic: { text: string; value: number; claimed: number } | undefined;
    const expression = findExpression(text);
    if (expression) {
      const evaluated = await evaluateExpression(expression.text);
      if (!evaluated.ok) {
        problems.push({ code: "expression.refused", message: evaluated.reason });
        text = `${text.slice(0, expression.start)} ${text.slice(expression.end)}`;
      } else {
        const claimed = expression.claimed;
        // The colleague's written total is what they claimed; their own arithmetic is checked too.
        if (claimed !== undefined && Math.abs(claimed - evaluated.value) > 0.5) {
          arithmetic = {
            text: evaluated.text.replace(/\*/g, "×").replace(/\//g, "÷"),
            value: evaluated.value,
            claimed,
          };
          notes.push(`Arithmetic: ${evaluated.text} is ${fmt(evaluated.value)}, not ${fmt(claimed)}.`);
        } else {
          notes.push(`Arithmetic: ${evaluated.text} = ${fmt(evaluated.value)}.`);
        }
        const before = text.slice(0, expression.start);
        const labelled =
          /(calc(ulated)?\s+osm\w*|gap|osmolal\s+gap|osm\s+gap|eff(ective)?\s+osm\w*|tonicity|corr(ected)?\s+(na|sodium)|anion\s+gap|ag|og)\s*$/i.test(
            before.trimEnd(),
          );
        const value = claimed ?? Number(evaluated.value.toFixed(6));
        text = `${before} ${labelled ? "" : "calc osm "}${value} ${text.slice(expression.end)}`;
      }
    }
    const reading = readMessage(text, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
    const assessment = assess(reading.inputs, assessOptions(reading, this.config, ctx.unitSystem));
    const base = computeReply(reading, assessment, ctx.showWorking);
    if (reading.claims.length === 0) {
      const reply = emptyReply("check", "Nothing to check");
      reply.problems.push(...problems, {
        code: "check.noClaim",
        message:
          "Add the result to check, like: check Na 128 glu 540 mg/dL urea 14 mmol/L calc osm 300 — or the arithmetic itself: check Na 128 glu 540 mg/dL urea 14 mmol/L 2*128 + 540/18 + 14",
      });
      reply.problems.push(...base.problems);
      return reply;
    }
    const verdicts = checkClaims(reading, assessment);
    if (arithmetic) {
      // The sum itself was added up wrong: say so on the claim it made, and whether the formula was right.
      const v = verdicts.find((x) => x.claimed === arithmetic!.claimed);
      if (v && v.status !== "cannotCheck" && v.ours !== undefined) {
        const formulaRight = Math.abs(arithmetic.value - v.ours) <= 1;
        v.status = "doesNotHold";
        v.holds = false;
        v.slip = `the sum is added up wrong: ${arithmetic.text} is ${fmt(arithmetic.value)}`;
        v.text = `The total ${num(arithmetic.claimed, 6)} is wrong: ${arithmetic.text} is ${fmt(arithmetic.value)}${formulaRight ? `, which matches Solute's ${fmt(v.ours)} — the formula was right, the adding up was not` : `; Solute gives ${fmt(v.ours)}`}.`;
      }
    }
    // Line 1 is the verdict on the claim; a danger in the values themselves leads line 2.
    const danger = assessment.findings.some((f) => f.severity === "danger")
      ? verdictOf(assessment.findings)
      : undefined;
    const keyNumbers = [danger, base.keyNumbers].filter(Boolean).join(" · ");
    return {
      ...base,
      kind: "check",
      headline: checkHeadline(verdicts, arithmetic),
      ...(keyNumbers && { keyNumbers }),
      why: verdicts.map((v) => v.text).slice(0, 2),
      interpretation: [...verdicts.map((v) => v.text), ...base.interpretation],
      problems: [...problems, ...base.problems],
      notes: [...notes, ...base.notes.filter((n) => !n.startsWith("As printed:"))],
      cautions: base.cautions.length > 0 ? base.cautions : assessment.cautions,
      ...(base.data && { data: { ...base.data, verdicts } }),
    };
  }
}

/**
 * How the engine reads this message: the channel's ranges, the glucose as written (each criterion
 * is compared in its own unit), and a lab range printed beside the measured osmolality, which then
 * takes the place of the configured one (the reading notes say so).
 */
export function assessOptions(
  reading: Reading,
  config: BotConfig,
  unitSystem?: "si" | "conventional",
): AssessOptions {
  const glucose = reading.values.find((v) => v.key === "glucose");
  const osm = reading.values.find((v) => v.key === "measuredOsmolality");
  const printed = osm?.labRange;
  let osmolalityRange = config.osmolalityRange;
  if (
    printed?.low !== undefined &&
    printed.high !== undefined &&
    printed.low >= 250 &&
    printed.high <= 330 &&
    printed.low < printed.high
  ) {
    osmolalityRange = { low: printed.low, high: printed.high };
    reading.notes.push(
      `Osmolality judged against the lab's printed range, ${printed.low}–${printed.high} mOsm/kg.`,
    );
  }
  return {
    osmolalityRange,
    ...(unitSystem && { unitSystem }),
    ...(config.anionGapRange && { anionGapRange: config.anionGapRange }),
    ...(glucose && { glucoseWritten: { value: glucose.written, unit: glucose.unit } }),
  };
}

/** The first run of arithmetic in a message: numbers joined by operators, with an optional "= N". */
export function findExpression(
  text: string,
): { text: string; start: number; end: number; claimed?: number } | undefined {
  const run = /[\d.,()+\-*/×÷−^\s]{3,400}/g;
  for (let m = run.exec(text); m; m = run.exec(text)) {
    // The expression starts at the first number (or bracket) that an operator follows; a lone
    // number before it belongs to a name ("urea 14 2*128 + …").
    const begin = /\(*\s*\d[\d.,]*\s*[+\-*/×÷−^]\s*[\d(]/.exec(m[0]);
    if (!begin) continue;
    const expr = m[0].slice(begin.index).trimEnd();
    const start = m.index + begin.index;
    let end = start + expr.length;
    let claimed: number | undefined;
    const after = /^\s*=\s*(\d{1,6}(?:[.,]\d{1,6})?)/.exec(text.slice(end));
    if (after) {
      claimed = Number(after[1]!.replace(",", "."));
      end += after[0].length;
    }
    return { text: expr.trim(), start, end, ...(claimed !== undefined && { claimed }) };
  }
  return undefined;
}
