import { afterEach, describe, expect, it } from "vitest";
import { loadConfig } from "../../../bot/config.js";
import { type Running, startPlatforms } from "../../../bot/platforms.js";
import { fixture } from "../../helpers/fixtures.js";
import { fakeConnector, replay } from "../../helpers/teams.js";

let running: Running | undefined;
afterEach(async () => {
  await running?.stop();
  running = undefined;
});

describe("npm start with Teams settings", () => {
  it("TEAMS_LOCAL=1 serves /api/messages with authentication off and says so loudly", async () => {
    const connector = await fakeConnector();
    const writes: string[] = [];
    const write = process.stderr.write.bind(process.stderr);
    process.stderr.write = ((chunk: string) => {
      writes.push(String(chunk));
      return true;
    }) as typeof process.stderr.write;
    try {
      running = await startPlatforms(
        loadConfig({
          SOLUTE_SECRET: "solute-secret-0123456789",
          TEAMS_LOCAL: "1",
          PORT: "0",
          HOST: "127.0.0.1",
        }),
      );
    } finally {
      process.stderr.write = write;
    }
    try {
      expect(writes.join("")).toMatch(/Teams authentication is OFF/);
      const res = await fetch(`http://127.0.0.1:${running.port}/api/messages`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(
          replay(
            fixture("dm-teams.json").dmMessage,
            "Na 140 glu 5 mmol/L urea 5 mmol/L",
            connector.serviceUrl,
          ),
        ),
      });
      expect(res.status).toBe(200);
      const [sent] = await connector.waitFor(1);
      expect(JSON.stringify(sent!.activity)).toContain("calculated 290.0");
    } finally {
      await connector.close();
    }
  });

  it("refuses TEAMS_LOCAL in production and incomplete credentials, naming the setting", () => {
    expect(() =>
      loadConfig({ TEAMS_LOCAL: "1", NODE_ENV: "production", SOLUTE_SECRET: "solute-secret-0123456789" }),
    ).toThrow(/TEAMS_LOCAL/);
    expect(() => loadConfig({ MicrosoftAppId: "11111111-2222-3333-4444-555555555555" })).toThrow(
      /MicrosoftAppPassword/,
    );
    expect(() =>
      loadConfig({ MicrosoftAppId: "a", MicrosoftAppPassword: "b", MicrosoftAppType: "SingleTenant" }),
    ).toThrow(/MicrosoftAppTenantId/);
    expect(() => loadConfig({ MicrosoftAppType: "Sideways" })).toThrow(/MicrosoftAppType/);
  });

  it("takes the signing keys' address over https, or over http only on loopback", () => {
    const app = { MicrosoftAppId: "a", MicrosoftAppPassword: "b" };
    for (const bad of ["http://keys.example/openid", "ftp://keys.example/x", "keys.example", "https://"])
      expect(() => loadConfig({ ...app, TEAMS_OPENID_METADATA_URL: bad }), bad).toThrow(
        /TEAMS_OPENID_METADATA_URL/,
      );
    for (const good of [
      "https://login.example.gov/v1/.well-known/openidconfiguration",
      "http://127.0.0.1:4000/openid",
    ])
      expect(loadConfig({ ...app, TEAMS_OPENID_METADATA_URL: good }).teams?.openIdMetadataUrl).toBe(good);
  });
});
