import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const root = join(import.meta.dirname, "..", "..");

function sources(dir: string): string[] {
  return readdirSync(join(root, dir), { recursive: true, encoding: "utf8" })
    .filter((f) => f.endsWith(".ts"))
    .map((f) => join(dir, f));
}

function imports(file: string): string[] {
  const text = readFileSync(join(root, file), "utf8");
  return [
    ...text.matchAll(/(?:import|export)[^"']*from\s*["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)/g),
  ].map((m) => m[1] ?? m[2] ?? "");
}

describe("dependency boundaries", () => {
  it("core imports nothing from bot/ or adapters/, and no chat SDK or I/O", () => {
    for (const file of sources("core")) {
      for (const spec of imports(file)) {
        expect(spec, file).not.toMatch(/\/(bot|adapters)\//);
        expect(spec, file).not.toMatch(/^(@slack|botbuilder|node:|redis|ioredis)/);
      }
    }
  });
});

describe("bot and adapters", () => {
  it("bot/ imports adapters only from its entry points", () => {
    for (const file of sources("bot")) {
      if (/bot\/(main|cli|platforms)\.ts$/.test(file)) continue;
      for (const spec of imports(file)) expect(spec, file).not.toMatch(/adapters\//);
    }
  });

  it("no adapter imports another adapter", () => {
    for (const file of sources("adapters")) {
      const own = file.split("/")[1];
      for (const spec of imports(file)) {
        const m = /^\.\.\/(\w+)\//.exec(spec);
        if (m) expect(m[1], `${file} → ${spec}`).toBe(own);
        expect(spec, file).not.toMatch(/adapters\/(?!$)/);
      }
    }
  });
});

describe("chat SDKs stay inside their adapters", () => {
  it("botbuilder only under adapters/teams, @slack/* only under adapters/slack", () => {
    for (const dir of ["core", "bot", "adapters"]) {
      for (const file of sources(dir)) {
        for (const spec of imports(file)) {
          if (/^(botbuilder|botframework)/.test(spec)) expect(file, spec).toMatch(/^adapters\/teams\//);
          if (spec.startsWith("@slack/")) expect(file, spec).toMatch(/^adapters\/slack\//);
        }
      }
    }
  });
});
