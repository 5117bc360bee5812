/**
 * Solute on Slack, with @slack/bolt. The receiver handles transport only; the listeners turn
 * events into requests for the conversation and render its replies in Block Kit.
 *
 * - Slash command: answered privately, in the acknowledgement when the answer is ready within
 *   1.5 s (it nearly always is), else acknowledged first and answered through response_url; with
 *   a "Post to channel" button when the answer may be shared. Help and problems stay private.
 * - Mention: answered in the thread of the message. Direct message: answered in the DM.
 * - Retried deliveries are de-duplicated through the store, so one reply across replicas.
 * - HTTP: signatures checked by Bolt; timestamps more than 5 minutes away in either direction are
 *   refused here (Bolt refuses only old ones). Socket Mode: no inbound endpoint needed.
 */
import { createHmac, randomBytes } from "node:crypto";
import type { IncomingMessage, ServerResponse } from "node:http";
import { App, HTTPReceiver, LogLevel, SocketModeReceiver } from "@slack/bolt";
import type { SlackConfig } from "../../bot/config.js";
import type { Conversation } from "../../bot/conversation.js";
import { track } from "../../bot/inflight.js";
import { errorCode, log } from "../../bot/log.js";
import { channelKey, openReply, sealReply } from "../../bot/privacy.js";
import type { Reply } from "../../bot/reply.js";
import { cleanText, slashText } from "./events.js";
import { ACTIONS, homeBlocks, render, viewOf, welcomeText } from "./render.js";

/** Slack's own limit on request age, applied in both directions. */
export const MAX_CLOCK_SKEW_S = 300;
/** Largest request body accepted (Slack's payloads are a few kilobytes); larger gets 413. */
export const MAX_BODY_BYTES = 256 * 1024;
/** How long a slash command waits for its answer before acknowledging without it. */
export const ACK_WITH_ANSWER_MS = 1500;
function delay(ms: number): { promise: Promise<undefined>; cancel(): void } {
  let handle: NodeJS.Timeout | undefined;
  const promise = new Promise<undefined>((resolve) => {
    handle = setTimeout(() => resolve(undefined), ms);
  });
  return { promise, cancel: () => clearTimeout(handle) };
}
/** How long a reply is kept for its buttons (More, Post to channel). */
export const REPLY_MS = 24 * 60 * 60 * 1000;
/** The message shortcut's callback ID (both manifests). */
export const SHORTCUT = "solute_check";
const EXPIRED =
  "That answer has expired (answers are kept for 24 h, without the message they answered): send the message again.";
const QUIET_HINT =
  "Solute reads lab values: mention me with them, like @Solute Na 128 glu 540 mg/dL urea 14 mmol/L osm 310 — or type /solute help.";
/** How long a signed request is remembered, to answer a replay once: Slack's 5 minutes and a margin. */
const REPLAY_MS = 6 * 60 * 1000;
/** How long an event ID is remembered for de-duplication. */
const DEDUP_MS = 60 * 60 * 1000;

export interface SlackAdapter {
  /** The HTTP handler for /slack/events (HTTP mode only). */
  handler?: (req: IncomingMessage, res: ServerResponse) => void;
  /** Authenticates (and, in Socket Mode, connects), retrying with backoff; never throws. */
  start(): Promise<void>;
  stop(): Promise<void>;
  /** Whether Slack is usable now, and the error code of the last failed attempt if not. */
  status(): { ready: boolean; code?: string };
}

/** Backoff between authentication attempts: 1 s doubling to at most a minute. */
export const AUTH_BACKOFF_MS = { first: 1000, max: 60_000 } as const;

/** Bolt's own logs can carry payloads; keep only its warnings and errors, as codes. */
const quietLogger = {
  debug() {},
  info() {},
  warn(...args: unknown[]) {
    log("warn", "slack.sdk", { platform: "slack", code: errorCode(args[0]) });
  },
  error(...args: unknown[]) {
    log("error", "slack.sdk", { platform: "slack", code: errorCode(args[0]) });
  },
  setLevel() {},
  getLevel: () => LogLevel.WARN,
  setName() {},
};

/** Waits between tries of a rate-limited call without Retry-After: 500 ms doubling, 4 tries at most. */
export const RATE_BACKOFF_MS = 500;

/**
 * Runs one Web API call, waiting out a 429 for this call only: Retry-After when Slack gives it
 * (at most 30 s), else a bounded backoff. Other channels' replies are not held.
 */
export async function withBackoff<T>(call: () => Promise<T>, firstWaitMs = RATE_BACKOFF_MS): Promise<T> {
  let wait = firstWaitMs;
  for (let attempt = 0; ; attempt++) {
    try {
      return await call();
    } catch (error) {
      const { code, retryAfter, message } = error as { code?: string; retryAfter?: number; message?: string };
      // The client names a 429 with Retry-After by its code; one without the header only by this
      // message (the SDK gives no code for it).
      const limited =
        code === "slack_webapi_rate_limited_error" ||
        /^Retry header did not contain a valid timeout/.test(message ?? "");
      if (!limited || attempt >= 3) throw error;
      const ms = Number.isFinite(retryAfter) && retryAfter! > 0 ? Math.min(retryAfter! * 1000, 30_000) : wait;
      log("warn", "slack.rate-limited", { platform: "slack", ms });
      await new Promise((r) => setTimeout(r, ms));
      wait *= 2;
    }
  }
}

/** Reads a body up to `limit` bytes; undefined when it is larger. */
function readBody(req: IncomingMessage, limit: number): Promise<Buffer | undefined> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        req.removeAllListeners("data");
        req.resume();
        resolve(undefined);
      } else chunks.push(chunk);
    });
    req.on("end", () => resolve(Buffer.concat(chunks)));
    req.on("error", reject);
  });
}

/**
 * Whether a body has the shape Slack sends: a JSON event envelope (an object with a string
 * `type`), a form whose `payload` is such an object (buttons, shortcuts), a slash command form
 * (`command`), or Slack's certificate check (`ssl_check`). Anything else never reaches Bolt,
 * which otherwise answers some of them with 500 (and Slack would retry).
 */
export function plausibleBody(raw: Buffer, contentType: string): boolean {
  const text = raw.toString("utf8");
  const isEnvelope = (s: string) => {
    try {
      const v = JSON.parse(s) as unknown;
      return plausiblePayload(v) && typeof (v as { type?: unknown }).type === "string";
    } catch {
      return false;
    }
  };
  if (contentType.includes("json")) return isEnvelope(text);
  const form = new URLSearchParams(text);
  const payload = form.get("payload");
  if (payload !== null) return isEnvelope(payload);
  return form.get("command") !== null || form.get("ssl_check") !== null;
}

/**
 * Whether a payload Bolt is about to process is what Slack sends: an object with a `type` (an
 * event envelope, an interaction) or a `command` (a slash command). Socket Mode hands Bolt
 * whatever an envelope carries, and Bolt throws on null, an array or a number.
 */
export function plausiblePayload(body: unknown): boolean {
  if (!isObject(body)) return false;
  const { type, command, event } = body as { type?: unknown; command?: unknown; event?: unknown };
  // An event envelope carries its event, which Bolt and the socket client read the type of.
  if (type === "event_callback")
    return isObject(event) && typeof (event as { type?: unknown }).type === "string";
  return typeof type === "string" || typeof command === "string";
}

const isObject = (v: unknown): v is object => typeof v === "object" && v !== null && !Array.isArray(v);

/**
 * In Socket Mode, a frame's payload reaches the socket client before Bolt, and the client itself
 * throws on an events_api frame without an event. Frames whose payload is not one Slack sends are
 * acknowledged (Slack then does not send them again) and dropped before the client reads them.
 */
function guardSocketFrames(client: SocketModeReceiver["client"]): void {
  const own = client.listeners("ws_message") as ((data: unknown, isBinary: boolean) => unknown)[];
  client.removeAllListeners("ws_message");
  // send() is the client's own acknowledgement (private in its types; @slack/socket-mode 3.x).
  const ack = (id: string) => (client as unknown as { send(id: string): Promise<void> }).send(id);
  client.on("ws_message", (data: unknown, isBinary: boolean) => {
    const refused = refusedFrame(data, isBinary);
    if (refused === undefined) {
      for (const listener of own) listener(data, isBinary);
      return;
    }
    log("warn", "slack.refused", { platform: "slack", code: "malformed" });
    if (refused)
      ack(refused).catch((error) =>
        log("warn", "slack.ack-failed", { platform: "slack", code: errorCode(error) }),
      );
  });
}

/** The envelope ID of a frame to refuse ("" when it has none), or undefined for a frame to pass on. */
function refusedFrame(data: unknown, isBinary: boolean): string | undefined {
  if (isBinary) return undefined;
  let frame: unknown;
  try {
    frame = JSON.parse(typeof data === "string" ? data : new TextDecoder().decode(data as Uint8Array));
  } catch {
    return undefined; // the client ignores what is not JSON
  }
  if (!isObject(frame)) return "";
  const {
    type,
    envelope_id: id,
    payload,
  } = frame as { type?: unknown; envelope_id?: unknown; payload?: unknown };
  if (type === "hello" || type === "disconnect") return undefined;
  if (typeof id !== "string") return "";
  if (
    type === "events_api"
      ? plausiblePayload(payload) && isObject((payload as { event?: unknown }).event)
      : plausiblePayload(payload)
  )
    return undefined;
  return id;
}

/** Slack's limit on an image's alt text (files.getUploadURLExternal, alt_txt). */
const MAX_ALT = 1000;
const UPLOAD_TIMEOUT_MS = 10_000;

/** Said in the thread when the app may not upload files. */
export const CHARTS_NEED_SCOPE =
  "The chart of this course could not be added: the Solute app needs the files:write scope. An admin can add it in the app's settings (OAuth & Permissions) and reinstall the app.";

const CHART_NOTE = "Post this answer to the channel, or mention @Solute, to get the chart of the course.";

/** A private (slash command) answer cannot carry a file: it says how to get the chart. */
function withChartNote(reply: Reply): Reply {
  if (!reply.charts?.length) return reply;
  // In the first view when there is room beside the why lines; never in place of one.
  return reply.why.length < 3
    ? { ...reply, why: [...reply.why, CHART_NOTE] }
    : { ...reply, notes: [...reply.notes, CHART_NOTE] };
}

export interface SlackOptions {
  config: SlackConfig;
  bot: Conversation;
  /** For tests: skip auth.test and give the bot's user ID. */
  botUserId?: string;
  /** For tests: the first wait between authentication attempts (1 s otherwise). */
  backoffMs?: number;
  clock?: () => number;
}

export function createSlackAdapter({
  config,
  bot,
  botUserId,
  clock = Date.now,
  backoffMs = AUTH_BACKOFF_MS.first,
}: SlackOptions): SlackAdapter {
  const clientOptions = {
    ...(config.apiUrl && { slackApiUrl: config.apiUrl.endsWith("/") ? config.apiUrl : `${config.apiUrl}/` }),
    retryConfig: { retries: 2, factor: 2, minTimeout: 200, maxTimeout: 2000 },
    // A 429 is the caller's to wait for (withBackoff): the client then never pauses every
    // channel's replies for one channel's Retry-After.
    rejectRateLimitedCalls: true,
  };
  const socket = config.appToken !== undefined;
  const receiver = socket
    ? new SocketModeReceiver({
        appToken: config.appToken!,
        logger: quietLogger,
        installerOptions: { clientOptions },
      })
    : new HTTPReceiver({
        signingSecret: config.signingSecret!,
        endpoints: "/slack/events",
        logger: quietLogger,
        unhandledRequestTimeoutMillis: 2500,
        bodyLimit: MAX_BODY_BYTES,
        // Answers that are not acknowledged in time still get a 200, within Slack's 3 seconds.
        processBeforeResponse: false,
        // Solute's listeners catch their own failures, so what reaches here is Bolt failing on a
        // body it could not make sense of (an envelope with fields of the wrong shape): that is
        // the sender's fault, 400, which Slack does not retry; Bolt's own default is 500.
        processEventErrorHandler: async ({ error, response }) => {
          if (response.headersSent) return false;
          const unauthorised = (error as { code?: unknown }).code === "slack_bolt_authorization_error";
          const status = unauthorised ? 401 : 400;
          log("warn", "slack.refused", {
            platform: "slack",
            code: unauthorised ? "unauthorised" : "unprocessable",
            status,
          });
          response.writeHead(status).end();
          return true;
        },
      });
  // Initialised by start(), not in the constructor: a failing auth.test (Slack unreachable, a
  // revoked token, 5xx, 429) is retried with backoff instead of ending the process.
  const app = new App({
    token: config.botToken,
    receiver,
    logger: quietLogger,
    clientOptions,
    deferInitialization: true,
    ...(botUserId && { botUserId, botId: "B0SOLUTE", tokenVerificationEnabled: false }),
  });
  // Every receiver hands its events to processEvent: a payload that is not one Slack sends is
  // refused here, before Bolt. Over the socket it is acknowledged, so Slack does not send it
  // again (Socket Mode's answer to a 400); over HTTP plausibleBody has refused it already.
  const processEvent = app.processEvent.bind(app);
  app.processEvent = async (event) => {
    // Tracked from here, before Bolt acknowledges the event: once Slack has its acknowledgement,
    // the work is already counted, so shutdown (and a test) can wait for every reply to be posted.
    if (plausiblePayload(event.body)) return track(() => processEvent(event));
    log("warn", "slack.refused", { platform: "slack", code: "malformed", ...(!socket && { status: 400 }) });
    await event.ack();
  };
  if (socket) guardSocketFrames((receiver as SocketModeReceiver).client);
  let ready = false;
  let stopped = false;
  let lastCode: string | undefined;
  let retry: NodeJS.Timeout | undefined;
  const attempt = async (): Promise<void> => {
    try {
      await app.init();
      if (socket) await app.start();
      ready = true;
      lastCode = undefined;
      log("info", socket ? "slack.socket-mode.connected" : "slack.authenticated", { platform: "slack" });
    } catch (error) {
      lastCode = (error as { data?: { error?: string } }).data?.error ?? errorCode(error);
      log("warn", "slack.start-failed", { platform: "slack", code: lastCode });
      throw error;
    }
  };
  const keepTrying = (wait: number) => {
    if (stopped) return;
    retry = setTimeout(() => {
      attempt().catch(() => keepTrying(Math.min(wait * 2, AUTH_BACKOFF_MS.max)));
    }, wait);
    retry.unref();
  };
  const start = async () => {
    // The first attempt is awaited (a working start is ready at once); later ones run behind.
    await attempt().catch(() => keepTrying(backoffMs));
  };
  const status = () => ({ ready, ...(lastCode && { code: lastCode }) });
  const secretFor = (id: string) => channelKey(bot.config.secret, "slack", `event:${id}`);

  // Retried deliveries (X-Slack-Retry-Num, Socket Mode retry_attempt) carry the same event ID.
  app.use(async ({ body, next }) => {
    const eventId = (body as { event_id?: unknown }).event_id;
    if (typeof eventId === "string") {
      let first = true;
      try {
        first = await bot.store.firstSeen(`slack:event:${secretFor(eventId)}`, DEDUP_MS);
      } catch (error) {
        // Without the store we cannot tell a retry from a first delivery; answering twice is
        // better than not answering.
        log("warn", "slack.dedup-unavailable", { platform: "slack", code: errorCode(error) });
      }
      if (!first) {
        log("info", "slack.retry-dropped", { platform: "slack" });
        return;
      }
    }
    await next();
  });

  const answer = (text: string, channel: string, replay = false): Promise<Reply> =>
    bot.handle({ text, channel, platform: "slack", ...(replay && { replay }) });

  // Buttons carry the id of the reply Solute already computed (kept REPLY_MS, never the message
  // text): a click re-renders it and logs nothing.
  const keep = async (reply: Reply): Promise<string | undefined> => {
    const id = `r1.${randomBytes(12).toString("base64url")}`;
    try {
      await bot.store.saveReply(id, sealReply(bot.config.secret, JSON.stringify(viewOf(reply))), REPLY_MS);
      return id;
    } catch (error) {
      log("warn", "slack.reply-unsaved", { platform: "slack", code: errorCode(error) });
      return undefined;
    }
  };
  const recall = async (value: string | undefined): Promise<Reply | undefined> => {
    if (!value?.startsWith("r1.")) return undefined;
    try {
      const sealed = await bot.store.loadReply(value);
      const raw = sealed && openReply(bot.config.secret, sealed);
      return raw ? (JSON.parse(raw) as Reply) : undefined;
    } catch (error) {
      log("warn", "slack.reply-unavailable", { platform: "slack", code: errorCode(error) });
      return undefined;
    }
  };
  /** A reply in Block Kit; every reply but the help is kept so its buttons can re-render it. */
  const message = async (reply: Reply, options: { offerPost?: boolean; working?: boolean } = {}) => {
    const source = reply.kind === "help" ? undefined : await keep(reply);
    return render(reply, { ...options, ...(source && { source }) });
  };

  app.command(config.command, async ({ command, ack, respond }) => {
    // The answer usually takes well under a millisecond: then it goes back in the acknowledgement
    // itself, saving a round trip. If it is not ready in time (a slow store), the command is
    // acknowledged first and answered through response_url — always inside Slack's 3 seconds.
    const text = slashText(command.text);
    const answering = answer(text, command.channel_id ?? "")
      .then(withChartNote)
      .then(async (reply) => ({
        // A channel-wide change (units, a cleared log) is announced to the channel, naming no one.
        response_type: reply.announce ? ("in_channel" as const) : ("ephemeral" as const),
        ...(await message(reply, { offerPost: !reply.announce })),
      }));
    const timer = delay(ACK_WITH_ANSWER_MS);
    const quick = await Promise.race([answering, timer.promise]);
    timer.cancel();
    if (quick) {
      await ack(quick);
      return;
    }
    await ack();
    await respond(await answering);
  });

  /** A reply that could not be posted: the person who asked gets a private note saying so. */
  const cannotPost = async (
    client: ActionClient,
    channel: string,
    user: string | undefined,
    error: unknown,
    threadTs?: string,
  ) => {
    const code = (error as { data?: { error?: string } }).data?.error ?? errorCode(error);
    log("warn", "slack.post-failed", { platform: "slack", code });
    if (!user) return;
    const why =
      code === "not_in_channel" || code === "channel_not_found"
        ? "I am not in this channel: invite me with /invite @Solute, or use the slash command, whose answer comes privately."
        : "Slack did not take my answer just now: please send it again in a moment.";
    try {
      await withBackoff(async () =>
        client.chat.postEphemeral({
          channel,
          user,
          text: `Solute could not post its answer. ${why}`,
          ...(threadTs && { thread_ts: threadTs }),
        }),
      );
    } catch (second) {
      log("warn", "slack.note-failed", { platform: "slack", code: errorCode(second) });
    }
  };

  /**
   * A reply's charts go into its thread as PNGs (files.uploadV2, which needs files:write). Without
   * that scope the text reply has been posted already; one line says how to turn charts on.
   */
  const uploadCharts = async (
    client: ActionClient,
    reply: Reply,
    channel: string,
    thread: string | undefined,
  ) => {
    if (!reply.charts?.length) return;
    const { drawChart } = await import("../../bot/charts.js");
    for (const request of reply.charts) {
      const chart = await drawChart(request);
      try {
        // Slack's upload flow step by step rather than filesUploadV2, which sends the alt text
        // as alt_text where files.getUploadURLExternal reads alt_txt (at most 1,000 characters).
        const alt = chart.alt.length <= MAX_ALT ? chart.alt : `${chart.alt.slice(0, MAX_ALT - 1)}…`;
        const target = await withBackoff(async () =>
          client.files.getUploadURLExternal({
            filename: chart.name,
            length: chart.png.length,
            ...({ alt_txt: alt } as object),
          }),
        );
        if (!target.upload_url || !target.file_id) throw new Error("no upload URL");
        const sent = await fetch(target.upload_url, {
          method: "POST",
          headers: { "content-type": "image/png" },
          body: chart.png,
          signal: AbortSignal.timeout(UPLOAD_TIMEOUT_MS),
        });
        if (!sent.ok) throw Object.assign(new Error("upload refused"), { code: `upload_${sent.status}` });
        const files: [{ id: string; title: string }] = [
          { id: target.file_id, title: `Sodium course, ${request.tag}` },
        ];
        await withBackoff(async () =>
          thread
            ? client.files.completeUploadExternal({ files, channel_id: channel, thread_ts: thread })
            : client.files.completeUploadExternal({ files, channel_id: channel }),
        );
      } catch (error) {
        const code = (error as { data?: { error?: string } }).data?.error ?? errorCode(error);
        log("warn", "slack.chart-failed", { platform: "slack", code });
        if (code === "missing_scope" || code === "not_allowed_token_type" || code === "no_permission")
          try {
            await withBackoff(async () =>
              client.chat.postMessage({
                channel,
                ...(thread && { thread_ts: thread }),
                text: CHARTS_NEED_SCOPE,
              }),
            );
          } catch (second) {
            log("warn", "slack.note-failed", { platform: "slack", code: errorCode(second) });
          }
        return;
      }
    }
  };

  app.event("app_mention", async ({ event, client }) => {
    if (!event.channel) return;
    const text = cleanText(event.text ?? "");
    const reply = await answer(text, event.channel);
    const thread = event.thread_ts ?? event.ts;
    // A mention without lab values ("@Solute thanks") gets a short private hint, not a public reply.
    if (
      reply.kind === "nothing" &&
      reply.problems.every((p) => p.code === "input.empty" || p.code === "word.unknown")
    ) {
      try {
        const user = event.user;
        if (user)
          await withBackoff(async () =>
            client.chat.postEphemeral({
              channel: event.channel,
              user,
              thread_ts: thread,
              text: QUIET_HINT,
            }),
          );
      } catch (error) {
        log("warn", "slack.note-failed", { platform: "slack", code: errorCode(error) });
      }
      return;
    }
    try {
      await withBackoff(async () =>
        client.chat.postMessage({ channel: event.channel, thread_ts: thread, ...(await message(reply)) }),
      );
    } catch (error) {
      await cannotPost(client, event.channel, event.user, error, thread);
      return;
    }
    await uploadCharts(client, reply, event.channel, thread);
  });

  app.message(async ({ message: m, client }) => {
    // Direct messages only; the bot's own and other bots' messages and edits are left alone.
    if (m.channel_type !== "im" || m.subtype !== undefined || "bot_id" in m || !m.channel) return;
    const text = cleanText(("text" in m ? m.text : "") ?? "");
    const reply = await answer(text, m.channel);
    // A message inside a DM thread is answered in that thread.
    const thread = "thread_ts" in m && typeof m.thread_ts === "string" ? m.thread_ts : undefined;
    let posted: { ts?: string } | undefined;
    try {
      posted = await withBackoff(async () =>
        client.chat.postMessage({
          channel: m.channel,
          ...(thread && { thread_ts: thread }),
          ...(await message(reply)),
        }),
      );
    } catch (error) {
      await cannotPost(client, m.channel, "user" in m ? (m.user as string) : undefined, error, thread);
      return;
    }
    // The chart goes into the reply's thread: the DM's thread, or one under the reply.
    await uploadCharts(client, reply, m.channel, thread ?? posted?.ts);
  });

  // One listener for every button: Bolt runs every listener's middleware on every request, so
  // fewer listeners is less work per message.
  app.action(/^solute_(post|working|forget)$/, async (args) => {
    await args.ack();
    const id = (args.action as { action_id?: string }).action_id;
    const value = "value" in args.action ? args.action.value : undefined;
    if (id === ACTIONS.forget) return forgetConfirmed(args);
    const reply = await recall(value);
    if (!reply) {
      await args.respond({ response_type: "ephemeral", replace_original: false, text: EXPIRED });
      return;
    }
    await (id === ACTIONS.post ? postToChannel(args, reply) : showMore(args, reply));
  });

  type ActionArgs = Parameters<Parameters<typeof app.action>[1]>[0];
  type ActionClient = ActionArgs["client"];

  async function postToChannel({ body, respond, client }: ActionArgs, reply: Reply) {
    if (!reply.shareable) {
      await respond({
        response_type: "ephemeral",
        replace_original: false,
        text: "This answer cannot be posted to the channel.",
      });
      return;
    }
    const channel = body.channel?.id ?? "";
    // Posted, the answer brings its chart: the private answer's note on how to get it goes.
    const shown = {
      ...reply,
      why: reply.why.filter((w) => w !== CHART_NOTE),
      notes: reply.notes.filter((n) => n !== CHART_NOTE),
    };
    try {
      const posted = await withBackoff(async () =>
        client.chat.postMessage({ channel, ...(await message(shown)) }),
      );
      await respond({ delete_original: true });
      await uploadCharts(client, shown, channel, posted.ts);
    } catch (error) {
      // The bot may not be in the channel (an answer shared from a DM): say so, privately.
      const code = (error as { data?: { error?: string } }).data?.error ?? errorCode(error);
      log("warn", "slack.post-failed", { platform: "slack", code });
      await respond({
        response_type: "ephemeral",
        replace_original: false,
        text:
          code === "not_in_channel" || code === "channel_not_found"
            ? "Solute could not post here: it is not in this channel. Invite it with /invite @Solute and press the button again."
            : "Solute could not post its answer just now: please press the button again in a moment.",
      });
    }
  }

  // "More" expands the answer in place: the private one through response_url, a public one by
  // editing the bot's own message. Nothing is logged again.
  async function showMore({ body, respond, client }: ActionArgs, reply: Reply) {
    const channel = body.channel?.id ?? "";
    const container = (body as { container?: { is_ephemeral?: boolean; message_ts?: string } }).container;
    const expanded = { ...reply, showWorking: true };
    if (container?.is_ephemeral || !container?.message_ts) {
      await respond({
        response_type: "ephemeral",
        replace_original: true,
        ...(await message(expanded, { offerPost: true })),
      });
      return;
    }
    try {
      const ts = container.message_ts;
      await withBackoff(async () =>
        client.chat.update({ channel, ts, ...render(expanded, { working: true }) }),
      );
    } catch (error) {
      await cannotPost(client, channel, body.user?.id, error);
    }
  }

  // The whole log is cleared only after the confirm dialog; then the channel is told, naming no one.
  async function forgetConfirmed({ body, respond, client }: ActionArgs) {
    const channel = body.channel?.id ?? "";
    const reply = await answer("forget all", channel);
    await respond({ response_type: "ephemeral", replace_original: true, ...render(reply) });
    if (reply.kind === "forget" && reply.announce) {
      try {
        await withBackoff(async () => client.chat.postMessage({ channel, text: reply.headline }));
      } catch (error) {
        await cannotPost(client, channel, body.user?.id, error);
      }
    }
  }

  // For the senior: "Check with Solute" on a message reads it where it stands and answers
  // privately to the person who used it.
  app.shortcut(SHORTCUT, async ({ shortcut, ack, respond }) => {
    await ack();
    const m = (shortcut as { message?: { text?: string } }).message;
    const channel = (shortcut as { channel?: { id?: string } }).channel?.id ?? "";
    const text = cleanText(m?.text ?? "");
    const checkable = /\b(calc|calculated|gap|corrected|eff|effective|anion gap|ag)\b|=/i.test(text);
    const reply = await answer(checkable && !/^check\b/i.test(text) ? `check ${text}` : text, channel, true);
    await respond({ response_type: "ephemeral", ...(await message(reply)) });
  });

  app.event("app_home_opened", async ({ event, client }) => {
    if (event.tab !== "home") return;
    try {
      await client.views.publish({
        user_id: event.user,
        view: { type: "home", blocks: homeBlocks(config.command) },
      });
    } catch (error) {
      log("warn", "slack.home-failed", { platform: "slack", code: errorCode(error) });
    }
  });

  // A short welcome when the bot itself joins a channel.
  app.event("member_joined_channel", async ({ event, client, context }) => {
    if (event.user !== context.botUserId) return;
    try {
      await withBackoff(async () =>
        client.chat.postMessage({ channel: event.channel, text: welcomeText(config.command) }),
      );
    } catch (error) {
      log("warn", "slack.welcome-failed", { platform: "slack", code: errorCode(error) });
    }
  });

  app.error(async (error) => {
    log("error", "slack.listener-failed", {
      platform: "slack",
      code: errorCode((error as { original?: unknown }).original ?? error),
    });
  });

  if (socket) {
    return {
      start,
      status,
      stop: async () => {
        stopped = true;
        clearTimeout(retry);
        if (ready) await app.stop();
      },
    };
  }

  const listener = (receiver as InstanceType<typeof HTTPReceiver>).requestListener;

  /**
   * A signed request delivered again inside the window (a replay) is answered once, on every
   * replica: its signature is remembered (as an HMAC) for the window. A forged one fails in Bolt.
   */
  function dispatch(req: IncomingMessage, res: ServerResponse, ts: number): void {
    const signature = req.headers["x-slack-signature"];
    if (typeof signature !== "string" || req.headers["x-slack-retry-num"] !== undefined) {
      listener(req, res);
      return;
    }
    const key = `slack:signed:${createHmac("sha256", bot.config.secret).update(`${ts}:${signature}`).digest("base64url").slice(0, 32)}`;
    bot.store.firstSeen(key, REPLAY_MS).then(
      (first) => {
        if (first) listener(req, res);
        else {
          log("info", "slack.replay-dropped", { platform: "slack" });
          res.writeHead(200).end();
        }
      },
      (error) => {
        // Without the store a replay cannot be told from a first delivery: answer it.
        log("warn", "slack.dedup-unavailable", { platform: "slack", code: errorCode(error) });
        listener(req, res);
      },
    );
  }
  return {
    handler: (req, res) => {
      if (Number(req.headers["content-length"] ?? 0) > MAX_BODY_BYTES) {
        log("warn", "slack.refused", { platform: "slack", code: "too-large", status: 413 });
        res.writeHead(413, { connection: "close" }).end();
        req.resume();
        return;
      }
      // Bolt rejects old timestamps; a request from the future is refused here too.
      const ts = Number(req.headers["x-slack-request-timestamp"]);
      if (!Number.isFinite(ts) || Math.abs(clock() / 1000 - ts) > MAX_CLOCK_SKEW_S) {
        log("warn", "slack.refused", { platform: "slack", code: "timestamp", status: 401 });
        res.writeHead(401).end();
        return;
      }
      if (!ready) {
        log("warn", "slack.refused", { platform: "slack", code: lastCode ?? "not-ready", status: 503 });
        req.resume();
        res.writeHead(503, { "retry-after": "5" }).end();
        return;
      }
      // The body is read here, within the limit, and checked before Bolt sees it: anything but
      // the object Slack sends (null, an array, a number, a string, payload=null) is refused.
      readBody(req, MAX_BODY_BYTES).then(
        (raw) => {
          if (raw === undefined) {
            log("warn", "slack.refused", { platform: "slack", code: "too-large", status: 413 });
            res.writeHead(413, { connection: "close" }).end();
            return;
          }
          if (!plausibleBody(raw, String(req.headers["content-type"] ?? ""))) {
            log("warn", "slack.refused", { platform: "slack", code: "malformed", status: 400 });
            res.writeHead(400).end();
            return;
          }
          (req as IncomingMessage & { rawBody?: Buffer }).rawBody = raw;
          dispatch(req, res, ts);
        },
        () => {
          if (!res.headersSent) res.writeHead(400).end();
        },
      );
    },
    start,
    status,
    stop: async () => {
      stopped = true;
      clearTimeout(retry);
    },
  };
}
