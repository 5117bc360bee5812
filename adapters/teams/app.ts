/**
 * Solute on Microsoft Teams, with botbuilder's CloudAdapter. Every import of botbuilder stays in
 * this folder (4.23.3 is that SDK's last release), so it can be replaced without touching bot/ or
 * core/.
 *
 * - In a channel the bot answers when mentioned, in the reply thread; in personal and group chats
 *   it answers every message meant for it. The mention is stripped before reading.
 * - Replies are Adaptive Cards (1.5) with the working behind a show-card action.
 * - With MicrosoftAppId set, requests must carry a valid Bot Framework token (401 otherwise). With
 *   TEAMS_LOCAL=1 and no app ID, authentication is off for trying it locally (never in production).
 */
import type { IncomingMessage, ServerResponse } from "node:http";
import {
  type Activity,
  ActivityTypes,
  CallerIdConstants,
  CardFactory,
  CloudAdapter,
  ConfigurationBotFrameworkAuthentication,
  MessageFactory,
  type TurnContext,
} from "botbuilder";
import { AuthenticationConstants } from "botframework-connector";
import type { TeamsConfig } from "../../bot/config.js";
import type { Conversation } from "../../bot/conversation.js";
import { errorCode, log } from "../../bot/log.js";
import { channelKey } from "../../bot/privacy.js";
import type { Reply } from "../../bot/reply.js";
import { channelOf, cleanText, mentionsBot } from "./events.js";
import { type CardImage, renderCard } from "./render.js";

const WELCOME =
  "Solute is here: mention me with lab values (Na 128 glu 540 mg/dL urea 14 mmol/L osm 310), or message me directly. Tag cases by bed or bay, never by name. Type help for more; units si or units conventional sets this chat's units.";
const QUIET_HINT =
  "Mention me with lab values, like: Na 128 glu 540 mg/dL urea 14 mmol/L osm 310 — or type help.";

/** Largest request body accepted; Teams activities are a few kilobytes. */
export const MAX_BODY_BYTES = 256 * 1024;
const DEDUP_MS = 60 * 60 * 1000;

export interface TeamsAdapter {
  handler: (req: IncomingMessage, res: ServerResponse) => Promise<void>;
}

/** Reads the body with a size limit; undefined when it is too large. */
async function readBody(req: IncomingMessage): Promise<string | undefined> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) return undefined;
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks).toString("utf8");
}

/**
 * CloudAdapter.process() prints whole errors (which can carry request bodies) with console.error;
 * this adapter runs the same turn through processActivity and logs only error codes.
 */
class QuietCloudAdapter extends CloudAdapter {
  run(authHeader: string, activity: Activity, logic: (context: TurnContext) => Promise<void>) {
    return this.processActivity(authHeader, activity, logic);
  }
}

/**
 * The public cloud's settings with the signing keys published elsewhere. botframework-connector
 * takes one such setting as a full configuration, so every other one is given its default.
 */
function publicCloudWithKeysAt(url: string) {
  return {
    ValidateAuthority: true,
    ToChannelFromBotLoginUrl: AuthenticationConstants.ToChannelFromBotLoginUrl,
    ToChannelFromBotOAuthScope: AuthenticationConstants.ToChannelFromBotOAuthScope,
    ToBotFromChannelTokenIssuer: AuthenticationConstants.ToBotFromChannelTokenIssuer,
    OAuthUrl: AuthenticationConstants.OAuthUrl,
    ToBotFromChannelOpenIdMetadataUrl: url,
    ToBotFromEmulatorOpenIdMetadataUrl: AuthenticationConstants.ToBotFromEmulatorOpenIdMetadataUrl,
    CallerId: CallerIdConstants.PublicAzureChannel,
  };
}

async function chartImages(reply: Reply): Promise<CardImage[]> {
  if (!reply.charts?.length) return [];
  const { drawChart } = await import("../../bot/charts.js");
  const images: CardImage[] = [];
  for (const request of reply.charts) {
    try {
      const chart = await drawChart(request);
      images.push({ url: `data:image/png;base64,${chart.png.toString("base64")}`, altText: chart.alt });
    } catch (error) {
      log("warn", "teams.chart-failed", { platform: "teams", code: errorCode(error) });
    }
  }
  return images;
}

/** jsonwebtoken's own errors, which botframework-connector passes on as they are. */
const TOKEN_ERRORS = new Set(["JsonWebTokenError", "TokenExpiredError", "NotBeforeError"]);

/**
 * Whether authentication failed because of the token (401) rather than because the signing keys
 * could not be had (503): botframework-connector throws an AuthenticationError with status 401
 * for a bad token, one with status 500 when the key set could not be loaded, jsonwebtoken's error
 * for a bad signature, and a network error when the login metadata is unreachable.
 */
export function isBadToken(error: unknown): boolean {
  if (!error || typeof error !== "object") return false;
  const { statusCode, name } = error as { statusCode?: unknown; name?: unknown };
  return statusCode === 401 || (typeof name === "string" && TOKEN_ERRORS.has(name));
}

export function createTeamsAdapter({
  config,
  bot,
}: {
  config: TeamsConfig;
  bot: Conversation;
}): TeamsAdapter {
  const auth = new ConfigurationBotFrameworkAuthentication(
    config.appId
      ? {
          MicrosoftAppId: config.appId,
          ...(config.appPassword && { MicrosoftAppPassword: config.appPassword }),
          ...(config.appType && { MicrosoftAppType: config.appType }),
          ...(config.tenantId && { MicrosoftAppTenantId: config.tenantId }),
          ...(config.openIdMetadataUrl && publicCloudWithKeysAt(config.openIdMetadataUrl)),
        }
      : {},
  );
  const adapter = new QuietCloudAdapter(auth);
  adapter.onTurnError = async (_context, error) => {
    log("error", "teams.turn-failed", { platform: "teams", code: errorCode(error) });
  };

  const logic = async (context: TurnContext) => {
    const activity = context.activity;
    // A welcome when the bot itself is added to a team, a channel or a chat.
    if (activity.type === "conversationUpdate") {
      if ((activity.membersAdded ?? []).some((m) => m.id === activity.recipient?.id))
        await context.sendActivity(MessageFactory.text(WELCOME));
      return;
    }
    // For the senior: the message action "Check with Solute" reads the message it is used on and
    // answers privately, in a task module only the person who used it sees. Nothing is logged.
    if (activity.type === "invoke" && activity.name === "composeExtension/fetchTask") {
      const value = activity.value as { messagePayload?: { body?: { content?: string } } } | undefined;
      const text = cleanText(value?.messagePayload?.body?.content ?? "");
      const checkable = /\b(calc|calculated|gap|corrected|eff|effective|anion gap|ag)\b|=/i.test(text);
      const reply = await bot.handle({
        text: checkable && !/^check\b/i.test(text) ? `check ${text}` : text,
        channel: channelOf(activity),
        platform: "teams",
        replay: true,
      });
      await context.sendActivity({
        type: ActivityTypes.InvokeResponse,
        value: {
          status: 200,
          body: {
            task: {
              type: "continue",
              value: {
                title: "Solute",
                width: "medium",
                height: "large",
                card: CardFactory.adaptiveCard(renderCard(reply)),
              },
            },
          },
        },
      });
      return;
    }
    if (activity.type !== "message") return;
    const type = activity.conversation?.conversationType;
    // The confirm card's button: clear the whole log, then say so in the conversation.
    const submitted = (activity.value as { solute?: string } | undefined)?.solute === "forget-all";
    if (type === "channel" && !mentionsBot(activity) && !submitted) return;
    const id = `${activity.conversation?.id ?? ""}|${activity.id ?? ""}`;
    try {
      if (
        !(await bot.store.firstSeen(`teams:activity:${channelKey(bot.config.secret, "teams", id)}`, DEDUP_MS))
      ) {
        log("info", "teams.retry-dropped", { platform: "teams" });
        return;
      }
    } catch (error) {
      log("warn", "teams.dedup-unavailable", { platform: "teams", code: errorCode(error) });
    }
    const text = submitted ? "forget all" : cleanText(activity.text ?? "");
    const reply = await bot.handle({ text, channel: channelOf(activity), platform: "teams" });
    // A mention without lab values gets one short line, not a card.
    if (
      reply.kind === "nothing" &&
      reply.problems.every((p) => p.code === "input.empty" || p.code === "word.unknown")
    ) {
      await context.sendActivity(MessageFactory.text(QUIET_HINT));
      return;
    }
    // A trend's chart goes into the card as a data URI: no file store and no public URL to run
    // (drawn only when asked for; about 13 KB as base64, inside the card's size limit).
    const images = await chartImages(reply);
    const message = MessageFactory.attachment(CardFactory.adaptiveCard(renderCard(reply, { images })));
    message.summary = reply.headline;
    try {
      await context.sendActivity(message);
    } catch (error) {
      // The card was refused (after the connector's retries): say so in a plain line, with the
      // verdict, rather than leave the person with nothing.
      log("warn", "teams.post-failed", { platform: "teams", code: errorCode(error) });
      const status = (error as { statusCode?: number }).statusCode ?? 0;
      // A card the service refused (4xx): the verdict in plain text. A service that is down (5xx)
      // has had its bounded retries; a second send would only add to them.
      if (status >= 400 && status < 500)
        await context.sendActivity(
          MessageFactory.text(
            `${reply.headline}. (Solute could not post its full answer here; please send the message again.)`,
          ),
        );
    }
  };

  return {
    handler: async (req, res) => {
      if (req.method !== "POST") {
        res.writeHead(405, { allow: "POST" }).end();
        return;
      }
      const raw = await readBody(req);
      if (raw === undefined) {
        log("warn", "teams.refused", { platform: "teams", code: "too-large", status: 413 });
        res.writeHead(413).end();
        return;
      }
      let body: Partial<Activity>;
      try {
        body = JSON.parse(raw) as Partial<Activity>;
        if (!body || typeof body !== "object" || typeof body.type !== "string")
          throw new Error("not an activity");
      } catch {
        log("warn", "teams.refused", { platform: "teams", code: "malformed", status: 400 });
        res.writeHead(400).end();
        return;
      }
      const header = req.headers.authorization;
      try {
        const invoke = await adapter.run(typeof header === "string" ? header : "", body as Activity, logic);
        res
          .writeHead(invoke?.status ?? 200, { "content-type": "application/json" })
          .end(invoke?.body === undefined ? undefined : JSON.stringify(invoke.body));
      } catch (error) {
        // What reaches here failed before Solute's turn ran: authentication, or the signing keys
        // that check it (unreachable login metadata). Never 500: 401 for a bad token, 503 while
        // the keys cannot be fetched.
        const unauthorised = isBadToken(error);
        const status = unauthorised ? 401 : 503;
        log("warn", unauthorised ? "teams.refused" : "teams.auth-keys-unavailable", {
          platform: "teams",
          code: errorCode(error),
          status,
        });
        if (!res.headersSent) res.writeHead(status, status === 503 ? { "retry-after": "10" } : {}).end();
      }
    },
  };
}
