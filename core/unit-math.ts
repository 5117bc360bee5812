/**
 * The mathjs instance behind unit conversions: only the unit factories (the full mathjs import
 * costs about 0.6 s). Loaded by loadUnits() in units.ts, once, before the first conversion.
 */
import { create, unitDependencies } from "mathjs";

export const math = create({ unitDependencies: unitDependencies! });
