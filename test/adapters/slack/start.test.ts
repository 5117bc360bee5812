import { afterEach, describe, expect, it } from "vitest";
import { loadConfig } from "../../../bot/config.js";
import { type Running, startPlatforms } from "../../../bot/platforms.js";
import { fakeSlack, form, postSigned } from "../../helpers/slack.js";

let running: Running | undefined;
afterEach(async () => {
  await running?.stop();
  running = undefined;
});

describe("npm start with Slack HTTP settings", () => {
  it("serves /slack/events and /healthz on one port", async () => {
    const api = await fakeSlack();
    try {
      running = await startPlatforms(
        loadConfig({
          SOLUTE_SECRET: "solute-secret-0123456789",
          SLACK_BOT_TOKEN: "xoxb-test",
          SLACK_SIGNING_SECRET: "signing-secret-x",
          SLACK_API_URL: api.url,
          PORT: "0",
          HOST: "127.0.0.1",
        }),
      );
      const base = `http://127.0.0.1:${running.port}`;
      expect((await fetch(`${base}/healthz`)).status).toBe(200);
      expect((await fetch(`${base}/readyz`)).status).toBe(200);
      expect((await fetch(`${base}/nowhere`)).status).toBe(404);
      const body = form({
        command: "/solute",
        text: "Na 140 glu 5 mmol/L urea 5 mmol/L",
        channel_id: "C1",
        user_id: "U1",
        team_id: "T1",
        response_url: `${api.url}/respond/x`,
        trigger_id: "t",
        token: "x",
      });
      const res = await postSigned(
        `${base}/slack/events`,
        "signing-secret-x",
        body,
        "application/x-www-form-urlencoded",
      );
      expect(res.status).toBe(200);
      expect(JSON.parse(res.text).text).toContain("calculated 290.0");
    } finally {
      await api.close();
    }
  });

  it("refuses to start with incomplete Slack settings, naming the setting", () => {
    expect(() => loadConfig({ SLACK_BOT_TOKEN: "xoxb-1" })).toThrow(/SLACK_SIGNING_SECRET/);
    expect(() => loadConfig({ SLACK_SIGNING_SECRET: "abcdefgh" })).toThrow(/SLACK_BOT_TOKEN/);
    expect(() => loadConfig({ SLACK_BOT_TOKEN: "nope" })).toThrow(/xoxb-/);
  });
});
