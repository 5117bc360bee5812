/**
 * The privacy guard's detector: finds what looks like a patient identifier in a message (HIPAA
 * Safe Harbor's list, 45 CFR 164.514(b)(2): names, dates, phone numbers, emails, URLs, IP
 * addresses, record and national numbers, ages over 89). It works on tokens, so every pattern runs
 * on a short string; it returns kinds and token positions, never the text itself.
 */
import { MAX_TOKEN_LENGTH, type Token } from "./tokens.js";

export type IdentifierKind =
  | "email"
  | "url"
  | "ip-address"
  | "phone-number"
  | "date"
  | "social-security-number"
  | "national-health-number"
  | "record-number"
  | "name"
  | "age-over-89";

export interface IdentifierHit {
  kind: IdentifierKind;
  /** Indexes into the token list, inclusive. */
  first: number;
  last: number;
}

export const IDENTIFIER_LABELS: Record<IdentifierKind, string> = {
  email: "an email address",
  url: "a web address",
  "ip-address": "an IP address",
  "phone-number": "a phone number",
  date: "a date",
  "social-security-number": "a social security number",
  "national-health-number": "a national health number",
  "record-number": "a record number",
  name: "a name",
  "age-over-89": "an age over 89",
};

const EMAIL = /^[^@\s]{0,64}@[^@\s.]{1,63}(\.[^@\s.]{1,63})+$/;
const URL_LIKE =
  /^(https?:\/\/|www\.)|^[a-z0-9-]{1,63}(\.[a-z0-9-]{1,63}){0,4}\.(com|org|net|gov|edu|io|uk|nhs|info|co)(\/|$)/i;
const IPV4 = /^(\d{1,3})\.(\d{1,3})\.(\d{1,3})\.(\d{1,3})$/;
const SSN = /^\d{3}-\d{2}-\d{4}$/;
const DATE_NUMERIC = /^(\d{1,4})[./-](\d{1,2})([./-](\d{2,4}))?$/;
const DATE_ISO = /^\d{4}-\d{2}-\d{2}(T.*)?$/;
const PHONE_PUNCT = /^\+?\(?\d{2,5}\)?[-.]\d{3,4}[-.]\d{3,4}$/;
/** With a country code: "+44-161-496-0000", "+1.555.201.7788". */
const PHONE_INTERNATIONAL = /^\+\d{1,3}[-.]\d{2,5}[-.]\d{3,4}[-.]\d{3,4}$/;
/** The part after a bracketed area code: "(0161)-496-0000" is the tokens "0161" and "-496-0000". */
const PHONE_AFTER_AREA = /^[-.]\d{3,4}[-.]\d{3,4}$/;
const DIGITS = /^\d+$/;
const DECIMAL = /^[<>]?\d+[.,]\d+$/;
const LONG_DIGITS = /\d{6,}/;
const AGE_GLUED = /^(\d{2,3})(yo|y\/o|yrs?|years?|yr-old|-year-old|-yo)$/i;
const MONTHS = new Set([
  "jan",
  "january",
  "feb",
  "february",
  "mar",
  "march",
  "apr",
  "april",
  "may",
  "jun",
  "june",
  "jul",
  "july",
  "aug",
  "august",
  "sep",
  "sept",
  "september",
  "oct",
  "october",
  "nov",
  "november",
  "dec",
  "december",
]);
const HONORIFICS = new Set([
  "mr",
  "mr.",
  "mrs",
  "mrs.",
  "ms",
  "ms.",
  "miss",
  "mx",
  "mx.",
  "dr",
  "dr.",
  "prof",
  "prof.",
  "sir",
  "madam",
  "mister",
]);
const NAME_LABELS = new Set(["name", "patient", "pt", "pt.", "surname", "forename"]);
const NUMBER_LABELS = new Set([
  "mrn",
  "mrn#",
  "nhs",
  "nhs#",
  "chi",
  "ur",
  "urn",
  "hosp",
  "hospital",
  "record",
  "id",
  "id#",
  "dob",
  "d.o.b",
  "d.o.b.",
  "born",
  "ssn",
  "phone",
  "tel",
  "ph",
  "mob",
  "mobile",
  "bleep",
]);
const AGE_WORDS = new Set([
  "yo",
  "y/o",
  "yrs",
  "yr",
  "years",
  "year",
  "years-old",
  "year-old",
  "yr-old",
  "y.o.",
  "y.o",
]);
const AGE_LEADS = new Set(["age", "aged", "ag"]);

/** UK NHS number check digit: weights 10..2 on the first nine digits, 11 − (sum mod 11), 11 → 0, 10 invalid. */
export function isValidNhsNumber(digits: string): boolean {
  if (!/^\d{10}$/.test(digits)) return false;
  let sum = 0;
  for (let i = 0; i < 9; i++) sum += Number(digits[i]) * (10 - i);
  let check = 11 - (sum % 11);
  if (check === 11) check = 0;
  if (check === 10) return false;
  return check === Number(digits[9]);
}

function isDate(text: string): boolean {
  if (DATE_ISO.test(text)) return true;
  const m = DATE_NUMERIC.exec(text);
  if (!m) return false;
  const a = Number(m[1]);
  const b = Number(m[2]);
  if (m[4] === undefined) {
    // "12/03" or "3-4" without a year: a day and a month, both small.
    return (
      m[1]!.length <= 2 &&
      a >= 1 &&
      a <= 31 &&
      b >= 1 &&
      b <= 31 &&
      (a <= 12 || b <= 12) &&
      text.includes("/")
    );
  }
  if (m[1]!.length === 4) return b >= 1 && b <= 12;
  return a >= 1 && a <= 31 && b >= 1 && b <= 31;
}

function isCapitalisedWord(text: string | undefined): boolean {
  return text !== undefined && /^[A-Z][a-z'’]{1,30}(-[A-Z]?[a-z'’]{1,30}){0,2}$/.test(text);
}

function isWord(text: string | undefined): boolean {
  return text !== undefined && /^[A-Za-z][A-Za-z'’]{0,30}(-[A-Za-z'’]{1,30}){0,2}$/.test(text);
}

/** After an honorific any word is taken for a name; after a label ("pt:"), a capitalised one. */
function isNameAt(
  tokens: readonly Token[],
  k: number,
  afterHonorific: boolean,
  isKnownWord: (lower: string) => boolean,
): boolean {
  const t = tokens[k]?.text;
  return (
    t !== undefined && !isKnownWord(t.toLowerCase()) && (afterHonorific ? isWord(t) : isCapitalisedWord(t))
  );
}

/** Every word that can start a multi-token identifier below; months also with a full stop. */
const LISTED_WORDS = new Set([
  ...MONTHS,
  ...[...MONTHS].map((m) => `${m}.`),
  ...HONORIFICS,
  ...NAME_LABELS,
  ...NUMBER_LABELS,
]);

/**
 * Finds identifiers in a token list. `isKnownWord` tells lab vocabulary ("Na", "glucose") apart
 * from a name that follows an honorific.
 */
export function findIdentifiers(
  tokens: readonly Token[],
  isKnownWord: (lower: string) => boolean = () => false,
): IdentifierHit[] {
  const hits: IdentifierHit[] = [];
  const hit = (kind: IdentifierKind, first: number, last = first) => hits.push({ kind, first, last });
  const lower = tokens.map((t) => t.text.toLowerCase());

  for (let i = 0; i < tokens.length; i++) {
    const text = tokens[i]!.text;
    const low = lower[i]!;
    if (text.length > MAX_TOKEN_LENGTH) {
      // Too long to be a lab word or to pattern-match safely; still look for the plain signs.
      if (text.includes("@")) hit("email", i);
      else if (text.includes("://") || low.startsWith("www.")) hit("url", i);
      else if (LONG_DIGITS.test(text)) hit("record-number", i);
      continue;
    }
    // Most tokens are plain words or plain numbers: only those with a digit, "@" or "." can be
    // any of the single-token identifiers below.
    // One scan says whether the token has a digit and whether it is nothing but digits.
    let digit = false;
    let allDigits = text.length > 0;
    for (let k = 0; k < text.length; k++) {
      const c = text.charCodeAt(k);
      if (c >= 48 && c <= 57) digit = true;
      else allDigits = false;
    }
    const dotted = !allDigits && text.includes(".");
    if (allDigits ? text.length < 6 : !digit && !dotted && !text.includes("@")) {
      // nothing to check alone (a short run of digits is no identifier by itself); the
      // multi-token checks follow
    } else if (text.includes("@") && EMAIL.test(text)) hit("email", i);
    else if (dotted && URL_LIKE.test(text)) hit("url", i);
    else if (!digit) {
      // words with a dot but no digit: only a URL could have matched
    } else if (IPV4.test(text) && text.split(".").every((p) => Number(p) <= 255)) hit("ip-address", i);
    else if (SSN.test(text)) hit("social-security-number", i);
    else if (isDate(text)) hit("date", i);
    else if (PHONE_PUNCT.test(text) || PHONE_INTERNATIONAL.test(text)) hit("phone-number", i);
    else if (AGE_GLUED.test(text) && Number(AGE_GLUED.exec(text)![1]) >= 90) hit("age-over-89", i);
    else if (LONG_DIGITS.test(DECIMAL.test(text) ? text.split(/[.,]/)[0]! : text)) {
      const digits = text.replace(/\D/g, "");
      hit(
        isValidNhsNumber(digits)
          ? "national-health-number"
          : digits.length >= 10 && /^\+/.test(text)
            ? "phone-number"
            : "record-number",
        i,
      );
    }

    // Runs of digit groups: "943 476 5919", "07700 900123", "555 123 4567", "(0161)-496-0000".
    if (allDigits && text.length >= 2 && text.length <= 5) {
      if (PHONE_AFTER_AREA.test(tokens[i + 1]?.text ?? "")) {
        hit("phone-number", i, i + 1);
        i++;
        continue;
      }
      let j = i;
      let digits = text;
      while (
        j + 1 < tokens.length &&
        DIGITS.test(tokens[j + 1]!.text) &&
        tokens[j + 1]!.text.length >= 3 &&
        digits.length < 11
      ) {
        j++;
        digits += tokens[j]!.text;
      }
      const lastGroup = tokens[j]!.text.length;
      if (j > i && digits.length >= 10 && digits.length <= 11 && lastGroup >= 4) {
        hit(isValidNhsNumber(digits) ? "national-health-number" : "phone-number", i, j);
        i = j;
        continue;
      }
    }

    // The checks below start from a listed word (a month, an honorific, a label) or from a
    // number of two or three digits (an age); any other token is done.
    if (digit ? !allDigits : !LISTED_WORDS.has(low)) continue;

    // A month name with a day or year beside it: "12 March", "March 12, 1950", "Jan 1950".
    if (!digit && MONTHS.has(low.endsWith(".") ? low.slice(0, -1) : low)) {
      const before = i > 0 && /^\d{1,4}(st|nd|rd|th)?$/i.test(tokens[i - 1]!.text);
      const after = i + 1 < tokens.length && /^\d{1,4}(st|nd|rd|th)?$/i.test(tokens[i + 1]!.text);
      if (before || after) {
        const first = before ? i - 1 : i;
        let last = after ? i + 1 : i;
        if (last + 1 < tokens.length && /^\d{4}$/.test(tokens[last + 1]!.text)) last++;
        hit("date", first, last);
        i = last;
        continue;
      }
    }

    // An honorific or a name label followed by capitalised words: "Mr Smith", "pt: John Smith".
    const honorific = HONORIFICS.has(low);
    if (honorific || (NAME_LABELS.has(low) && isNameAt(tokens, i + 1, honorific, isKnownWord))) {
      let last = i;
      while (last - i < 3 && isNameAt(tokens, last + 1, honorific, isKnownWord)) last++;
      if (last > i || honorific) {
        if (last > i) hit("name", i, last);
        i = last;
        continue;
      }
    }

    // A label that introduces a number: "MRN 4471", "DOB 3/4/51", "NHS 943 476 5919", "tel 0161…".
    // "pH 7.12" is a pH: "ph" introduces a phone number only when a long run of digits follows.
    const shortDecimal = low === "ph" && /^\d{1,2}([.,]\d{1,3})?$/.test(tokens[i + 1]?.text ?? "");
    if (NUMBER_LABELS.has(low) && !shortDecimal && i + 1 < tokens.length && /\d/.test(tokens[i + 1]!.text)) {
      let last = i + 1;
      while (last + 1 < tokens.length && /^\d+$/.test(tokens[last + 1]!.text) && last - i < 4) last++;
      const kind: IdentifierKind =
        low === "dob" || low.startsWith("d.o.b") || low === "born"
          ? "date"
          : low === "phone" || low === "tel" || low === "ph" || low === "mob" || low === "mobile"
            ? "phone-number"
            : low === "ssn"
              ? "social-security-number"
              : low.startsWith("nhs") || low === "chi"
                ? "national-health-number"
                : "record-number";
      hit(kind, i, last);
      i = last;
      continue;
    }

    // Ages over 89: "92 yo", "aged 93", "94 years old".
    if (allDigits && text.length >= 2 && text.length <= 3 && Number(text) >= 90 && Number(text) < 130) {
      const next = lower[i + 1];
      const prev = lower[i - 1];
      if ((next !== undefined && AGE_WORDS.has(next)) || (prev !== undefined && AGE_LEADS.has(prev))) {
        const first = prev !== undefined && AGE_LEADS.has(prev) ? i - 1 : i;
        const last = next !== undefined && AGE_WORDS.has(next) ? i + 1 : i;
        hit("age-over-89", first, last);
        i = last;
      }
    }
  }
  return hits;
}
