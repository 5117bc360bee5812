/**
 * The words people use on call, mapped to analytes, claimed results and units. All lower case;
 * multi-word names are matched as phrases, longest first.
 */
import type { AnalyteId } from "./analytes.js";
import type { Unit } from "./units.js";

export const ANALYTE_ALIASES: Record<AnalyteId, readonly string[]> = {
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
    "mosm",
  ],
  ethanol: ["etoh", "ethanol", "alcohol", "blood alcohol"],
  methanol: ["meoh", "methanol"],
  ethyleneGlycol: ["ethylene glycol", "ethyleneglycol", "eg"],
  isopropanol: ["isopropanol", "isopropyl alcohol", "isopropyl", "ipa"],
  acetone: ["acetone"],
  propyleneGlycol: ["propylene glycol", "propyleneglycol", "pg"],
  mannitol: ["mannitol"],
};

export type ClaimKind =
  | "calculatedOsmolality"
  | "effectiveOsmolality"
  | "osmolalGap"
  | "correctedSodium"
  | "anionGap";

export const CLAIM_ALIASES: Record<ClaimKind, readonly string[]> = {
  calculatedOsmolality: [
    "calc osm",
    "calc osmo",
    "calc osmolality",
    "calculated osm",
    "calculated osmolality",
    "calculated osmolarity",
    "calc osmolarity",
    "cosm",
    "osmc",
  ],
  effectiveOsmolality: ["effective osm", "effective osmolality", "eff osm", "tonicity"],
  osmolalGap: ["gap", "osmolal gap", "osmolar gap", "osm gap", "og"],
  correctedSodium: ["corrected na", "corr na", "na corr", "corrected sodium", "na corrected", "cna"],
  anionGap: ["anion gap", "ag"],
};

/** Words that may stand before an analyte's name and change nothing: "serum Na", "plasma K". */
export const MODIFIERS = new Set([
  "serum",
  "plasma",
  "blood",
  "venous",
  "arterial",
  "lab",
  "s",
  "p",
  "vbg",
  "abg",
]);

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
  "&",
  "+",
  "->",
  "→",
  "/",
]);

/** Unit spellings → unit. Matched case-insensitively, longest first. */
export const UNIT_SPELLINGS: readonly (readonly [string, Unit])[] = (
  [
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
    ["mosmol/l", "mOsm/L"],
  ] as const
)
  .slice()
  .sort((a, b) => b[0].length - a[0].length);

/** Units written without a volume: "540 mg" — refused as incomplete, never completed by guess. */
export const INCOMPLETE_UNITS = new Set(["mg", "g", "mol", "mmols"]);

/** Words that introduce a case tag: "bed 12", "bay 4B"; or a tag written "#4B". */
export const TAG_WORDS = new Set(["bed", "bay", "room", "cubicle", "cube"]);
