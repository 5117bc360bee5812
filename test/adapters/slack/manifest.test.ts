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
    // channels:read and groups:read: member_joined_channel, for the welcome when the bot joins.
    expect(m.oauth_config.scopes.bot.sort()).toEqual([
      "app_mentions:read",
      "channels:read",
      "chat:write",
      "commands",
      // files:write: the chart of a sodium course, uploaded into the reply's thread.
      "files:write",
      "groups:read",
      "im:history",
    ]);
    expect(m.settings.event_subscriptions.bot_events.sort()).toEqual([
      "app_home_opened",
      "app_mention",
      "member_joined_channel",
      "message.im",
    ]);
    expect(m.settings.interactivity.is_enabled).toBe(true);
    expect(m.features.app_home.home_tab_enabled).toBe(true);
    expect(m.features.shortcuts).toEqual([
      expect.objectContaining({ type: "message", callback_id: "solute_check" }),
    ]);
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
