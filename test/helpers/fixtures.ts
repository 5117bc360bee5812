/**
 * Recorded Slack and Teams payloads (MIT; see test/fixtures/platform/README.md and LICENSE), copied
 * from the shared fixtures so the tests do not depend on a folder outside the repository.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { ROOT } from "./spawn.js";

const DIR = join(ROOT, "test", "fixtures", "platform");

// biome-ignore lint/suspicious/noExplicitAny: recorded JSON, shaped by the platforms
export function fixture(name: string): any {
  return JSON.parse(readFileSync(join(DIR, name), "utf8"));
}
