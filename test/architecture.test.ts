import { existsSync, readdirSync, readFileSync } from "node:fs";
import { dirname, join, normalize } from "node:path";
import { describe, expect, it } from "vitest";

const root = join(import.meta.dirname, "..");

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

/** Relative imports of a file (type-only ones too), resolved to project paths. */
function localImports(file: string): string[] {
  return imports(file)
    .filter((spec) => spec.startsWith("."))
    .map((spec) => normalize(join(dirname(file), spec)).replace(/\.js$/, ".ts"));
}

/** Every circle of imports among the project's modules, each as the path round it. */
function circles(files: string[], importsOf: (file: string) => string[] = localImports): string[][] {
  const graph = new Map(files.map((f) => [f, importsOf(f).filter((t) => files.includes(t))]));
  const found: string[][] = [];
  const state = new Map<string, "open" | "done">();
  const path: string[] = [];
  const visit = (f: string) => {
    state.set(f, "open");
    path.push(f);
    for (const next of graph.get(f) ?? []) {
      if (state.get(next) === "open") found.push([...path.slice(path.indexOf(next)), next]);
      else if (!state.has(next)) visit(next);
    }
    path.pop();
    state.set(f, "done");
  };
  for (const f of files) if (!state.has(f)) visit(f);
  return found;
}

describe("no circles", () => {
  it("no module imports another in a circle, type-only imports included", () => {
    const files = ["core", "bot", "adapters"].flatMap(sources);
    expect(circles(files).map((c) => c.join(" → "))).toEqual([]);
  });

  it("the circle finder finds the circle the layout once had", () => {
    // conversation ↔ plan ↔ shift, as they imported each other before bot/commands/.
    const was: Record<string, string[]> = {
      "conversation.ts": ["plan.ts", "shift.ts", "reply.ts"],
      "plan.ts": ["conversation.ts", "shift.ts"],
      "shift.ts": ["conversation.ts"],
      "reply.ts": [],
    };
    const found = circles(Object.keys(was), (f) => was[f]!);
    expect(found).toContainEqual(["conversation.ts", "plan.ts", "conversation.ts"]);
    expect(found.every((c) => c[0] === c.at(-1))).toBe(true);
    expect(circles(["reply.ts"], (f) => was[f]!)).toEqual([]);
  });

  it("no command imports the conversation or another command; only the table imports them all", () => {
    for (const file of sources("bot/commands")) {
      for (const spec of imports(file)) {
        expect(spec, file).not.toMatch(/conversation\.js$/);
        if (spec.startsWith("./") && !file.endsWith("index.ts")) expect(spec, file).toBe("./context.js");
      }
    }
  });
});

describe("tests mirror the engine", () => {
  it("every core module has a test file of the same name under test/core", () => {
    // Exempt: core/index.ts only re-exports; core/results.ts holds only types.
    const exempt = new Set(["core/index.ts", "core/results.ts"]);
    for (const file of sources("core").filter((f) => !exempt.has(f))) {
      const test = file.replace(/^core\//, "test/core/").replace(/\.ts$/, ".test.ts");
      expect(existsSync(join(root, test)), `${file} has no ${test}`).toBe(true);
    }
  });
});

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
