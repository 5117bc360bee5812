/**
 * Structured logs: event kinds, timings, counts and error codes — never message text, names or
 * user IDs. The fields are closed on purpose: there is no free-text field to put a message in.
 */
import type { Platform } from "./privacy.js";

export interface LogFields {
  platform?: Platform;
  /** Duration in milliseconds. */
  ms?: number;
  /** A short machine code: a problem code, an HTTP status, an error's name. */
  code?: string;
  count?: number;
  status?: number;
}

export type Level = "info" | "warn" | "error";

export type LogSink = (line: string) => void;

/**
 * A logger as the conversation and its commands receive it (injected, as Bolt takes `logger`): the
 * process-wide `log` below by default, `silent` or a capturing one in tests.
 */
export type Logger = (level: Level, event: string, fields?: LogFields) => void;

/** Drops every line. */
export const silent: Logger = () => {};

let sink: LogSink = (line) => process.stderr.write(`${line}\n`);
let quiet = false;

/** Replaces where log lines go (tests capture them here). */
export function setLogSink(next: LogSink): void {
  sink = next;
}

/**
 * Silences info lines: the terminal chat keeps the screen for the conversation, and
 * SOLUTE_LOG_LEVEL=warn drops the per-message lines on a busy server.
 */
export function setQuiet(value: boolean): void {
  quiet = value;
}

const CODE = /^[A-Za-z0-9_.:-]{1,64}$/;

export function log(level: Level, event: string, fields: LogFields = {}): void {
  if (quiet && level === "info") return;
  const safe: Record<string, unknown> = {
    t: new Date().toISOString(),
    level,
    event: CODE.test(event) ? event : "invalid-event",
  };
  if (fields.platform) safe.platform = fields.platform;
  if (typeof fields.ms === "number") safe.ms = Math.round(fields.ms * 10) / 10;
  // A code is a short token; anything else (an error message, say) is dropped, not logged.
  if (fields.code !== undefined) safe.code = CODE.test(fields.code) ? fields.code : "unprintable";
  if (typeof fields.count === "number") safe.count = fields.count;
  if (typeof fields.status === "number") safe.status = fields.status;
  sink(JSON.stringify(safe));
}

/** The code of an error, for logging: its `code` or `name`, never its message. */
export function errorCode(error: unknown): string {
  if (error && typeof error === "object") {
    const code = (error as { code?: unknown }).code;
    if (typeof code === "string" && CODE.test(code)) return code;
    const name = (error as { name?: unknown }).name;
    if (typeof name === "string" && CODE.test(name)) return name;
  }
  return "unknown";
}
