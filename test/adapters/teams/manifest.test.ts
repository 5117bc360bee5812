import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { ROOT } from "../../helpers/spawn.js";

// CommonJS packages: their module.exports is the class and the function themselves.
const require = createRequire(import.meta.url);
const Ajv = require("ajv-draft-04") as typeof import("ajv-draft-04").default;
const addFormats = require("ajv-formats") as typeof import("ajv-formats").default;

const dir = join(ROOT, "adapters", "teams", "manifest");
const manifest = JSON.parse(readFileSync(join(dir, "manifest.json"), "utf8"));
// The official Teams app manifest schema, shipped offline in the npm package @microsoft/app-manifest.
const schema = JSON.parse(
  readFileSync(
    join(
      ROOT,
      "node_modules",
      "@microsoft",
      "app-manifest",
      "build",
      "json-schemas",
      "teams",
      "v1.24",
      "MicrosoftTeams.schema.json",
    ),
    "utf8",
  ),
);

function pngSize(file: string): [number, number] {
  const b = readFileSync(join(dir, file));
  expect(b.subarray(1, 4).toString()).toBe("PNG");
  return [b.readUInt32BE(16), b.readUInt32BE(20)];
}

describe("Teams app manifest", () => {
  it("validates against the official v1.24 schema", () => {
    const ajv = new Ajv({ allErrors: true, strict: false });
    addFormats(ajv);
    const validate = ajv.compile(schema);
    const ok = validate(manifest);
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
  });

  it("the schema catches a broken manifest", () => {
    const ajv = new Ajv({ allErrors: true, strict: false });
    addFormats(ajv);
    expect(
      ajv.compile(schema)({ ...manifest, bots: [{ ...manifest.bots[0], scopes: ["everywhere"] }] }),
    ).toBe(false);
  });

  it("covers personal, team and group chat, with commands in our own words", () => {
    expect(manifest.bots[0].scopes.sort()).toEqual(["groupChat", "personal", "team"]);
    expect(manifest.bots[0].commandLists[0].commands.map((c: { title: string }) => c.title)).toEqual([
      "help",
      "check",
      "plan",
      "trend",
      "handover",
      "units",
      "forget",
    ]);
    // Every command the conversation answers is in the manifest.
    expect(manifest.composeExtensions[0].commands[0]).toMatchObject({
      type: "action",
      context: ["message"],
      fetchTask: true,
    });
  });

  it("npm run teams:manifest fills the app ID and validDomains from configuration, and still validates", async () => {
    const { run } = await import("../../helpers/spawn.js");
    const r = await run(process.execPath, ["scripts/teams-manifest.mjs"], {
      env: {
        ...process.env,
        MicrosoftAppId: "11111111-2222-3333-4444-555555555555",
        SOLUTE_PUBLIC_HOST: "solute.hospital.example",
      },
    });
    expect(r.code, r.stderr).toBe(0);
    const built = JSON.parse(readFileSync(join(ROOT, "dist", "teams-app", "manifest.json"), "utf8"));
    expect(built.validDomains).toEqual(["solute.hospital.example"]);
    expect(built.bots[0].botId).toBe("11111111-2222-3333-4444-555555555555");
    const ajv = new Ajv({ allErrors: true, strict: false });
    addFormats(ajv);
    const validate = ajv.compile(schema);
    expect(validate(built), JSON.stringify(validate.errors)).toBe(true);
    const refused = await run(process.execPath, ["scripts/teams-manifest.mjs"], {
      env: { PATH: process.env.PATH ?? "" },
    });
    expect(refused.code).toBe(1);
  });

  it("ships icons of the sizes Teams asks for", () => {
    expect(pngSize("color.png")).toEqual([192, 192]);
    expect(pngSize("outline.png")).toEqual([32, 32]);
  });
});
