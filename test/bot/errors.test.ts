import { describe, expect, it } from "vitest";
import { StoreTimeoutError } from "../../adapters/store/redis.js";
import { loadConfig } from "../../bot/config.js";
import { ConfigError, SoluteError, StoreError } from "../../bot/errors.js";
import { errorCode } from "../../bot/log.js";

describe("errors carry a stable code", () => {
  it("a bad setting throws ConfigError with code config.invalid", () => {
    let caught: unknown;
    try {
      loadConfig({ SOLUTE_SECRET: "short" });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ConfigError);
    expect(caught).toBeInstanceOf(SoluteError);
    expect((caught as SoluteError).code).toBe("config.invalid");
    expect(errorCode(caught)).toBe("config.invalid");
  });

  it("a store timeout is a StoreError with code store.timeout, and its name is its class", () => {
    const e = new StoreTimeoutError();
    expect(e).toBeInstanceOf(StoreError);
    expect(e.name).toBe("StoreTimeoutError");
    expect(errorCode(e)).toBe("store.timeout");
  });

  it("the cause is kept but never becomes the logged code", () => {
    const cause = new Error("body: Na 128 for Mrs Example");
    const e = new StoreError("store.failed", "the store failed", { cause });
    expect(e.cause).toBe(cause);
    expect(errorCode(e)).toBe("store.failed");
  });
});
