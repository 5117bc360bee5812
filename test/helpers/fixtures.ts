/** The recorded platform payloads in ../shared/fixtures/platform (MIT; see its README). */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { ROOT } from "./spawn.js";

const DIR = join(ROOT, "..", "shared", "fixtures", "platform");

// biome-ignore lint/suspicious/noExplicitAny: recorded JSON, shaped by the platforms
export function fixture(name: string): any {
  return JSON.parse(readFileSync(join(DIR, name), "utf8"));
}
