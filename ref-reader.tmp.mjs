var __defProp = Object.defineProperty;
var __getOwnPropNames = Object.getOwnPropertyNames;
var __esm = (fn, res, err) => function __init() {
  if (err) throw err[0];
  try {
    return fn && (res = (0, fn[__getOwnPropNames(fn)[0]])(fn = 0)), res;
  } catch (e) {
    throw err = [e], e;
  }
};
var __export = (target, all) => {
  for (var name in all)
    __defProp(target, name, { get: all[name], enumerable: true });
};

// ../../tmp/refsrc/core/unit-math.ts
var unit_math_exports = {};
__export(unit_math_exports, {
  math: () => math
});
import { create, unitDependencies } from "mathjs";
var math;
var init_unit_math = __esm({
  "../../tmp/refsrc/core/unit-math.ts"() {
    math = create({ unitDependencies });
  }
});

// ../../tmp/refsrc/core/molar-mass.ts
var ATOMIC_WEIGHTS = {
  H: 1.008,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  Na: 22.99,
  K: 39.098,
  Cl: 35.45
};
function molarMass(formula) {
  let total = 0;
  for (const [element, count] of Object.entries(formula)) {
    total += ATOMIC_WEIGHTS[element] * count;
  }
  return total;
}

// ../../tmp/refsrc/core/units.ts
var math2;
var loading;
function loadUnits() {
  loading ??= Promise.resolve().then(() => (init_unit_math(), unit_math_exports)).then((m) => {
    math2 = m.math;
  });
  return loading;
}
function units() {
  if (!math2) throw new Error("units are not loaded: await loadUnits() first");
  return math2;
}
var MASS_UNITS = /* @__PURE__ */ new Set(["mg/dL", "mg/L", "g/L", "g/dL"]);
function isMassUnit(unit) {
  return MASS_UNITS.has(unit);
}
var cache = /* @__PURE__ */ new Map();
function massToMolarFactor(unit, molarMassGPerMol) {
  const key = `${unit}|${molarMassGPerMol}`;
  let factor = cache.get(key);
  if (factor === void 0) {
    if (!MASS_UNITS.has(unit)) throw new Error(`not a mass concentration unit: ${unit}`);
    const m = units();
    const amount = m.unit(1, unit).divide(m.unit(molarMassGPerMol, "g/mol"));
    factor = amount.toNumber("mmol/L");
    cache.set(key, factor);
  }
  return factor;
}
function massFactor(from, to) {
  const key = `${from}>${to}`;
  let factor = cache.get(key);
  if (factor === void 0) {
    factor = units().unit(1, from).toNumber(to);
    cache.set(key, factor);
  }
  return factor;
}

// ../../tmp/refsrc/core/analytes.ts
function withMass(formula) {
  return { formula, molarMass: molarMass(formula) };
}
var GLUCOSE_MM = molarMass({ C: 6, H: 12, O: 6 });
var N2_MM = molarMass({ N: 2 });
var UREA_MM = molarMass({ C: 1, H: 4, N: 2, O: 1 });
var ETHANOL_MM = molarMass({ C: 2, H: 6, O: 1 });
var mgdl = (mg, mm) => mg * 10 / mm;
var ALCOHOL_UNITS = ["mmol/L", "mg/dL", "mg/L", "g/L"];
var ALCOHOL_SYSTEM = { si: "mmol/L", conventional: "mg/dL" };
var ANALYTES = {
  sodium: {
    id: "sodium",
    name: "sodium",
    label: "Na",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ Na: 1 }),
    valence: 1,
    loinc: [{ code: "2951-2", property: "moles", confirmed: true }],
    // Typo guard 90–200 [common practice]; critical < 120 or > 160 (Kost, JAMA 1990;263:704).
    plausible: { min: 90, max: 200 },
    critical: { low: 120, high: 160 }
  },
  potassium: {
    id: "potassium",
    name: "potassium",
    label: "K",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ K: 1 }),
    valence: 1,
    loinc: [{ code: "2823-3", property: "moles", confirmed: true }],
    plausible: { min: 1, max: 12 },
    // Our own flags; potassium critical limits vary by lab [common practice].
    critical: { low: 2.5, high: 6.5 }
  },
  chloride: {
    id: "chloride",
    name: "chloride",
    label: "Cl",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ Cl: 1 }),
    valence: 1,
    loinc: [{ code: "2075-0", property: "moles", confirmed: false }],
    // Our own typo guard [common practice], wide on purpose.
    plausible: { min: 50, max: 160 }
  },
  bicarbonate: {
    id: "bicarbonate",
    name: "bicarbonate",
    label: "HCO3",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ H: 1, C: 1, O: 3 }),
    valence: 1,
    loinc: [{ code: "1963-8", property: "moles", confirmed: false }],
    plausible: { min: 1, max: 60 }
  },
  albumin: {
    id: "albumin",
    name: "albumin",
    label: "Alb",
    canonicalUnit: "g/L",
    units: ["g/L", "g/dL"],
    systemUnits: { si: "g/L", conventional: "g/dL" },
    loinc: [{ code: "1751-7", property: "mass", confirmed: false }],
    plausible: { min: 5, max: 70 }
  },
  glucose: {
    id: "glucose",
    name: "glucose",
    label: "glucose",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL", "mg/L", "g/L"],
    systemUnits: { si: "mmol/L", conventional: "mg/dL" },
    formula: { C: 6, H: 12, O: 6 },
    molarMass: GLUCOSE_MM,
    loinc: [
      { code: "2345-7", property: "mass", confirmed: true },
      { code: "14749-6", property: "moles", confirmed: true }
    ],
    // Typo guard 10–3000 mg/dL [common practice]; critical < 46 or > 484 mg/dL (Kost 1990).
    plausible: { min: mgdl(10, GLUCOSE_MM), max: mgdl(3e3, GLUCOSE_MM) },
    critical: { low: mgdl(46, GLUCOSE_MM), high: mgdl(484, GLUCOSE_MM) }
  },
  urea: {
    id: "urea",
    name: "urea",
    label: "urea",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL", "mg/L", "g/L"],
    // A bare "urea" under conventional units may mean BUN or urea itself: the reader asks.
    systemUnits: { si: "mmol/L" },
    formula: { C: 1, H: 4, N: 2, O: 1 },
    molarMass: UREA_MM,
    loinc: [
      { code: "3091-6", property: "mass", confirmed: true },
      { code: "22664-7", property: "moles", confirmed: true }
    ],
    // The BUN guard 1–300 mg/dL expressed as urea [common practice].
    plausible: { min: mgdl(1, N2_MM), max: mgdl(300, N2_MM) }
  },
  bun: {
    id: "bun",
    name: "blood urea nitrogen",
    label: "BUN",
    canonicalUnit: "mmol/L",
    units: ["mg/dL", "mmol/L", "mg/L", "g/L"],
    conventionalDefault: "mg/dL",
    // BUN counts urea's two nitrogen atoms: one mmol of BUN is one mmol of urea.
    formula: { N: 2 },
    molarMass: N2_MM,
    loinc: [
      { code: "3094-0", property: "mass", confirmed: true },
      { code: "14937-7", property: "moles", confirmed: true }
    ],
    plausible: { min: mgdl(1, N2_MM), max: mgdl(300, N2_MM) }
  },
  measuredOsmolality: {
    id: "measuredOsmolality",
    name: "measured osmolality",
    label: "measured osm",
    canonicalUnit: "mOsm/kg",
    units: ["mOsm/kg", "mOsm/L"],
    conventionalDefault: "mOsm/kg",
    loinc: [{ code: "2692-2", property: "osmolality", confirmed: true }],
    plausible: { min: 200, max: 450 }
  },
  ethanol: {
    id: "ethanol",
    name: "ethanol",
    label: "EtOH",
    canonicalUnit: "mmol/L",
    units: ALCOHOL_UNITS,
    systemUnits: ALCOHOL_SYSTEM,
    formula: { C: 2, H: 6, O: 1 },
    molarMass: ETHANOL_MM,
    loinc: [
      { code: "5643-2", property: "mass", confirmed: true },
      { code: "14719-9", property: "moles", confirmed: true }
    ],
    // Our own typo guard, 0–1500 mg/dL [common practice].
    plausible: { min: 0, max: mgdl(1500, ETHANOL_MM) }
  },
  methanol: alcohol("methanol", "methanol", "MeOH", { C: 1, H: 4, O: 1 }, 1e3),
  ethyleneGlycol: alcohol("ethyleneGlycol", "ethylene glycol", "EG", { C: 2, H: 6, O: 2 }, 1e3),
  isopropanol: alcohol("isopropanol", "isopropanol", "IPA", { C: 3, H: 8, O: 1 }, 1e3),
  acetone: alcohol("acetone", "acetone", "acetone", { C: 3, H: 6, O: 1 }, 1e3),
  propyleneGlycol: alcohol("propyleneGlycol", "propylene glycol", "PG", { C: 3, H: 8, O: 2 }, 1e3),
  mannitol: alcohol("mannitol", "mannitol", "mannitol", { C: 6, H: 14, O: 6 }, 5e3)
};
function alcohol(id, name, label, formula, maxMgPerDl) {
  const { molarMass: mm } = withMass(formula);
  return {
    id,
    name,
    label,
    canonicalUnit: "mmol/L",
    units: ALCOHOL_UNITS,
    systemUnits: ALCOHOL_SYSTEM,
    formula,
    molarMass: mm,
    loinc: [],
    // Our own typo guard [common practice].
    plausible: { min: 0, max: mgdl(maxMgPerDl, mm) }
  };
}
var FACTORS = /* @__PURE__ */ new Map();
function toCanonicalFactor(analyte, unit) {
  let byUnit = FACTORS.get(analyte.id);
  if (!byUnit) {
    byUnit = /* @__PURE__ */ new Map();
    FACTORS.set(analyte.id, byUnit);
  }
  if (byUnit.has(unit)) return byUnit.get(unit);
  const factor = computeFactor(analyte, unit);
  byUnit.set(unit, factor);
  return factor;
}
function computeFactor(analyte, unit) {
  if (!analyte.units.includes(unit)) return void 0;
  if (unit === analyte.canonicalUnit) return 1;
  if (unit === "mEq/L") return 1 / (analyte.valence ?? 1);
  if (unit === "mOsm/L") return 1;
  if (analyte.canonicalUnit === "g/L") return massFactor(unit, "g/L");
  if (isMassUnit(unit) && analyte.molarMass) return massToMolarFactor(unit, analyte.molarMass);
  if (unit === "mmol/L") return 1;
  return void 0;
}

// ../../tmp/refsrc/core/format.ts
var POW = [1, 10, 100, 1e3, 1e4, 1e5, 1e6];
function scaled(value, decimals) {
  const f = POW[decimals] ?? 10 ** decimals;
  const n = Math.round(Math.abs(value) * f);
  return { negative: value < 0 && n !== 0, n, f };
}
function num(value, decimals = 2) {
  if (!Number.isFinite(value)) return String(value);
  const { negative, n, f } = scaled(value, decimals);
  return `${negative ? "-" : ""}${n / f}`;
}

// ../../tmp/refsrc/core/tokens.ts
var MAX_TOKEN_LENGTH = 256;
var SEPARATORS = /* @__PURE__ */ new Set([
  " ",
  "	",
  "\n",
  "\r",
  "\f",
  "\v",
  ";",
  "=",
  ",",
  ":",
  "(",
  ")",
  "[",
  "]",
  "|",
  '"',
  "{",
  "}",
  "\xA0",
  "\u2028",
  "\u2029"
]);
function isDigit(c) {
  return c !== void 0 && c >= "0" && c <= "9";
}
function tokenize(text) {
  const tokens = [];
  let start = -1;
  for (let i = 0; i <= text.length; i++) {
    const c = text[i];
    let separator = c === void 0 || SEPARATORS.has(c) || c > "\x7F" && /\s/.test(c);
    if (separator && (c === "," || c === ":") && isDigit(text[i - 1]) && isDigit(text[i + 1]) && start >= 0) {
      separator = false;
    }
    if (separator && c === ":" && start >= 0 && text[i + 1] === "/" && text[i + 2] === "/") separator = false;
    if (!separator && start < 0) start = i;
    if (separator && start >= 0) {
      const piece = text.slice(start, i);
      if (piece !== "/" && piece !== "-" && piece !== "\u2013" && piece !== "." && piece !== "&") {
        tokens.push({ text: piece, start, end: i });
      }
      start = -1;
    }
  }
  return tokens;
}

// ../../tmp/refsrc/core/identifiers.ts
var IDENTIFIER_LABELS = {
  email: "an email address",
  url: "a web address",
  "ip-address": "an IP address",
  "phone-number": "a phone number",
  date: "a date",
  "social-security-number": "a social security number",
  "national-health-number": "a national health number",
  "record-number": "a record number",
  name: "a name",
  "age-over-89": "an age over 89"
};
var EMAIL = /^[^@\s]{0,64}@[^@\s.]{1,63}(\.[^@\s.]{1,63})+$/;
var URL_LIKE = /^(https?:\/\/|www\.)|^[a-z0-9-]{1,63}(\.[a-z0-9-]{1,63}){0,4}\.(com|org|net|gov|edu|io|uk|nhs|info|co)(\/|$)/i;
var IPV4 = /^(\d{1,3})\.(\d{1,3})\.(\d{1,3})\.(\d{1,3})$/;
var SSN = /^\d{3}-\d{2}-\d{4}$/;
var DATE_NUMERIC = /^(\d{1,4})[./-](\d{1,2})([./-](\d{2,4}))?$/;
var DATE_ISO = /^\d{4}-\d{2}-\d{2}(T.*)?$/;
var PHONE_PUNCT = /^\+?\(?\d{2,5}\)?[-.]\d{3,4}[-.]\d{3,4}$/;
var DIGITS = /^\d+$/;
var DECIMAL = /^[<>]?\d+[.,]\d+$/;
var LONG_DIGITS = /\d{6,}/;
var AGE_GLUED = /^(\d{2,3})(yo|y\/o|yrs?|years?|yr-old|-year-old|-yo)$/i;
var MONTHS = /* @__PURE__ */ new Set([
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
  "december"
]);
var HONORIFICS = /* @__PURE__ */ new Set([
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
  "mister"
]);
var NAME_LABELS = /* @__PURE__ */ new Set(["name", "patient", "pt", "pt.", "surname", "forename"]);
var NUMBER_LABELS = /* @__PURE__ */ new Set([
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
  "bleep"
]);
var AGE_WORDS = /* @__PURE__ */ new Set([
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
  "y.o"
]);
var AGE_LEADS = /* @__PURE__ */ new Set(["age", "aged", "ag"]);
function isValidNhsNumber(digits) {
  if (!/^\d{10}$/.test(digits)) return false;
  let sum = 0;
  for (let i = 0; i < 9; i++) sum += Number(digits[i]) * (10 - i);
  let check = 11 - sum % 11;
  if (check === 11) check = 0;
  if (check === 10) return false;
  return check === Number(digits[9]);
}
function isDate(text) {
  if (DATE_ISO.test(text)) return true;
  const m = DATE_NUMERIC.exec(text);
  if (!m) return false;
  const a = Number(m[1]);
  const b = Number(m[2]);
  if (m[4] === void 0) {
    return m[1].length <= 2 && a >= 1 && a <= 31 && b >= 1 && b <= 31 && (a <= 12 || b <= 12) && text.includes("/");
  }
  if (m[1].length === 4) return b >= 1 && b <= 12;
  return a >= 1 && a <= 31 && b >= 1 && b <= 31;
}
function isCapitalisedWord(text) {
  return text !== void 0 && /^[A-Z][a-z'’]{1,30}(-[A-Z]?[a-z'’]{1,30}){0,2}$/.test(text);
}
function isWord(text) {
  return text !== void 0 && /^[A-Za-z][A-Za-z'’]{0,30}(-[A-Za-z'’]{1,30}){0,2}$/.test(text);
}
function findIdentifiers(tokens, isKnownWord2 = () => false) {
  const hits = [];
  const hit = (kind, first, last = first) => hits.push({ kind, first, last });
  const lower = tokens.map((t) => t.text.toLowerCase());
  for (let i = 0; i < tokens.length; i++) {
    const text = tokens[i].text;
    const low = lower[i];
    if (text.length > MAX_TOKEN_LENGTH) {
      if (text.includes("@")) hit("email", i);
      else if (text.includes("://") || low.startsWith("www.")) hit("url", i);
      else if (LONG_DIGITS.test(text)) hit("record-number", i);
      continue;
    }
    const digit = /\d/.test(text);
    const dotted = text.includes(".");
    if (!digit && !dotted && !text.includes("@")) {
    } else if (text.includes("@") && EMAIL.test(text)) hit("email", i);
    else if (dotted && URL_LIKE.test(text)) hit("url", i);
    else if (!digit) {
    } else if (IPV4.test(text) && text.split(".").every((p) => Number(p) <= 255)) hit("ip-address", i);
    else if (SSN.test(text)) hit("social-security-number", i);
    else if (isDate(text)) hit("date", i);
    else if (PHONE_PUNCT.test(text)) hit("phone-number", i);
    else if (AGE_GLUED.test(text) && Number(AGE_GLUED.exec(text)[1]) >= 90) hit("age-over-89", i);
    else if (LONG_DIGITS.test(DECIMAL.test(text) ? text.split(/[.,]/)[0] : text)) {
      const digits = text.replace(/\D/g, "");
      hit(
        isValidNhsNumber(digits) ? "national-health-number" : digits.length >= 10 && /^\+/.test(text) ? "phone-number" : "record-number",
        i
      );
    }
    if (digit && text.length >= 2 && text.length <= 5 && DIGITS.test(text)) {
      let j = i;
      let digits = text;
      while (j + 1 < tokens.length && DIGITS.test(tokens[j + 1].text) && tokens[j + 1].text.length >= 3 && digits.length < 11) {
        j++;
        digits += tokens[j].text;
      }
      const lastGroup = tokens[j].text.length;
      if (j > i && digits.length >= 10 && digits.length <= 11 && lastGroup >= 4) {
        hit(isValidNhsNumber(digits) ? "national-health-number" : "phone-number", i, j);
        i = j;
        continue;
      }
    }
    if (!digit && low.length <= 10 && MONTHS.has(low.endsWith(".") ? low.slice(0, -1) : low)) {
      const before = i > 0 && /^\d{1,4}(st|nd|rd|th)?$/i.test(tokens[i - 1].text);
      const after = i + 1 < tokens.length && /^\d{1,4}(st|nd|rd|th)?$/i.test(tokens[i + 1].text);
      if (before || after) {
        const first = before ? i - 1 : i;
        let last = after ? i + 1 : i;
        if (last + 1 < tokens.length && /^\d{4}$/.test(tokens[last + 1].text)) last++;
        hit("date", first, last);
        i = last;
        continue;
      }
    }
    const nameAt = (k) => {
      const t = tokens[k]?.text;
      return t !== void 0 && !isKnownWord2(t.toLowerCase()) && (HONORIFICS.has(low) ? isWord(t) : isCapitalisedWord(t));
    };
    if (HONORIFICS.has(low) || NAME_LABELS.has(low) && nameAt(i + 1)) {
      let last = i;
      while (last - i < 3 && nameAt(last + 1)) last++;
      if (last > i || HONORIFICS.has(low)) {
        if (last > i) hit("name", i, last);
        i = last;
        continue;
      }
    }
    if (NUMBER_LABELS.has(low) && i + 1 < tokens.length && /\d/.test(tokens[i + 1].text)) {
      let last = i + 1;
      while (last + 1 < tokens.length && /^\d+$/.test(tokens[last + 1].text) && last - i < 4) last++;
      const kind = low === "dob" || low.startsWith("d.o.b") || low === "born" ? "date" : low === "phone" || low === "tel" || low === "ph" || low === "mob" || low === "mobile" ? "phone-number" : low === "ssn" ? "social-security-number" : low.startsWith("nhs") || low === "chi" ? "national-health-number" : "record-number";
      hit(kind, i, last);
      i = last;
      continue;
    }
    if (digit && /^\d{2,3}$/.test(text) && Number(text) >= 90 && Number(text) < 130) {
      const next = lower[i + 1];
      const prev = lower[i - 1];
      if (next !== void 0 && AGE_WORDS.has(next) || prev !== void 0 && AGE_LEADS.has(prev)) {
        const first = prev !== void 0 && AGE_LEADS.has(prev) ? i - 1 : i;
        const last = next !== void 0 && AGE_WORDS.has(next) ? i + 1 : i;
        hit("age-over-89", first, last);
        i = last;
      }
    }
  }
  return hits;
}

// ../../tmp/refsrc/core/inputs.ts
import { z } from "zod";
var INPUT_KEYS = [
  "sodium",
  "potassium",
  "chloride",
  "bicarbonate",
  "albumin",
  "glucose",
  "urea",
  "measuredOsmolality",
  "ethanol",
  "methanol",
  "ethyleneGlycol",
  "isopropanol",
  "acetone",
  "propyleneGlycol",
  "mannitol"
];
function guarded(id) {
  const { plausible, name, canonicalUnit } = ANALYTES[id];
  return z.number().finite().min(plausible.min, {
    message: `${name} below ${round(plausible.min)} ${canonicalUnit} is not plausible`
  }).max(plausible.max, {
    message: `${name} above ${round(plausible.max)} ${canonicalUnit} is not plausible`
  }).optional();
}
function round(n) {
  return Math.round(n * 10) / 10;
}
var LabInputsSchema = z.object(
  Object.fromEntries(INPUT_KEYS.map((k) => [k, guarded(k)]))
).strict();

// ../../tmp/refsrc/core/vocabulary.ts
var ANALYTE_ALIASES = {
  sodium: ["na", "na+", "sodium", "s-na", "sna"],
  potassium: ["k", "k+", "potassium"],
  chloride: ["cl", "cl-", "chloride"],
  bicarbonate: ["hco3", "hco3-", "bicarb", "bicarbonate", "tco2", "co2", "total co2"],
  albumin: ["alb", "albumin"],
  glucose: ["glucose", "glu", "gluc", "glc", "bg", "bgl", "bsl", "blood glucose", "blood sugar", "sugar"],
  urea: ["urea"],
  bun: ["bun", "urea nitrogen", "blood urea nitrogen", "urea n"],
  measuredOsmolality: [
    "osm",
    "osmo",
    "osmol",
    "osmolality",
    "osmolarity",
    "measured osm",
    "measured osmo",
    "measured osmolality",
    "serum osm",
    "serum osmolality",
    "plasma osm",
    "plasma osmolality",
    "s osm",
    "p osm",
    "sosm",
    "posm",
    "mosm"
  ],
  ethanol: ["etoh", "ethanol", "alcohol", "blood alcohol"],
  methanol: ["meoh", "methanol"],
  ethyleneGlycol: ["ethylene glycol", "ethyleneglycol", "eg"],
  isopropanol: ["isopropanol", "isopropyl alcohol", "isopropyl", "ipa"],
  acetone: ["acetone"],
  propyleneGlycol: ["propylene glycol", "propyleneglycol", "pg"],
  mannitol: ["mannitol"]
};
var CLAIM_ALIASES = {
  calculatedOsmolality: [
    "calc osm",
    "calc osmo",
    "calc osmolality",
    "calculated osm",
    "calculated osmolality",
    "calculated osmolarity",
    "calc osmolarity",
    "cosm",
    "osmc"
  ],
  effectiveOsmolality: ["effective osm", "effective osmolality", "eff osm", "tonicity"],
  osmolalGap: ["gap", "osmolal gap", "osmolar gap", "osm gap", "og"],
  correctedSodium: ["corrected na", "corr na", "na corr", "corrected sodium", "na corrected", "cna"],
  anionGap: ["anion gap", "ag"]
};
var MODIFIERS = /* @__PURE__ */ new Set([
  "serum",
  "plasma",
  "blood",
  "venous",
  "arterial",
  "lab",
  "s",
  "p",
  "vbg",
  "abg"
]);
var FILLER = /* @__PURE__ */ new Set([
  "and",
  "with",
  "plus",
  "also",
  "then",
  "now",
  "of",
  "is",
  "was",
  "at",
  "on",
  "the",
  "a",
  "an",
  "labs",
  "lab",
  "level",
  "levels",
  "values",
  "value",
  "result",
  "results",
  "please",
  "pls",
  "thanks",
  "hi",
  "hello",
  "repeat",
  "new",
  "latest",
  "today",
  "tonight",
  "overnight",
  "here",
  "are",
  "&",
  "+",
  "->",
  "\u2192",
  "/"
]);
var UNIT_SPELLINGS = [
  ["mmol/l", "mmol/L"],
  ["mmol/litre", "mmol/L"],
  ["mmol/liter", "mmol/L"],
  ["mmol", "mmol/L"],
  ["mm", "mmol/L"],
  ["meq/l", "mEq/L"],
  ["meq", "mEq/L"],
  ["mg/dl", "mg/dL"],
  ["mg%", "mg/dL"],
  ["mg/100ml", "mg/dL"],
  ["mg/l", "mg/L"],
  ["g/l", "g/L"],
  ["g/dl", "g/dL"],
  ["g%", "g/dL"],
  ["mosm/kg", "mOsm/kg"],
  ["mosmol/kg", "mOsm/kg"],
  ["mosm/kgh2o", "mOsm/kg"],
  ["mosm", "mOsm/kg"],
  ["mosm/l", "mOsm/L"],
  ["mosmol/l", "mOsm/L"]
].slice().sort((a, b) => b[0].length - a[0].length);
var INCOMPLETE_UNITS = /* @__PURE__ */ new Set(["mg", "g", "mol", "mmols"]);
var TAG_WORDS = /* @__PURE__ */ new Set(["bed", "bay", "room", "cubicle", "cube"]);

// ../../tmp/refsrc/core/reader.ts
var PHRASES = /* @__PURE__ */ new Map();
var longestPhrase = 1;
for (const [id, aliases] of Object.entries(ANALYTE_ALIASES)) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "analyte", id });
}
for (const [id, aliases] of Object.entries(CLAIM_ALIASES)) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "claim", id });
}
for (const key of PHRASES.keys()) longestPhrase = Math.max(longestPhrase, key.split(" ").length);
var PHRASE_STARTS = new Set(
  [...PHRASES.keys()].filter((k) => k.includes(" ")).map((k) => k.split(" ")[0])
);
var UNIT_BY_SPELLING = new Map(UNIT_SPELLINGS.map(([spelling, unit]) => [spelling, unit]));
function isKnownWord(lower) {
  return PHRASES.has(lower) || FILLER.has(lower) || MODIFIERS.has(lower) || TAG_WORDS.has(lower) || unitOf(lower) !== void 0;
}
var NUMBER = /^([<>≤≥]?[-−]?)(\d{1,6}(?:[.,]\d{1,20})?|[.,]\d{1,20})$/;
var NUMBER_THEN_REST = /^([<>≤≥]?\d{1,6}(?:[.,]\d{1,20})?)([^\d.,].*)$/;
function unitOf(text) {
  return UNIT_BY_SPELLING.get(text.toLowerCase());
}
function parseNumber(text) {
  const m = NUMBER.exec(text);
  if (!m) return void 0;
  const sign = m[1].replace(/[-−]/, "");
  const negative = /[-−]/.test(m[1]);
  let body = m[2];
  const ambiguous = /^\d{1,3},\d{3}$/.test(body);
  body = body.replace(",", ".");
  return {
    value: (negative ? -1 : 1) * Number(body),
    below: sign === "<" || sign === "\u2264",
    above: sign === ">" || sign === "\u2265",
    ambiguous
  };
}
function splitGlued(token) {
  const text = token.text;
  const low = text.toLowerCase();
  if (PHRASES.has(low) || unitOf(text) || NUMBER.test(text) || text.length > MAX_TOKEN_LENGTH) return [token];
  const firstDigit = low.search(/\d/);
  for (let cut = Math.min(low.length - 1, 12, firstDigit < 0 ? 0 : low.length); cut >= 1; cut--) {
    const head = low.slice(0, cut);
    const rest = text.slice(cut);
    if (PHRASES.has(head) && /^[<>≤≥]?\d/.test(rest)) {
      return [
        { text: text.slice(0, cut), start: token.start, end: token.start + cut },
        ...splitGlued({ text: rest, start: token.start + cut, end: token.end })
      ];
    }
  }
  const m = NUMBER_THEN_REST.exec(text);
  if (m && (unitOf(m[2]) || INCOMPLETE_UNITS.has(m[2].toLowerCase()))) {
    const cut = m[1].length;
    return [
      { text: m[1], start: token.start, end: token.start + cut },
      { text: m[2], start: token.start + cut, end: token.end }
    ];
  }
  return [token];
}
var TAG_CODE = /^[A-Za-z0-9][A-Za-z0-9-]{0,9}$/;
function checkTag(code) {
  if (!TAG_CODE.test(code)) {
    return {
      ok: false,
      reason: "A case tag is a short bed or bay code of letters and digits, like bed 12, bay 4B or #ICU3."
    };
  }
  if (!/\d/.test(code)) {
    return {
      ok: false,
      reason: "A case tag without a digit could be a name: use a bed or bay code with a number, like bed 12 or #4B."
    };
  }
  if (/\d{5,}/.test(code)) {
    return {
      ok: false,
      reason: "A case tag with a long run of digits could be a record number: use a bed or bay code, like bed 12."
    };
  }
  return { ok: true, tag: code.toUpperCase() };
}
var ordinal = (n) => `word ${n + 1}`;
var isAscii = (text) => {
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) > 127) return false;
  return true;
};
function readMessage(text, options = {}) {
  const problems = [];
  const notes = [];
  const values = [];
  const claims = [];
  let tag;
  const raw = tokenize(isAscii(text) ? text : text.normalize("NFKC"));
  const hits = findIdentifiers(raw, isKnownWord);
  const masked = /* @__PURE__ */ new Set();
  for (const h of hits) for (let i2 = h.first; i2 <= h.last; i2++) masked.add(i2);
  const identifiers = [...new Set(hits.map((h) => h.kind))];
  if (identifiers.length > 0) {
    problems.push({
      code: "privacy.identifier",
      message: `This message seems to contain ${listOf(identifiers.map((k) => IDENTIFIER_LABELS[k]))}. Please delete it from the channel; Solute has not kept it. Tag cases by bed or bay instead (bed 12, #4B).`
    });
  }
  const tokens = [];
  for (let i2 = 0; i2 < raw.length; i2++) {
    const t = raw[i2];
    const isMasked = masked.has(i2);
    for (const p of isMasked ? [t] : splitGlued(t))
      tokens.push({ text: p.text, start: p.start, end: p.end, masked: isMasked, word: i2 });
  }
  const lower = tokens.map((t) => t.text.toLowerCase());
  const unknownWords = [];
  let i = 0;
  while (i < tokens.length) {
    const token = tokens[i];
    if (token.masked) {
      i++;
      continue;
    }
    const low = lower[i];
    if (low.startsWith("#") || TAG_WORDS.has(low) && i + 1 < tokens.length && !tokens[i + 1].masked) {
      const code = low.startsWith("#") ? token.text.slice(1) : tokens[i + 1].text;
      const prefix = low.startsWith("#") ? "" : `${low} `;
      const last = low.startsWith("#") ? i : i + 1;
      const checked = checkTag(code);
      const at = { start: token.start, end: tokens[last].end };
      if (!checked.ok) problems.push({ code: "tag.refused", message: checked.reason, at });
      else if (tag !== void 0 && tag !== prefix + checked.tag) {
        problems.push({
          code: "tag.multiple",
          message: "More than one case tag: one message, one case.",
          at
        });
      } else tag = prefix + checked.tag;
      i = last + 1;
      continue;
    }
    let match;
    if (PHRASE_STARTS.has(low)) {
      let phrase = low;
      const candidates = [];
      for (let n = 2; n <= longestPhrase && i + n <= tokens.length && !tokens[i + n - 1].masked; n++) {
        phrase = `${phrase} ${lower[i + n - 1]}`;
        const vocab = PHRASES.get(phrase);
        if (vocab) candidates.push({ vocab, length: n });
      }
      match = candidates.at(-1);
    }
    if (!match) {
      const vocab = PHRASES.get(low);
      if (vocab) match = { vocab, length: 1 };
    }
    if (!match && MODIFIERS.has(low)) {
      i++;
      continue;
    }
    if (!match) {
      if (FILLER.has(low)) {
        i++;
        continue;
      }
      if (parseNumber(token.text)) {
        problems.push({
          code: "number.orphan",
          message: `A number with no name before it (${ordinal(token.word)}) was not used. Write the name first, like Na 128.`,
          at: { start: token.start, end: token.end }
        });
      } else if (unitOf(token.text)) {
        problems.push({
          code: "unit.orphan",
          message: `A unit with no value before it (${ordinal(token.word)}) was not used.`,
          at: { start: token.start, end: token.end }
        });
      } else {
        unknownWords.push(token.word);
      }
      i++;
      continue;
    }
    const nameEnd = i + match.length;
    const nameStart = i;
    const label = match.length === 1 ? token.text : tokens.slice(nameStart, nameEnd).map((t) => t.text).join(" ");
    let j = nameEnd;
    let unitBefore;
    if (j < tokens.length && !tokens[j].masked && unitOf(tokens[j].text))
      unitBefore = unitOf(tokens[j++].text);
    const numberToken = j < tokens.length && !tokens[j].masked ? tokens[j] : void 0;
    const parsed = numberToken ? parseNumber(numberToken.text) : void 0;
    if (!parsed) {
      problems.push({
        code: "value.missing",
        message: `${label} has no number after it, so it was not used.`,
        at: { start: token.start, end: tokens[nameEnd - 1].end }
      });
      i = nameEnd;
      continue;
    }
    j++;
    let unitAfter;
    let incomplete = false;
    if (j < tokens.length && !tokens[j].masked) {
      unitAfter = unitOf(tokens[j].text);
      if (unitAfter) j++;
      else if (INCOMPLETE_UNITS.has(lower[j])) {
        incomplete = true;
        j++;
      }
    }
    const end = tokens[j - 1].end;
    i = j;
    const place = { start: token.start, end };
    if (parsed.ambiguous) {
      problems.push({
        code: "value.ambiguousNumber",
        message: `${label} ${numberToken.text}: is the comma a decimal point or a thousands separator? Write it without the comma (e.g. 1200 or 1.2).`,
        at: place
      });
      continue;
    }
    if (match.vocab.kind === "claim") {
      if (parsed.below || parsed.above) {
        problems.push({
          code: "value.censored",
          message: `A claimed ${label} needs a plain number.`,
          at: place
        });
      } else claims.push({ kind: match.vocab.id, value: parsed.value, start: place.start, end: place.end });
      continue;
    }
    const analyte = ANALYTES[match.vocab.id];
    if (incomplete) {
      problems.push({
        code: "unit.incomplete",
        message: `${label} ${numberToken.text} ${tokens[j - 1].text}: per what volume? Write mg/dL, mg/L or g/L.`,
        at: place
      });
      continue;
    }
    if (unitBefore && unitAfter && unitBefore !== unitAfter) {
      problems.push({
        code: "unit.conflict",
        message: `${label} has two different units; write one.`,
        at: place
      });
      continue;
    }
    const written = unitAfter ?? unitBefore;
    const resolved = resolveUnit(analyte, written, options.unitSystem);
    if ("problem" in resolved) {
      problems.push({ ...resolved.problem(label, numberToken.text), at: place });
      continue;
    }
    if (parsed.above) {
      problems.push({
        code: "value.censored",
        message: `${label} ${numberToken.text} is above the measuring range: it cannot be calculated with. Ask the lab for the diluted value.`,
        at: place
      });
      continue;
    }
    if (parsed.below && analyte.plausible.min > 0) {
      problems.push({
        code: "value.censored",
        message: `${label} ${numberToken.text} is below the measuring range: it cannot be calculated with.`,
        at: place
      });
      continue;
    }
    const factor = toCanonicalFactor(analyte, resolved.unit);
    const canonical = parsed.below ? 0 : parsed.value * factor;
    const key = analyte.id === "bun" ? "urea" : analyte.id;
    if (canonical < analyte.plausible.min || canonical > analyte.plausible.max) {
      const lo = num(analyte.plausible.min / factor, 1);
      const hi = num(analyte.plausible.max / factor, 1);
      let hint = " Check for a typo.";
      const other = otherUnitThatFits(analyte, parsed.value, resolved.unit);
      if (other && resolved.source !== "written") hint = ` If it is in ${other}, write the unit.`;
      problems.push({
        code: "value.implausible",
        message: `${analyte.name} ${num(parsed.value, 6)} ${resolved.unit} is outside ${lo}\u2013${hi} ${resolved.unit}, so it was not used.${hint}`,
        at: place
      });
      continue;
    }
    values.push({
      key,
      analyte: analyte.id,
      written: parsed.value,
      unit: resolved.unit,
      unitSource: resolved.source,
      canonical,
      ...parsed.below && { below: true },
      start: place.start,
      end: place.end
    });
    if (parsed.below)
      notes.push(
        `${analyte.name} written as below ${numberToken.text.slice(1)} ${resolved.unit}: counted as 0.`
      );
    if (analyte.id === "urea" && (resolved.unit === "mg/dL" || resolved.unit === "mg/L" || resolved.unit === "g/L")) {
      notes.push(
        `urea ${num(parsed.value, 6)} ${resolved.unit} read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN ${num(parsed.value, 6)}.`
      );
    }
    if (resolved.unit === "mOsm/L")
      notes.push("Osmolality written per litre is read as mOsm/kg, as osmometers report it.");
  }
  if (unknownWords.length > 0) {
    const where = [...new Set(unknownWords)].slice(0, 6).map((w) => w + 1).join(", ");
    problems.push({
      code: "word.unknown",
      message: `${unknownWords.length === 1 ? "One word was" : `${unknownWords.length} words were`} not understood and not used (word ${where}). Write values as name, number, unit \u2014 like Na 128, glucose 540 mg/dL.`
    });
  }
  const merged = mergeDuplicates(values, problems);
  const inputs = {};
  for (const v of merged) inputs[v.key] = v.canonical;
  return {
    inputs,
    problems: capped(problems),
    values: merged,
    claims,
    ...tag !== void 0 && { tag },
    notes: notes.length === 0 ? notes : [...new Set(notes)].slice(0, MAX_PER_CODE * 2),
    echo: echoOf(merged),
    identifiers
  };
}
function resolveUnit(analyte, written, system) {
  if (written) {
    if (toCanonicalFactor(analyte, written) === void 0) {
      return {
        problem: (label, value) => ({
          code: "unit.notForAnalyte",
          message: `${label} ${value} ${written}: ${analyte.name} is not given in ${written}. Use ${analyte.units.join(" or ")}.`
        })
      };
    }
    return { unit: written, source: "written" };
  }
  if (analyte.conventionalDefault) return { unit: analyte.conventionalDefault, source: "convention" };
  const bySystem = system ? analyte.systemUnits?.[system] : void 0;
  if (bySystem) return { unit: bySystem, source: "channel" };
  const choices = analyte.id === "urea" ? "mmol/L, or mg/dL \u2014 and if mg/dL, urea or BUN (urea nitrogen)" : analyte.systemUnits ? Object.values(analyte.systemUnits).join(" or ") : analyte.units.join(" or ");
  return {
    problem: (label, value) => ({
      code: "unit.ambiguous",
      message: `${label} ${value} has no unit, and it could be ${choices}.${fitsOnly(analyte, value)} Write the unit (e.g. ${label} ${value} ${analyte.systemUnits?.si ?? analyte.units[0]}) or set the channel's units.`
    })
  };
}
function fitsOnly(analyte, text) {
  const parsed = parseNumber(text);
  if (!parsed) return "";
  const fits = analyte.units.filter((u) => {
    const c = parsed.value * toCanonicalFactor(analyte, u);
    return c >= analyte.plausible.min && c <= analyte.plausible.max;
  });
  if (fits.length === 0) return " No unit makes it plausible: check for a typo.";
  return fits.length === 1 ? ` Only ${fits[0]} would be plausible.` : "";
}
var MAX_PER_CODE = 3;
function capped(problems) {
  const seen = /* @__PURE__ */ new Map();
  const out = [];
  for (const p of problems) {
    const n = (seen.get(p.code) ?? 0) + 1;
    seen.set(p.code, n);
    if (n <= MAX_PER_CODE) out.push(p);
  }
  for (const [code, n] of seen) {
    if (n > MAX_PER_CODE) out.push({ code, message: `\u2026and ${n - MAX_PER_CODE} more like this.` });
  }
  return out;
}
function listOf(items) {
  return items.length <= 1 ? items[0] ?? "" : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
}
function otherUnitThatFits(analyte, value, used) {
  for (const unit of analyte.units) {
    if (unit === used) continue;
    const c = value * toCanonicalFactor(analyte, unit);
    if (c >= analyte.plausible.min && c <= analyte.plausible.max) return unit;
  }
  return void 0;
}
function mergeDuplicates(values, problems) {
  const byKey = /* @__PURE__ */ new Map();
  for (const v of values) {
    const list = byKey.get(v.key);
    if (list) list.push(v);
    else byKey.set(v.key, [v]);
  }
  const kept = [];
  for (const [key, list] of byKey) {
    const first = list[0];
    const agree = list.every(
      (v) => Math.abs(v.canonical - first.canonical) <= 0.01 * Math.max(1, Math.abs(first.canonical))
    );
    if (agree) kept.push(first);
    else {
      const name = key === "urea" && list.some((v) => v.analyte === "bun") ? "urea and BUN" : ANALYTES[key].name;
      problems.push({
        code: "value.conflict",
        message: `${name} given more than once with different values (${list.map((v) => `${num(v.written, 6)} ${v.unit}`).join(", ")}): none of them was used. Send one value.`
      });
    }
  }
  return kept.sort((a, b) => INPUT_KEYS.indexOf(a.key) - INPUT_KEYS.indexOf(b.key));
}
function echoOf(values) {
  if (values.length === 0) return "";
  return values.map((v) => {
    const analyte = ANALYTES[v.analyte];
    const shown = `${analyte.label} ${v.below ? "<" : ""}${num(v.written, 6)} ${v.unit}`;
    const converted = v.unit !== analyte.canonicalUnit || v.analyte === "bun" ? ` = ${num(v.canonical)} ${analyte.canonicalUnit}${v.analyte === "bun" ? " urea" : ""}` : "";
    const source = v.unitSource === "channel" ? " (unit from the channel's setting)" : "";
    return shown + converted + source;
  }).join(", ");
}

// ../../tmp/refsrc/bench/corpus.ts
var CORPUS = [
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
  "sodium: 152 mEq/L\nBUN 28",
  "NA=131; GLU=38,5 mmol/L",
  "na 118, K 3.1, serum osm 250",
  "Na+ 133 / K+ 4.4 / Cl 99 / HCO3 12",
  "Na128 K3.1 glu30mmol/L",
  "plasma sodium 126 mmol/l, measured osmolality 262 mOsm/kg",
  "Glucose (mg/dL): 612  BUN: 44  Na: 149",
  "na 139 glu 6.1 mmol/l urea 5.2 mmol/l osmo 318 EtOH 230 mg/dL",
  "Na 140 glucose 5.5 mM urea 4 mM osm 302 methanol 32 mg/dL",
  "alb 2.1 g/dL na 137 cl 101 bicarb 10 glu 5 mmol/L urea 6 mmol/L osm 300",
  "bed 12 Na 121 K 3.4 glu 6.2 mmol/L urea 3.1 mmol/L osm 254",
  "glucose 30 Na 130",
  "Na 1280 K 4",
  "Mr Example MRN 1234567 Na 128 glu 6 mmol/L urea 4 mmol/L",
  "check Na 128 glu 540 mg/dL urea 14 mmol/L calc osm 810"
];

// ../../tmp/refsrc/bench/reader.ts
await loadUnits();
function run(n) {
  const t = performance.now();
  for (let i = 0; i < n; i++) readMessage(CORPUS[i % CORPUS.length]);
  return n / (performance.now() - t) * 1e3;
}
run(5e4);
process.stdout.write(`${JSON.stringify({ best: Math.max(run(15e4), run(15e4), run(15e4)) })}
`);
