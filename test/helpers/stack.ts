/**
 * Solute's server on 127.0.0.1 with the real Slack adapter (against a local fake Slack Web API)
 * and, when asked, the real Teams adapter in local mode: the stack that fault tests, the HTTP
 * body fuzz and the resilience tests send requests to.
 */
import { createSlackAdapter, type SlackAdapter } from "../../adapters/slack/app.js";
import { MemoryStore } from "../../adapters/store/memory.js";
import { createTeamsAdapter } from "../../adapters/teams/app.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { type HttpServer, startServer } from "../../bot/server.js";
import { type FakeSlack, fakeSlack } from "./slack.js";

export interface Stack {
  api: FakeSlack;
  slack: SlackAdapter;
  server: HttpServer;
  store: MemoryStore;
  /** http://127.0.0.1:port */
  base: string;
  close(): Promise<void>;
}

export async function startStack(options: {
  signing: string;
  teams?: boolean;
  env?: Record<string, string>;
}): Promise<Stack> {
  const api = await fakeSlack();
  const config = loadConfig({
    SOLUTE_SECRET: "solute-secret-0123456789",
    SLACK_BOT_TOKEN: "xoxb-test",
    SLACK_SIGNING_SECRET: options.signing,
    SLACK_API_URL: `${api.url}/api/`,
    ...(options.teams && { TEAMS_LOCAL: "1" }),
    ...options.env,
  });
  const store = new MemoryStore();
  const bot = new Conversation(store, config);
  const slack = createSlackAdapter({ config: config.slack!, bot });
  await slack.start();
  const routes: Parameters<typeof startServer>[0]["routes"] = { "/slack/events": slack.handler! };
  if (options.teams) routes["/api/messages"] = createTeamsAdapter({ config: config.teams!, bot }).handler;
  const server = await startServer({ port: 0, host: "127.0.0.1", routes, store });
  return {
    api,
    slack,
    server,
    store,
    base: `http://127.0.0.1:${server.port}`,
    close: async () => {
      await server.close();
      await slack.stop();
      await api.close();
    },
  };
}
