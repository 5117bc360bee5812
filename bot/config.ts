/**
 * Configuration from the environment, validated with zod. Every setting is listed in the README's
 * configuration table; a bad value stops start-up with a message that names the setting.
 */
import { randomBytes } from "node:crypto";
import { z } from "zod";
import { ConfigError } from "./errors.js";

const rangeOf = (example: string, min: number, max: number) =>
  z
    .string()
    .regex(/^\d{1,3}\s*[-–]\s*\d{1,3}$/, `write it as low-high, e.g. ${example}`)
    .transform((s) => {
      const [low, high] = s.split(/[-–]/).map((x) => Number(x.trim())) as [number, number];
      return { low, high };
    })
    .refine(
      (r) => r.low < r.high && r.low >= min && r.high <= max,
      `low must be below high, within ${min}–${max}`,
    );
const range = rangeOf("275-295", 250, 330);

const flag = z
  .enum(["1", "0", "true", "false", "yes", "no", ""])
  .optional()
  .transform((v) => v === "1" || v === "true" || v === "yes");

const EnvSchema = z.object({
  NODE_ENV: z.string().optional(),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z
    .string()
    .regex(
      /^(\d{1,3}(\.\d{1,3}){3}|\[?[0-9a-f:]+\]?|[a-z0-9]([a-z0-9.-]{0,251}[a-z0-9])?)$/i,
      "must be an IP address or a host name",
    )
    .default("0.0.0.0"),
  SOLUTE_SECRET: z.string().min(16, "must be at least 16 characters").optional(),
  SOLUTE_SHIFT_HOURS: z.coerce.number().min(1).max(72).default(16),
  // Sodium series must outlive the 24 h correction limit and the 48 h total (REFERENCES §5).
  SOLUTE_SERIES_HOURS: z.coerce
    .number()
    .min(48, "must be at least 48: the correction limits span 48 h")
    .max(168)
    .default(48),
  SOLUTE_OSMOLALITY_RANGE: range.default({ low: 275, high: 295 }),
  SOLUTE_ANION_GAP_RANGE: rangeOf("3-11", 0, 30).default({ low: 3, high: 11 }),
  SOLUTE_DEFAULT_UNITS: z.enum(["si", "conventional"]).optional(),
  SOLUTE_RATE_LIMIT: z.coerce.number().int().min(1).max(100000).default(120),
  SOLUTE_LOG_LEVEL: z.enum(["info", "warn"]).default("info"),
  REDIS_URL: z
    .string()
    .regex(/^rediss?:\/\/[^\s]+$/, "must be a redis:// or rediss:// URL")
    .optional(),
  SOLUTE_STORE_TIMEOUT_MS: z.coerce.number().int().min(20).max(10_000).default(300),
  // Slack
  SLACK_BOT_TOKEN: z.string().startsWith("xoxb-", "must start with xoxb-").optional(),
  SLACK_SIGNING_SECRET: z.string().min(8).optional(),
  SLACK_APP_TOKEN: z.string().startsWith("xapp-", "must start with xapp-").optional(),
  SLACK_API_URL: z.string().url().optional(),
  SLACK_COMMAND: z
    .string()
    .regex(/^\/[a-z0-9_-]{1,31}$/, "must look like /solute")
    .default("/solute"),
  // Teams (Bot Framework)
  MicrosoftAppId: z.string().optional(),
  MicrosoftAppPassword: z.string().optional(),
  MicrosoftAppType: z.enum(["MultiTenant", "SingleTenant", "UserAssignedMSI"]).optional(),
  MicrosoftAppTenantId: z.string().optional(),
  TEAMS_LOCAL: flag,
  // Where the Bot Framework publishes the keys that sign requests to the bot. The public cloud's
  // by default; set for a sovereign cloud, or a local key set in tests (http only on loopback).
  TEAMS_OPENID_METADATA_URL: z
    .string()
    .regex(
      /^(https:\/\/[^\s/]+|http:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?)\/[^\s]*$/,
      "must be an https:// URL (http:// only for 127.0.0.1)",
    )
    .optional(),
});

export interface SlackConfig {
  botToken: string;
  signingSecret?: string;
  appToken?: string;
  apiUrl?: string;
  command: string;
}

export interface TeamsConfig {
  appId?: string;
  appPassword?: string;
  appType?: "MultiTenant" | "SingleTenant" | "UserAssignedMSI";
  tenantId?: string;
  /** Authentication off, for trying it locally. Refused in production. */
  local: boolean;
  /** Where the signing keys of requests from the channel are published (default: public cloud). */
  openIdMetadataUrl?: string;
}

export interface Config {
  production: boolean;
  port: number;
  host: string;
  secret: string;
  /** True when no SOLUTE_SECRET was given and one was made for this process. */
  ephemeralSecret: boolean;
  shiftMs: number;
  /** How long a case's sodium series lives (at least 48 h), independent of the shift summary. */
  seriesMs: number;
  osmolalityRange: { low: number; high: number };
  /** The lab's anion-gap reference interval, mmol/L (analyser-specific). */
  anionGapRange: { low: number; high: number };
  defaultUnits?: "si" | "conventional";
  rateLimitPerMinute: number;
  logLevel: "info" | "warn";
  redisUrl?: string;
  /** How long a store call may take before the caller carries on without it, ms. */
  storeTimeoutMs: number;
  slack?: SlackConfig;
  teams?: TeamsConfig;
}

export { ConfigError } from "./errors.js";

export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = EnvSchema.safeParse(
    Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v !== "")),
  );
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new ConfigError(`Solute cannot start; fix these settings:\n${lines.join("\n")}`);
  }
  const e = parsed.data;
  // "production", "Production", "prod": all production (TEAMS_LOCAL is refused there).
  const production = /^prod(uction)?$/i.test(e.NODE_ENV ?? "");
  const problems: string[] = [];

  let slack: SlackConfig | undefined;
  if (e.SLACK_BOT_TOKEN || e.SLACK_SIGNING_SECRET || e.SLACK_APP_TOKEN) {
    if (!e.SLACK_BOT_TOKEN) problems.push("  SLACK_BOT_TOKEN: required for Slack (xoxb-…)");
    if (!e.SLACK_APP_TOKEN && !e.SLACK_SIGNING_SECRET) {
      problems.push(
        "  SLACK_SIGNING_SECRET: required for Slack over HTTP (or set SLACK_APP_TOKEN for Socket Mode)",
      );
    }
    if (e.SLACK_BOT_TOKEN) {
      slack = {
        botToken: e.SLACK_BOT_TOKEN,
        command: e.SLACK_COMMAND,
        ...(e.SLACK_SIGNING_SECRET && { signingSecret: e.SLACK_SIGNING_SECRET }),
        ...(e.SLACK_APP_TOKEN && { appToken: e.SLACK_APP_TOKEN }),
        ...(e.SLACK_API_URL && { apiUrl: e.SLACK_API_URL }),
      };
    }
  }

  let teams: TeamsConfig | undefined;
  if (e.MicrosoftAppId || e.TEAMS_LOCAL) {
    if (e.TEAMS_LOCAL && production)
      problems.push("  TEAMS_LOCAL: authentication cannot be turned off when NODE_ENV=production");
    if (
      e.MicrosoftAppId &&
      !e.TEAMS_LOCAL &&
      e.MicrosoftAppType !== "UserAssignedMSI" &&
      !e.MicrosoftAppPassword
    ) {
      problems.push("  MicrosoftAppPassword: required with MicrosoftAppId");
    }
    if (e.MicrosoftAppType === "SingleTenant" && !e.MicrosoftAppTenantId)
      problems.push("  MicrosoftAppTenantId: required for SingleTenant");
    teams = {
      local: e.TEAMS_LOCAL && !e.MicrosoftAppId,
      ...(e.MicrosoftAppId && { appId: e.MicrosoftAppId }),
      ...(e.MicrosoftAppPassword && { appPassword: e.MicrosoftAppPassword }),
      ...(e.MicrosoftAppType && { appType: e.MicrosoftAppType }),
      ...(e.MicrosoftAppTenantId && { tenantId: e.MicrosoftAppTenantId }),
      ...(e.TEAMS_OPENID_METADATA_URL && { openIdMetadataUrl: e.TEAMS_OPENID_METADATA_URL }),
    };
  }

  if (e.REDIS_URL && !e.SOLUTE_SECRET)
    problems.push("  SOLUTE_SECRET: required with REDIS_URL, so every replica hashes channels alike");
  if (production && !e.SOLUTE_SECRET) problems.push("  SOLUTE_SECRET: required when NODE_ENV=production");
  if (problems.length > 0)
    throw new ConfigError(`Solute cannot start; fix these settings:\n${problems.join("\n")}`);

  return {
    production,
    port: e.PORT,
    host: e.HOST,
    secret: e.SOLUTE_SECRET ?? randomBytes(32).toString("base64url"),
    ephemeralSecret: !e.SOLUTE_SECRET,
    shiftMs: e.SOLUTE_SHIFT_HOURS * 3_600_000,
    seriesMs: e.SOLUTE_SERIES_HOURS * 3_600_000,
    osmolalityRange: e.SOLUTE_OSMOLALITY_RANGE,
    anionGapRange: e.SOLUTE_ANION_GAP_RANGE,
    rateLimitPerMinute: e.SOLUTE_RATE_LIMIT,
    logLevel: e.SOLUTE_LOG_LEVEL,
    storeTimeoutMs: e.SOLUTE_STORE_TIMEOUT_MS,
    ...(e.SOLUTE_DEFAULT_UNITS && { defaultUnits: e.SOLUTE_DEFAULT_UNITS }),
    ...(e.REDIS_URL && { redisUrl: e.REDIS_URL }),
    ...(slack && { slack }),
    ...(teams && { teams }),
  };
}
