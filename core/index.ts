/** The clinical engine's public surface. core/ imports nothing from bot/ or adapters/. */
export * from "./analytes.js";
export * from "./assess.js";
export * from "./cautions.js";
export * from "./crisis.js";
export * from "./findings.js";
export * from "./format.js";
export * from "./formulas.js";
export * from "./inputs.js";
export * from "./molar-mass.js";
export type * from "./results.js";
export * from "./units.js";
export * from "./workup.js";
