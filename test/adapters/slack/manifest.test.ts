import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { loadConfig } from "../../../bot/config.js";
import { ROOT } from "../../helpers/spawn.js";

const read = (name: string) =>
  JSON.parse(readFileSync(join(ROOT, "adapters", "slack", "manifest", name), "utf8"));

describe.each(["http.json", "socket-mode.json"])("Slack app manifest %s", (name) => {
  const m = read(name);
  it("asks for exactly the scopes and events the adapter uses", () => {
    expect(m.oauth_config.scopes.bot.sort()).toEqual([
      "app_mentions:read",
      "chat:write",
      "commands",
      "im:history",
    ]);
    expect(m.settings.event_subscriptions.bot_events.sort()).toEqual(["app_mention", "message.im"]);
    expect(m.settings.interactivity.is_enabled).toBe(true);
  });
  it("declares the default slash command", () => {
    expect(m.features.slash_commands[0].command).toBe(loadConfig({}).slack?.command ?? "/solute");
  });
  it("matches its connection style", () => {
    expect(m.settings.socket_mode_enabled).toBe(name === "socket-mode.json");
    const urls = JSON.stringify(m).match(/https:\/\/[^"]+/g) ?? [];
    for (const u of urls) expect(u).toMatch(/\/slack\/events$/);
    expect(urls.length).toBe(name === "http.json" ? 3 : 0);
  });
});
