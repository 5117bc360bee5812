/**
 * The Redis store, shared by every replica: channel settings, the shift log, the de-duplication of
 * retried chat events and rate-limit counters. Client: node-redis (the `redis` package), the client
 * maintained by Redis itself, with typed commands and reconnection built in.
 *
 * Keys hold only an HMAC of the channel; values hold only settings, numbers, a checked case tag and
 * times. Commands fail fast while Redis is down (no offline queue), so callers can carry on without
 * it; the client reconnects by itself.
 *
 *   solute:settings:<channel>   string (JSON settings), no expiry
 *   solute:log:<channel>        sorted set, score = the record's expiry time, member = a compact
 *                               JSON array: [id, tag, time, [input index, value, …],
 *                               [result index, value, …], [flags]] (the channel is the key)
 *   solute:seen:<key>           "1" with a TTL (SET NX PX)
 *   solute:logstart:<channel>   when the channel's log began (ms), expiring with the log
 *   solute:reply:<random id>    a reply's rendered fields (JSON, no message text), with a TTL
 *   solute:rate:<key>:<window>  counter with a TTL
 */
import { randomBytes } from "node:crypto";
import { createClient } from "redis";
import { StoreError } from "../../bot/errors.js";
import { errorCode, log } from "../../bot/log.js";
import {
  type ChannelSettings,
  RESULT_KEYS,
  type ShiftRecord,
  ShiftRecordSchema,
  type Store,
} from "../../bot/store.js";
import { INPUT_KEYS } from "../../core/inputs.js";

const P = "solute:";

/** How long a Redis call may take before the caller carries on without it (SOLUTE_STORE_TIMEOUT_MS). */
export const DEFAULT_TIMEOUT_MS = 300;

export class StoreTimeoutError extends StoreError {
  constructor() {
    super("store.timeout", "store call timed out");
  }
}

export class RedisStore implements Store {
  readonly kind = "redis" as const;
  private readonly client;
  private readonly timeoutMs: number;
  private lastState: "up" | "down" = "up";
  /** Members already parsed and checked (they never change once written), bounded. */
  private readonly checked = new Map<string, ShiftRecord>();

  constructor(
    url: string,
    private readonly now: () => number = Date.now,
    timeoutMs = DEFAULT_TIMEOUT_MS,
  ) {
    this.timeoutMs = timeoutMs;
    this.client = createClient({
      url,
      disableOfflineQueue: true,
      socket: {
        connectTimeout: 2000,
        // Back off up to 2 s between attempts, for ever: Redis coming back is the normal case.
        reconnectStrategy: (retries: number) => Math.min(50 * 2 ** retries, 2000),
      },
    });
    this.client.on("error", (error: unknown) => this.state("down", error));
    this.client.on("ready", () => this.state("up"));
  }

  private state(next: "up" | "down", error?: unknown): void {
    if (next === this.lastState) return;
    this.lastState = next;
    log(next === "up" ? "info" : "warn", next === "up" ? "store.redis-up" : "store.redis-down", {
      code: error ? errorCode(error) : "ready",
    });
  }

  /** Connects, waiting at most `timeoutMs`; the store keeps trying in the background after that. */
  async connect(timeoutMs = 3000): Promise<void> {
    const connecting = this.client.connect().then(
      () => undefined,
      (error: unknown) => this.state("down", error),
    );
    await Promise.race([connecting, new Promise((r) => setTimeout(r, timeoutMs).unref())]);
  }

  /** Every call is bounded: a hung Redis costs a caller at most `timeoutMs`, never its answer. */
  private bounded<T>(work: Promise<T>): Promise<T> {
    let timer: NodeJS.Timeout | undefined;
    return Promise.race([
      work,
      new Promise<never>((_, reject) => {
        timer = setTimeout(() => reject(new StoreTimeoutError()), this.timeoutMs);
      }),
    ]).finally(() => clearTimeout(timer));
  }

  async getSettings(channel: string): Promise<ChannelSettings> {
    const raw = await this.bounded(this.client.get(`${P}settings:${channel}`));
    return raw ? (JSON.parse(raw) as ChannelSettings) : {};
  }

  async setSettings(channel: string, settings: ChannelSettings): Promise<void> {
    await this.bounded(this.client.set(`${P}settings:${channel}`, JSON.stringify(settings)));
  }

  async addRecord(record: ShiftRecord, ttlMs: number): Promise<void> {
    const key = `${P}log:${record.channel}`;
    const expires = record.at + ttlMs;
    await this.bounded(
      this.client
        .multi()
        .zAdd(key, { score: expires, value: encode(record) })
        .pExpireAt(key, expires, "GT")
        .pExpireAt(key, expires, "NX")
        // When the log began: written with the first record, kept as long as the log.
        .set(`${P}logstart:${record.channel}`, String(record.at), { NX: true, PXAT: expires })
        .pExpireAt(`${P}logstart:${record.channel}`, expires, "GT")
        .exec(),
    );
  }

  async logStart(channel: string): Promise<number | undefined> {
    const raw = await this.bounded(this.client.get(`${P}logstart:${channel}`));
    return raw === null ? undefined : Number(raw);
  }

  async listRecords(channel: string, now: number): Promise<ShiftRecord[]> {
    const key = `${P}log:${channel}`;
    const [, members] = (await this.bounded(
      this.client.multi().zRemRangeByScore(key, "-inf", now).zRange(key, 0, -1).exec(),
    )) as unknown as [number, string[]];
    // What comes back from a shared store is checked, not trusted: a malformed record is skipped.
    const records: ShiftRecord[] = [];
    for (const member of members) {
      const id = member.slice(0, ID_END);
      const known = this.checked.get(id);
      if (known) {
        records.push(known);
        continue;
      }
      const parsed = ShiftRecordSchema.safeParse(decode(member, channel));
      if (parsed.success) {
        const record = Object.freeze(parsed.data as ShiftRecord);
        if (this.checked.size >= 50_000) this.checked.clear();
        this.checked.set(id, record);
        records.push(record);
      } else log("warn", "store.record-malformed");
    }
    return records.sort((a, b) => a.at - b.at);
  }

  async forget(channel: string): Promise<number> {
    const key = `${P}log:${channel}`;
    const [count] = (await this.bounded(
      this.client.multi().zCard(key).del(key).del(`${P}logstart:${channel}`).exec(),
    )) as unknown as [number, number];
    return count;
  }

  async forgetTag(channel: string, tag: string): Promise<number> {
    const key = `${P}log:${channel}`;
    const members = await this.bounded(this.client.zRange(key, 0, -1));
    // The tag is the second element of each member's array; only whole matches are removed.
    const mine = members.filter((m) => {
      try {
        return (JSON.parse(m) as unknown[])[1] === tag;
      } catch {
        return false;
      }
    });
    if (mine.length === 0) return 0;
    return await this.bounded(this.client.zRem(key, mine));
  }

  async saveReply(id: string, reply: string, ttlMs: number): Promise<void> {
    await this.bounded(this.client.set(`${P}reply:${id}`, reply, { PX: ttlMs }));
  }

  async loadReply(id: string): Promise<string | undefined> {
    return (await this.bounded(this.client.get(`${P}reply:${id}`))) ?? undefined;
  }

  async firstSeen(key: string, ttlMs: number): Promise<boolean> {
    return (await this.bounded(this.client.set(`${P}seen:${key}`, "1", { NX: true, PX: ttlMs }))) === "OK";
  }

  async hit(key: string, limit: number, windowMs: number): Promise<boolean> {
    const window = Math.floor(this.now() / windowMs);
    const k = `${P}rate:${key}:${window}`;
    const [count] = (await this.bounded(
      this.client.multi().incr(k).pExpire(k, windowMs, "NX").exec(),
    )) as unknown as [number];
    return count <= limit;
  }

  async ready(): Promise<boolean> {
    try {
      return this.client.isReady && (await this.bounded(this.client.ping())) === "PONG";
    } catch {
      return false;
    }
  }

  /** Quits politely within a second; a hung Redis is then disconnected, so shutdown always ends. */
  async close(): Promise<void> {
    if (!this.client.isOpen) return;
    let timer: NodeJS.Timeout | undefined;
    const quit = this.client.quit().then(
      () => true,
      () => false,
    );
    const done = await Promise.race([
      quit,
      new Promise<boolean>((r) => (timer = setTimeout(() => r(false), 1000))),
    ]);
    clearTimeout(timer);
    if (!done && this.client.isOpen) this.client.destroy();
  }
}

/** Length of `["<12 hex>"` — the start of every member, and its cache key. */
const ID_END = 16;

/** A record as a compact JSON array; the random id keeps two identical calculations apart. */
function encode(record: ShiftRecord): string {
  const inputs: number[] = [];
  INPUT_KEYS.forEach((k, i) => {
    const v = record.inputs[k];
    if (v !== undefined) inputs.push(i, v);
  });
  const results: number[] = [];
  RESULT_KEYS.forEach((k, i) => {
    const v = record.results[k];
    if (v !== undefined) results.push(i, v);
  });
  return JSON.stringify([
    randomBytes(6).toString("hex"),
    record.tag,
    record.at,
    inputs,
    results,
    record.flags,
  ]);
}

/** The record back from its array, or something the schema will refuse. */
function decode(member: string, channel: string): unknown {
  try {
    const [, tag, at, inputs, results, flags] = JSON.parse(member) as [
      string,
      unknown,
      unknown,
      number[],
      number[],
      unknown,
    ];
    const pairs = (list: number[], keys: readonly string[]) => {
      const out: Record<string, unknown> = {};
      for (let i = 0; i + 1 < list.length; i += 2) out[keys[list[i]!] ?? "?"] = list[i + 1];
      return out;
    };
    return {
      channel,
      tag,
      at,
      inputs: pairs(inputs, INPUT_KEYS),
      results: pairs(results, RESULT_KEYS),
      flags,
    };
  } catch {
    return undefined;
  }
}
