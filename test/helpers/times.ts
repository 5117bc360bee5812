/**
 * Stored and logged text with its times blanked, for privacy tests that look for a leaked number:
 * an ISO timestamp, an epoch in milliseconds or a duration may hold any digits ("…T18:45:12.128Z",
 * 1796410161957), and would fail a search for "128", "0161" or "1957" by chance.
 */
export function withoutTimes(text: string): string {
  return text
    .replace(/\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(?:\.\d+)?Z/g, "<time>")
    .replace(/"ms":\d+(?:\.\d+)?/g, '"ms":0')
    .replace(/(?<!\d)1[78]\d{11}(?!\d)/g, "<epoch>");
}
