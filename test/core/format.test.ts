import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { typeset } from "../../bot/text.js";
import { fmt, num, signed } from "../../core/format.js";

describe("number formatting", () => {
  it("fixed decimals", () => {
    expect(fmt(286)).toBe("286.0");
    expect(fmt(299.974022513821)).toBe("300.0");
    expect(fmt(-15)).toBe("-15.0");
    expect(fmt(-0.04)).toBe("0.0");
    expect(fmt(0.05, 1)).toBe("0.1");
    expect(fmt(1.4193548, 2)).toBe("1.42");
    expect(fmt(540, 0)).toBe("540");
  });
  it("trailing zeros dropped", () => {
    expect(num(128)).toBe("128");
    expect(num(29.974022513821)).toBe("29.97");
    expect(num(-0.001)).toBe("0");
    expect(num(9.9950024987506)).toBe("10");
    expect(num(-0)).toBe("0");
    expect(num(-3)).toBe("-3");
    expect(num(12_345_678_901)).toBe("12345678901");
    expect(num(0.05)).toBe("0.05");
    expect(num(10.1)).toBe("10.1");
    expect(num(-2.104)).toBe("-2.1");
    expect(num(100.004)).toBe("100");
    expect(num(0.1234567, 6)).toBe("0.123457");
  });
  it("true minus signs before numbers, nowhere else", () => {
    expect(typeset("-5 at the start, gap -3.2 (-4) a/-1")).toBe("−5 at the start, gap −3.2 (−4) a/−1");
    expect(typeset("3-5 mmol/L, bed 4-B, x- 2, well-known, -")).toBe(
      "3-5 mmol/L, bed 4-B, x- 2, well-known, -",
    );
    expect(typeset("line\n-7")).toBe("line\n−7");
  });
  it("typeset agrees with the plain rule on any text (property)", () => {
    const rule = (t: string) => t.replace(/(^|[\s(/])-(?=\d)/g, "$1−");
    fc.assert(
      fc.property(fc.stringMatching(/^[-( /a1\n\t]{0,30}$/), (t) => {
        expect(typeset(t)).toBe(rule(t));
      }),
    );
  });
  it("signed", () => {
    expect(signed(13.0)).toBe("+13.0");
    expect(signed(-4.8)).toBe("−4.8");
    expect(signed(0)).toBe("0.0");
  });
  it("agrees with toFixed away from exact halves (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 3 }), (v, d) => {
        const f = 10 ** d;
        const frac = Math.abs(v * f) % 1;
        if (Math.abs(frac - 0.5) < 1e-6) return;
        const expected = Number(v.toFixed(d));
        expect(Number(fmt(v, d))).toBeCloseTo(Object.is(expected, -0) ? 0 : expected, 9);
        expect(Number(num(v, d))).toBeCloseTo(expected, 9);
        // The text itself, trailing zeros dropped: what JavaScript prints for the rounded number.
        expect(num(v, d)).toBe(String(expected));
      }),
    );
  });
});
