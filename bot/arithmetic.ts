/**
 * The mathjs instance for the expression sandbox: the parser and the four operations, nothing
 * else. Loaded on first use by expression.ts, so start-up does not pay for the parser.
 */
import {
  addDependencies,
  create,
  divideDependencies,
  multiplyDependencies,
  parseDependencies,
  subtractDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
} from "mathjs";

export const math = create(
  {
    parseDependencies: parseDependencies!,
    addDependencies: addDependencies!,
    subtractDependencies: subtractDependencies!,
    multiplyDependencies: multiplyDependencies!,
    divideDependencies: divideDependencies!,
    unaryMinusDependencies: unaryMinusDependencies!,
    unaryPlusDependencies: unaryPlusDependencies!,
  },
  { number: "number" },
);
