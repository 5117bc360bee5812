/**
 * Number formatting for replies and working: fixed decimals, no "-0", no trailing noise. Written
 * with integer arithmetic rather than toFixed, which is slow enough to show in the benchmarks.
 * Halves round away from zero (toFixed rounds the binary value instead; they differ only on
 * values like 1.005, and only in the last shown digit).
 */
const POW = [1, 10, 100, 1000, 10000, 100000, 1000000];

/** Exactly `decimals` places: fmt(286, 1) → "286.0"; fmt(-0.04, 1) → "0.0". */
export function fmt(value: number, decimals = 1): string {
  if (!Number.isFinite(value)) return String(value);
  const f = POW[decimals] ?? 10 ** decimals;
  const n = Math.round(Math.abs(value) * f);
  const sign = value < 0 && n !== 0 ? "-" : "";
  if (decimals === 0) return `${sign}${n}`;
  const whole = Math.floor(n / f);
  const frac = String(n - whole * f).padStart(decimals, "0");
  return `${sign}${whole}.${frac}`;
}

/** Up to `decimals` places, trailing zeros dropped: 128 → "128", 29.9734 → "29.97". */
export function num(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return String(value);
  // Whole numbers (most lab values) need no rounding; "-0" is shown as "0".
  if (Number.isInteger(value) && Math.abs(value) < 1e9) return value === 0 ? "0" : String(value);
  const f = POW[decimals] ?? 10 ** decimals;
  const n = Math.round(Math.abs(value) * f);
  const sign = value < 0 && n !== 0 ? "-" : "";
  // Whole and fraction as integers: turning a fractional double into text is several times slower.
  const whole = Math.floor(n / f);
  let frac = n - whole * f;
  if (frac === 0) return `${sign}${whole}`;
  let places = decimals;
  while (frac % 10 === 0) {
    frac /= 10;
    places--;
  }
  return `${sign}${whole}.${String(frac).padStart(places, "0")}`;
}

/** A signed difference: "+3.2", "−1.0" (true minus sign for legibility). */
export function signed(value: number, decimals = 1): string {
  const text = fmt(value, decimals);
  if (text.startsWith("-")) return `−${text.slice(1)}`;
  return Number(text) === 0 ? text : `+${text}`;
}
