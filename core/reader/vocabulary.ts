/**
 * The words people use on call and in pasted reports, mapped to analytes, specimens, claimed
 * results, flags and units. All lower case; multi-word names are matched as phrases, longest first.
 */
import type { AnalyteId, Specimen } from "../analytes.js";
import type { Unit } from "../units.js";

/** Names of each analyte as written; a specimen word before or after them may qualify them. */
export const ANALYTE_ALIASES: Record<AnalyteId, readonly string[]> = {
  sodium: ["na", "na+", "sodium", "s-na", "sna", "p-na", "pna", "s.na", "p.na"],
  potassium: ["k", "k+", "potassium", "s-k", "p-k"],
  chloride: ["cl", "cl-", "chloride"],
  bicarbonate: ["hco3", "hco3-", "bicarb", "bicarbonate", "tco2", "co2", "total co2", "ctco2"],
  albumin: ["alb", "albumin"],
  glucose: [
    "glucose",
    "glu",
    "gluc",
    "glc",
    "bg",
    "bgl",
    "bsl",
    "cbg",
    "blood glucose",
    "blood sugar",
    "sugar",
    "capillary glucose",
    "fingerstick glucose",
  ],
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
    "sosm",
    "posm",
    "s-osm",
    "p-osm",
    // Not "mosm": it is read as the unit (mOsm/kg) wherever it stands.
  ],
  ethanol: ["etoh", "ethanol", "alcohol", "blood alcohol", "ethyl alcohol"],
  methanol: ["meoh", "methanol"],
  ethyleneGlycol: ["ethylene glycol", "ethyleneglycol", "eg"],
  isopropanol: ["isopropanol", "isopropyl alcohol", "isopropyl", "ipa"],
  acetone: ["acetone"],
  // Not "pg": it is a unit (picograms, FOREIGN_UNITS below) and is read as one.
  propyleneGlycol: ["propylene glycol", "propyleneglycol"],
  mannitol: ["mannitol"],
  pH: ["ph"],
  betaHydroxybutyrate: [
    "bhb",
    "b-ohb",
    "β-ohb",
    "bohb",
    "beta-ohb",
    "3-ohb",
    "beta-hydroxybutyrate",
    "beta hydroxybutyrate",
    "β-hydroxybutyrate",
    "b-hydroxybutyrate",
    "3-hydroxybutyrate",
    "betahydroxybutyrate",
    "ketones",
    "ketone",
    "blood ketones",
    "capillary ketones",
  ],
  lactate: ["lactate", "lac", "lact", "lactic acid"],
  // Urine analytes are usually written with a specimen word ("urine Na"); these are the glued forms.
  urineOsmolality: ["uosm", "u-osm", "u.osm", "uosmo", "uosmol"],
  urineSodium: ["una", "u-na", "u.na", "una+"],
  urinePotassium: ["uk", "u-k", "u.k", "uk+"],
};

/** Blood-gas analysers' names: the analyte, measured on the blood-gas analyser (direct ISE). */
export const BLOOD_GAS_ALIASES: Partial<Record<AnalyteId, readonly string[]>> = {
  sodium: ["cna+", "cna"],
  potassium: ["ck+"],
  chloride: ["ccl-", "ccl"],
  glucose: ["cglu", "cgluc", "cglucose"],
  lactate: ["clac", "clact"],
  bicarbonate: ["chco3-", "chco3"],
};

/** The urine counterpart of a serum analyte, where the engine uses one. */
export const URINE_COUNTERPART: Partial<Record<AnalyteId, AnalyteId>> = {
  sodium: "urineSodium",
  potassium: "urinePotassium",
  measuredOsmolality: "urineOsmolality",
};

/** Words naming a specimen, before or after an analyte's name, or heading a section of a paste. */
export const SPECIMEN_WORDS: Record<Specimen, readonly string[]> = {
  urine: ["urine", "urinary", "u", "ur", "spot urine", "random urine", "urine spot", "24h urine"],
  serum: ["serum", "plasma", "s", "p", "lab", "venous", "arterial", "ser", "pl", "bloods"],
  bloodGas: [
    "blood gas",
    "blood gases",
    "gas",
    "vbg",
    "abg",
    "poc",
    "poct",
    "i-stat",
    "istat",
    "point of care",
  ],
};

export type ClaimKind =
  | "calculatedOsmolality"
  | "effectiveOsmolality"
  | "osmolalGap"
  | "correctedSodium"
  | "anionGap";

/** Calculated results a colleague, a lab or an analyser wrote: checked, never used as inputs. */
export const CLAIM_ALIASES: Record<ClaimKind, readonly string[]> = {
  calculatedOsmolality: [
    "calc osm",
    "calc osmo",
    "calc osmol",
    "calc osmolality",
    "calculated osm",
    "calculated osmolality",
    "calculated osmolarity",
    "calc osmolarity",
    "osm calc",
    "cosm",
    "osmc",
    "mosmc",
  ],
  effectiveOsmolality: ["effective osm", "effective osmolality", "eff osm", "tonicity"],
  osmolalGap: ["gap", "osmolal gap", "osmolar gap", "osm gap", "og", "osmolality gap", "osmol gap"],
  correctedSodium: [
    "corrected na",
    "corr na",
    "na corr",
    "corrected sodium",
    "na corrected",
    "cna corrected",
  ],
  anionGap: ["anion gap", "ag", "angap", "an gap", "cangap", "anion-gap", "aniongap"],
};

/** A word after an osmolality's name that makes it a calculated one: "Osmolality, calculated". */
export const CALCULATED_MARKERS = new Set(["calc", "calculated", "c", "est", "estimated", "calc."]);
/** A word after a sodium's name that makes it a corrected one: "Sodium (corrected)". */
export const CORRECTED_MARKERS = new Set(["corrected", "corr", "glucose-corrected"]);
/** Words after an anion gap's name that say potassium is counted in it: "Anion Gap K+". */
export const WITH_POTASSIUM = new Set(["k", "k+", "incl k", "with k", "incl", "including", "(k+)"]);
/** A word after a bicarbonate's name that makes it the analyser's derived standard bicarbonate. */
export const STANDARD_MARKERS = new Set(["st", "std", "standard", "stand"]);

/** Words that qualify a name without changing what it is: "Glucose, fasting", "Na (direct ISE)". */
export const DESCRIPTORS = new Set([
  "fasting",
  "fast",
  "random",
  "rand",
  "measured",
  "meas",
  "direct",
  "indirect",
  "ise",
  "whole",
  "blood",
  "capillary",
  "cap",
  "level",
  "conc",
  "total",
  "t",
  "b",
  "aq",
  "37",
]);

/**
 * Tests we recognise but do not compute with: a row of one is read past quietly and listed once
 * ("not used here"), instead of being called "not understood". Display name → names as written.
 */
export const OTHER_TESTS: Record<string, readonly string[]> = {
  creatinine: ["creatinine", "creat", "cr", "crea", "scr", "ccrea"],
  eGFR: ["egfr", "gfr"],
  calcium: [
    "calcium",
    "ca",
    "ca2+",
    "ca++",
    "cca2+",
    "ica",
    "corrected calcium",
    "adjusted calcium",
    "ionised calcium",
    "ionized calcium",
  ],
  magnesium: ["magnesium", "mag"],
  phosphate: ["phosphate", "phos", "po4", "phosphorus"],
  haemoglobin: ["hb", "hgb", "haemoglobin", "hemoglobin", "cthb", "thb"],
  haematocrit: ["hct", "haematocrit", "hematocrit"],
  "white cells": ["wbc", "wcc", "white cells", "white cell count"],
  platelets: ["plt", "platelets"],
  CRP: ["crp"],
  "liver tests": ["alt", "ast", "alp", "ggt", "bilirubin", "bili", "total bilirubin"],
  "total protein": ["total protein", "protein", "tp"],
  lipids: ["triglycerides", "trigs", "tg", "cholesterol", "chol", "ldl", "hdl"],
  "other chemistry": [
    "lipase",
    "amylase",
    "troponin",
    "trop",
    "inr",
    "aptt",
    "ck",
    "creatine kinase",
    "ammonia",
    "urate",
    "uric acid",
    "tsh",
    "cortisol",
  ],
  pCO2: ["pco2"],
  pO2: ["po2"],
  "base excess": ["be", "sbe", "abe", "cbase", "base excess"],
  "oxygen saturation": ["so2", "fo2hb", "o2hb", "hhb", "fhhb"],
  "carbon monoxide and methaemoglobin": ["cohb", "fcohb", "methb", "fmethb"],
  "other blood-gas values": ["p50", "fio2", "cto2", "temp", "temperature"],
  "standard bicarbonate": ["hco3std", "std hco3", "standard bicarbonate"],
  "urine tests": ["urine glucose", "urine ketones", "urine protein", "urine creatinine", "urine urea"],
};

/** Words of a report's header or section lines: a line made only of these is read past. */
export const HEADER_WORDS = new Set([
  "test",
  "tests",
  "result",
  "results",
  "value",
  "values",
  "units",
  "unit",
  "reference",
  "ref",
  "range",
  "ranges",
  "interval",
  "flag",
  "flags",
  "analyte",
  "name",
  "specimen",
  "sample",
  "collected",
  "received",
  "reported",
  "status",
  "final",
  "preliminary",
  "verified",
  "comment",
  "comments",
  "laboratory",
  "chemistry",
  "biochemistry",
  "renal",
  "profile",
  "panel",
  "electrolytes",
  "u&e",
  "u&es",
  "ues",
  "bmp",
  "cmp",
  "basic",
  "metabolic",
  "comprehensive",
  "analysis",
  "studies",
  "spot",
  "study",
  "screen",
  "investigations",
  "report",
  "normal",
  "low",
  "high",
  "lower",
  "upper",
  "min",
  "max",
  "minimum",
  "maximum",
  "previous",
  "current",
  "latest",
  "prior",
  "now",
  "date",
  "time",
  "page",
  "of",
  "and",
  "&",
  "-",
  "/",
  "abnormal",
  "chem",
  "gases",
  "lab",
  "labs",
  "bloods",
  "type",
  "method",
  "ise",
  "direct",
  "indirect",
  "measured",
  "calculated",
  "acid-base",
  "acid",
  "base",
  "oximetry",
  "metabolites",
  "hd",
]);

/** Result flags, in any position of a row. Matched lower case; "a" only as capital "A" (see lexer). */
export const FLAG_WORDS = new Set([
  "h",
  "l",
  "hh",
  "ll",
  "a",
  "*",
  "**",
  "***",
  "↑",
  "↓",
  "↑↑",
  "↓↓",
  "!",
  "!!",
  "critical",
  "crit",
  "high",
  "low",
  "abnormal",
  "abn",
  "panic",
  "(h)",
  "(l)",
]);

/** Words that introduce a reference range: "Ref 135-145", "range: 3.5-5.1", "NR 135–145". */
export const RANGE_INTRO = new Set(["ref", "ref.", "reference", "range", "nr", "rr", "normal", "ri", "n"]);

/** Filler words read past without comment. */
export const FILLER = new Set([
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
  // The water of "mOsm/kg H2O", written apart from its unit on many printouts.
  "h2o",
  "&",
  "+",
  "->",
  "→",
  "/",
  "-",
]);

/** Unit spellings → unit. Matched case-insensitively after spaces are removed ("mg / dl"). */
export const UNIT_SPELLINGS: readonly (readonly [string, Unit])[] = [
  ["mmol/l", "mmol/L"],
  ["mmol/litre", "mmol/L"],
  ["mmol/liter", "mmol/L"],
  ["mmoll", "mmol/L"],
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
  ["mosmol/l", "mOsm/L"],
];

/** Units we recognise but read no analyte of ours in: they are a unit, not a word not understood. */
export const FOREIGN_UNITS = new Set([
  "umol/l",
  "µmol/l",
  "μmol/l",
  "nmol/l",
  "pmol/l",
  "ng/l",
  "ng/ml",
  "ug/l",
  "u/l",
  "iu/l",
  "kpa",
  "mmhg",
  "%",
  "ml/min",
  "ml/min/1.73m2",
  "ml/min/1.73m²",
  "x10^9/l",
  "10^9/l",
  "x10*9/l",
  "10*9/l",
  "x10e9/l",
  "/l",
  "°c",
  "sec",
  "s",
  "ratio",
  "fl",
  "pg",
]);

/** Units written without a volume: "540 mg" — refused as incomplete, never completed by guess. */
export const INCOMPLETE_UNITS = new Set(["mg", "g", "mol", "mmols"]);

/** Words that introduce a case tag: "bed 12", "bay 4B"; or a tag written "#4B". */
export const TAG_WORDS = new Set(["bed", "bay", "room", "cubicle", "cube"]);
