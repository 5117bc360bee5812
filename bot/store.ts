/**
 * The store port. Two adapters implement it: in memory (the embedded default) and Redis (shared by
 * every replica). It holds channel settings, the shift log, the de-duplication of retried chat
 * events and rate-limit counters — never message text, names or user IDs. Channels are known only
 * by an HMAC of their platform ID (see privacy.ts).
 */
import { z } from "zod";
import type { UnitSystem } from "../core/analytes.js";
import { type LabInputs, LabInputsSchema } from "../core/inputs.js";

export interface ChannelSettings {
  unitSystem?: UnitSystem;
}

/** One calculation in the shift log: numbers, a checked case tag, a time. Nothing else. */
export interface ShiftRecord {
  /** HMAC of the channel key. */
  channel: string;
  /** A bed or bay code that passed the privacy guard. */
  tag: string;
  /** Milliseconds since the epoch. */
  at: number;
  inputs: LabInputs;
  results: Partial<Record<ResultKey, number>>;
  /** Finding codes worth handing over (e.g. "gap.raised", "critical.sodium.low"). */
  flags: string[];
}

export type ResultKey =
  | "calculatedOsmolality"
  | "effectiveOsmolality"
  | "osmolalGap"
  | "anionGap"
  | "correctedSodiumKatz"
  | "correctedSodiumHillier";

export interface Store {
  readonly kind: "memory" | "redis";
  getSettings(channel: string): Promise<ChannelSettings>;
  setSettings(channel: string, settings: ChannelSettings): Promise<void>;
  /** Adds a record that expires `ttlMs` after its time. */
  addRecord(record: ShiftRecord, ttlMs: number): Promise<void>;
  /** The channel's unexpired records, oldest first. */
  listRecords(channel: string, now: number): Promise<ShiftRecord[]>;
  /**
   * When the channel's log began: set with its first record, kept as long as the log. Missing, or
   * newer than a window being judged, means earlier records are not there (a reset store).
   */
  logStart(channel: string): Promise<number | undefined>;
  /** Clears the channel's shift log at once; returns how many records went. */
  forget(channel: string): Promise<number>;
  /** Removes one case's records (a bed tag is reused when a patient leaves); returns how many went. */
  forgetTag(channel: string, tag: string): Promise<number>;
  /**
   * Keeps a reply Solute computed (its rendered fields: numbers, findings, Solute's own texts —
   * never the message it answered) under a random id, for the buttons that re-render it.
   */
  saveReply(id: string, reply: string, ttlMs: number): Promise<void>;
  /** The reply kept under `id`, or undefined once it has expired. */
  loadReply(id: string): Promise<string | undefined>;
  /** True the first time `key` is seen within `ttlMs` — de-duplicates retried deliveries. */
  firstSeen(key: string, ttlMs: number): Promise<boolean>;
  /** Counts a hit on `key` in a fixed window; true while the count is within `limit`. */
  hit(key: string, limit: number, windowMs: number): Promise<boolean>;
  /** Whether the store answers right now. */
  ready(): Promise<boolean>;
  close(): Promise<void>;
}

export const RESULT_KEYS = [
  "calculatedOsmolality",
  "effectiveOsmolality",
  "osmolalGap",
  "anionGap",
  "correctedSodiumKatz",
  "correctedSodiumHillier",
] as const satisfies readonly ResultKey[];

/**
 * What a stored record must look like when it is read back from a shared store (zod): the typed
 * inputs with their typo guards, finite results, a short tag and flags — and nothing else.
 */
export const ShiftRecordSchema = z
  .object({
    channel: z.string().max(64),
    tag: z.string().min(1).max(20),
    at: z.number().int().nonnegative(),
    inputs: LabInputsSchema,
    results: z
      .object(Object.fromEntries(RESULT_KEYS.map((k) => [k, z.number().finite().optional()])))
      .strict(),
    flags: z.array(z.string().max(64)).max(64),
  })
  .strict();
