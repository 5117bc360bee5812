/** One contract for both store adapters; the Redis one runs against a real redis-server. */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../../adapters/store/memory.js";
import { RedisStore } from "../../../adapters/store/redis.js";
import type { ShiftRecord, Store } from "../../../bot/store.js";
import { startRedis, type TestRedis } from "../../helpers/redis.js";

/** A window long enough that no test run crosses into the next one. */
const YEAR = 365 * 24 * 3_600_000;
let redis: TestRedis;
const stores: Store[] = [];

beforeAll(async () => {
  redis = await startRedis();
});
afterAll(async () => {
  for (const s of stores) await s.close();
  await redis.stop();
});

const record = (channel: string, tag: string, at: number, sodium: number): ShiftRecord => ({
  channel,
  tag,
  at,
  inputs: { sodium },
  results: { effectiveOsmolality: 2 * sodium + 5 },
  flags: [],
});

describe.each([
  ["memory", async () => new MemoryStore()],
  [
    "redis",
    async () => {
      const s = new RedisStore(redis.url);
      await s.connect();
      return s;
    },
  ],
] as const)("%s store", (_, make) => {
  let store: Store;
  beforeEach(async () => {
    if (redis.owned) await redis.flush();
    store = await make();
    stores.push(store);
  });

  it("keeps channel settings, per channel", async () => {
    expect(await store.getSettings("c1")).toEqual({});
    await store.setSettings("c1", { unitSystem: "si" });
    expect(await store.getSettings("c1")).toEqual({ unitSystem: "si" });
    expect(await store.getSettings("c2")).toEqual({});
    await store.setSettings("c1", {});
    expect(await store.getSettings("c1")).toEqual({});
  });

  it("adds and lists records oldest first, per channel, identical ones kept apart", async () => {
    const now = Date.now();
    await store.addRecord(record("c1", "bed 2", now - 2000, 120), 60_000);
    await store.addRecord(record("c1", "bed 1", now - 3000, 118), 60_000);
    await store.addRecord(record("c1", "bed 1", now - 3000, 118), 60_000);
    await store.addRecord(record("c2", "bed 9", now, 140), 60_000);
    const list = await store.listRecords("c1", now);
    expect(list.map((r) => [r.tag, r.inputs.sodium])).toEqual([
      ["bed 1", 118],
      ["bed 1", 118],
      ["bed 2", 120],
    ]);
    expect(list[0]).toEqual(record("c1", "bed 1", now - 3000, 118));
  });

  it("honours expiry", async () => {
    const now = Date.now();
    await store.addRecord(record("c1", "bed 1", now, 118), 1000);
    expect(await store.listRecords("c1", now + 500)).toHaveLength(1);
    expect(await store.listRecords("c1", now + 1500)).toHaveLength(0);
  });

  it("a record lives until just before its expiry, and not at it", async () => {
    const now = Date.now();
    await store.addRecord(record("c1", "bed 1", now, 118), 1000);
    expect(await store.listRecords("c1", now + 999)).toHaveLength(1);
    expect(await store.listRecords("c1", now + 1000)).toHaveLength(0);
  });

  it("forgetTag removes one case only", async () => {
    const now = Date.now();
    const rec = (tag: string, at: number) => ({
      channel: "c9",
      tag,
      at,
      inputs: { sodium: 120 },
      results: {},
      flags: [],
    });
    await store.addRecord(rec("bed 12", now), 3_600_000);
    await store.addRecord(rec("bed 12", now + 1), 3_600_000);
    await store.addRecord(rec("bed 3", now + 2), 3_600_000);
    expect(await store.forgetTag("c9", "bed 12")).toBe(2);
    expect((await store.listRecords("c9", now)).map((r) => r.tag)).toEqual(["bed 3"]);
    expect(await store.forgetTag("c9", "bed 12")).toBe(0);
  });

  it("keeps a reply for its buttons until it expires", async () => {
    await store.saveReply("r-1", '{"headline":"h"}', 60_000);
    expect(await store.loadReply("r-1")).toBe('{"headline":"h"}');
    expect(await store.loadReply("r-2")).toBeUndefined();
    await store.saveReply("r-3", "x", 1);
    await new Promise((r) => setTimeout(r, 5));
    expect(await store.loadReply("r-3")).toBeUndefined();
  });

  it("forget clears the channel at once", async () => {
    const now = Date.now();
    await store.addRecord(record("c1", "bed 1", now, 118), 60_000);
    await store.addRecord(record("c2", "bed 1", now, 118), 60_000);
    expect(await store.forget("c1")).toBe(1);
    expect(await store.listRecords("c1", now)).toEqual([]);
    expect(await store.listRecords("c2", now)).toHaveLength(1);
    expect(await store.forget("c1")).toBe(0);
  });

  it("de-duplicates within the time given", async () => {
    expect(await store.firstSeen("ev1", 150)).toBe(true);
    expect(await store.firstSeen("ev1", 150)).toBe(false);
    expect(await store.firstSeen("ev2", 150)).toBe(true);
    await new Promise((r) => setTimeout(r, 250));
    expect(await store.firstSeen("ev1", 150)).toBe(true);
  });

  it("counts hits against a limit", async () => {
    const results: boolean[] = [];
    for (let i = 0; i < 5; i++) results.push(await store.hit("rate:c1", 3, YEAR));
    expect(results).toEqual([true, true, true, false, false]);
    expect(await store.hit("rate:c2", 3, YEAR)).toBe(true);
  });

  it("is ready", async () => {
    expect(await store.ready()).toBe(true);
  });
});

describe("the memory store's dump, for privacy scans", () => {
  it("shows every value it holds (a Map would stringify to {})", async () => {
    const store = new MemoryStore();
    await store.setSettings("c-dump", { unitSystem: "si" });
    await store.addRecord(record("c-dump", "bed 9", Date.now(), 131), 60_000);
    const dump = store.dump();
    for (const part of ["c-dump", "bed 9", "131", "si"]) expect(dump).toContain(part);
  });
});
