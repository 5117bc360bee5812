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
import type { IncomingMessage, ServerResponse } from "node:http";
import { App, HTTPReceiver, LogLevel, SocketModeReceiver } from "@slack/bolt";
import type { SlackConfig } from "../../bot/config.js";
import type { Conversation } from "../../bot/conversation.js";
import { track } from "../../bot/inflight.js";
import { errorCode, log } from "../../bot/log.js";
import { channelKey } from "../../bot/privacy.js";
import type { Reply } from "../../bot/reply.js";
import { cleanText, slashText } from "./events.js";
import { ACTIONS, render } from "./render.js";

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
/** How long an event ID is remembered for de-duplication. */
const DEDUP_MS = 60 * 60 * 1000;

export interface SlackAdapter {
  /** The HTTP handler for /slack/events (HTTP mode only). */
  handler?: (req: IncomingMessage, res: ServerResponse) => void;
  start(): Promise<void>;
  stop(): Promise<void>;
}

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

export interface SlackOptions {
  config: SlackConfig;
  bot: Conversation;
  /** For tests: skip auth.test and give the bot's user ID. */
  botUserId?: string;
  clock?: () => number;
}

export function createSlackAdapter({ config, bot, botUserId, clock = Date.now }: SlackOptions): SlackAdapter {
  const clientOptions = {
    ...(config.apiUrl && { slackApiUrl: config.apiUrl.endsWith("/") ? config.apiUrl : `${config.apiUrl}/` }),
    retryConfig: { retries: 2, factor: 2, minTimeout: 200, maxTimeout: 2000 },
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
      });
  const app = new App({
    token: config.botToken,
    receiver,
    logger: quietLogger,
    clientOptions,
    ...(botUserId && { botUserId, botId: "B0SOLUTE", tokenVerificationEnabled: false }),
  });
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
    // Listeners run inside next(); tracking it lets shutdown wait for replies still being posted.
    await track(() => next());
  });

  const answer = (text: string, channel: string, replay = false): Promise<Reply> =>
    bot.handle({ text, channel, platform: "slack", ...(replay && { replay }) });

  app.command(config.command, async ({ command, ack, respond }) => {
    // The answer usually takes well under a millisecond: then it goes back in the acknowledgement
    // itself, saving a round trip. If it is not ready in time (a slow store), the command is
    // acknowledged first and answered through response_url — always inside Slack's 3 seconds.
    const text = slashText(command.text);
    const answering = answer(text, command.channel_id ?? "").then((reply) => ({
      response_type: "ephemeral" as const,
      ...render(reply, { source: text, offerPost: true }),
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

  app.event("app_mention", async ({ event, client }) => {
    if (!event.channel) return;
    const text = cleanText(event.text ?? "");
    const reply = await answer(text, event.channel);
    await client.chat.postMessage({
      channel: event.channel,
      thread_ts: event.thread_ts ?? event.ts,
      ...render(reply, { source: text }),
    });
  });

  app.message(async ({ message, client }) => {
    // Direct messages only; the bot's own and other bots' messages and edits are left alone.
    if (
      message.channel_type !== "im" ||
      message.subtype !== undefined ||
      "bot_id" in message ||
      !message.channel
    )
      return;
    const text = cleanText(("text" in message ? message.text : "") ?? "");
    const reply = await answer(text, message.channel);
    await client.chat.postMessage({ channel: message.channel, ...render(reply, { source: text }) });
  });

  // One listener for both buttons: Bolt runs every listener's middleware on every request, so
  // fewer listeners is less work per message.
  app.action(/^solute_(post|working)$/, async (args) => {
    const id = (args.action as { action_id?: string }).action_id;
    await (id === ACTIONS.post ? postToChannel(args) : showWorking(args));
  });

  type ActionArgs = Parameters<Parameters<typeof app.action>[1]>[0];

  async function postToChannel({ ack, body, respond, action }: ActionArgs) {
    await ack();
    const source = "value" in action ? (action.value ?? "") : "";
    const channel = body.channel?.id ?? "";
    const reply = await answer(source, channel, true);
    if (!reply.shareable) {
      await respond({
        response_type: "ephemeral",
        replace_original: false,
        text: "This answer cannot be posted to the channel.",
      });
      return;
    }
    await respond({ response_type: "in_channel", replace_original: false, ...render(reply, { source }) });
    await respond({ delete_original: true });
  }

  // "More" expands the answer in place: the private one through response_url, a public one by
  // editing the bot's own message. Nothing is logged again.
  async function showWorking({ ack, body, respond, action, client }: ActionArgs) {
    await ack();
    const source = "value" in action ? (action.value ?? "") : "";
    const channel = body.channel?.id ?? "";
    const reply = await answer(source, channel, true);
    const container = (
      body as { container?: { is_ephemeral?: boolean; thread_ts?: string; message_ts?: string } }
    ).container;
    if (container?.is_ephemeral || !container?.message_ts) {
      await respond({
        response_type: "ephemeral",
        replace_original: true,
        ...render(reply, { working: true, source, offerPost: true }),
      });
    } else {
      await client.chat.update({ channel, ts: container.message_ts, ...render(reply, { working: true }) });
    }
  }

  app.error(async (error) => {
    log("error", "slack.listener-failed", {
      platform: "slack",
      code: errorCode((error as { original?: unknown }).original ?? error),
    });
  });

  if (socket) {
    return {
      start: async () => {
        await app.start();
        log("info", "slack.socket-mode.connected", { platform: "slack" });
      },
      stop: async () => {
        await app.stop();
      },
    };
  }

  const listener = (receiver as InstanceType<typeof HTTPReceiver>).requestListener;
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
      listener(req, res);
    },
    start: async () => {},
    stop: async () => {},
  };
}
