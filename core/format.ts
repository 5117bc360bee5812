/** Number formatting for replies and working: fixed decimals, no "-0", no trailing noise. */
export function fmt(value: number, decimals = 1): string {
  const rounded = Number(value.toFixed(decimals));
  return (Object.is(rounded, -0) ? 0 : rounded).toFixed(decimals);
}

/** Up to `decimals` places, trailing zeros dropped: 128 → "128", 29.9734 → "29.97". */
export function num(value: number, decimals = 2): string {
  const rounded = Number(value.toFixed(decimals));
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

/** A signed difference: "+3.2", "−1.0" (true minus sign for legibility). */
export function signed(value: number, decimals = 1): string {
  const text = fmt(value, decimals);
  if (text.startsWith("-")) return `−${text.slice(1)}`;
  return Number(text) === 0 ? text : `+${text}`;
}
