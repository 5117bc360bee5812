/** The in-memory store: the embedded default for one process. Expiry is checked on read and swept. */
import type { ChannelSettings, ShiftRecord, Store } from "../../bot/store.js";

interface Timed<T> {
  value: T;
  expires: number;
}

/** Replies kept for their buttons, at most (one process; Redis keeps them for every replica). */
const MAX_REPLIES = 5000;

export class MemoryStore implements Store {
  readonly kind = "memory" as const;
  private settings = new Map<string, ChannelSettings>();
  private records = new Map<string, Timed<ShiftRecord>[]>();
  private seen = new Map<string, number>();
  private counters = new Map<string, Timed<number>>();
  private replies = new Map<string, Timed<string>>();
  private starts = new Map<string, Timed<number>>();
  private sweeps = 0;

  constructor(private readonly now: () => number = Date.now) {}

  /** Every key and value held, as text: for privacy scans (JSON.stringify of a Map shows nothing). */
  dump(): string {
    const all = { settings: this.settings, records: this.records, seen: this.seen, counters: this.counters };
    return JSON.stringify(all, (_, v) => (v instanceof Map ? [...v.entries()] : v));
  }

  async getSettings(channel: string): Promise<ChannelSettings> {
    return { ...(this.settings.get(channel) ?? {}) };
  }

  async setSettings(channel: string, settings: ChannelSettings): Promise<void> {
    this.settings.set(channel, { ...settings });
  }

  async logStart(channel: string): Promise<number | undefined> {
    const s = this.starts.get(channel);
    return s && s.expires > this.now() ? s.value : undefined;
  }

  async addRecord(record: ShiftRecord, ttlMs: number): Promise<void> {
    const start = this.starts.get(record.channel);
    const expires = record.at + ttlMs;
    if (!start || start.expires <= this.now()) this.starts.set(record.channel, { value: record.at, expires });
    else if (expires > start.expires) start.expires = expires;
    const list = this.records.get(record.channel) ?? [];
    list.push({ value: deepFreeze(structuredClone(record)), expires: record.at + ttlMs });
    this.records.set(record.channel, list);
  }

  async listRecords(channel: string, now: number): Promise<ShiftRecord[]> {
    const list = (this.records.get(channel) ?? []).filter((r) => r.expires > now);
    if (list.length === 0) this.records.delete(channel);
    else this.records.set(channel, list);
    // Records are frozen when added, so they are handed out as they are, without copying.
    return list.map((r) => r.value).sort((a, b) => a.at - b.at);
  }

  async forget(channel: string): Promise<number> {
    const n = this.records.get(channel)?.length ?? 0;
    this.records.delete(channel);
    this.starts.delete(channel);
    return n;
  }

  async forgetTag(channel: string, tag: string): Promise<number> {
    const list = this.records.get(channel) ?? [];
    const kept = list.filter((r) => r.value.tag !== tag);
    this.records.set(channel, kept);
    return list.length - kept.length;
  }

  async saveReply(id: string, reply: string, ttlMs: number): Promise<void> {
    // Bounded: past MAX_REPLIES the oldest go first (a Map keeps insertion order).
    if (this.replies.size >= MAX_REPLIES) this.replies.delete(this.replies.keys().next().value!);
    this.replies.set(id, { value: reply, expires: this.now() + ttlMs });
  }

  async loadReply(id: string): Promise<string | undefined> {
    const r = this.replies.get(id);
    if (!r) return undefined;
    if (r.expires <= this.now()) {
      this.replies.delete(id);
      return undefined;
    }
    return r.value;
  }

  async firstSeen(key: string, ttlMs: number): Promise<boolean> {
    const now = this.now();
    this.sweep(now);
    const until = this.seen.get(key);
    if (until !== undefined && until > now) return false;
    this.seen.set(key, now + ttlMs);
    return true;
  }

  async hit(key: string, limit: number, windowMs: number): Promise<boolean> {
    const now = this.now();
    const window = Math.floor(now / windowMs);
    const slot = `${key}:${window}`;
    const counter = this.counters.get(slot);
    const count = (counter && counter.expires > now ? counter.value : 0) + 1;
    this.counters.set(slot, { value: count, expires: (window + 1) * windowMs });
    return count <= limit;
  }

  async ready(): Promise<boolean> {
    return true;
  }

  async close(): Promise<void> {}

  /** Every few hundred calls, drop expired de-duplication keys and counters so memory stays flat. */
  private sweep(now: number): void {
    if (++this.sweeps % 256 !== 0) return;
    for (const [k, until] of this.seen) if (until <= now) this.seen.delete(k);
    for (const [k, c] of this.counters) if (c.expires <= now) this.counters.delete(k);
    for (const [k, r] of this.replies) if (r.expires <= now) this.replies.delete(k);
  }
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object") {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}
