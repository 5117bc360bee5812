// Production build: bundles the entry points into dist/ with esbuild, so mathjs is tree-shaken to
// the unit and expression factories Solute uses (its full import costs about 0.6 s). The other
// dependencies stay external and load from node_modules; each platform loads only if configured.
import { readFileSync, rmSync } from "node:fs";
import { build } from "esbuild";

const pkg = JSON.parse(readFileSync(new URL("../package.json", import.meta.url), "utf8"));
const external = Object.keys(pkg.dependencies).filter((name) => name !== "mathjs");

rmSync(new URL("../dist", import.meta.url), { recursive: true, force: true });
await build({
  entryPoints: { main: "bot/main.ts", cli: "bot/cli.ts" },
  outdir: "dist",
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  external,
  sourcemap: true,
  logLevel: "warning",
});
console.log("built dist/main.js and dist/cli.js");
