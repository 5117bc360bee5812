/**
 * The arithmetic sandbox for the checking command: a colleague's own expression
 * ("2*128 + 540/18 + 14") is parsed by mathjs and evaluated only if every node is a number, a
 * parenthesis, or + − × ÷. No symbols, functions, assignments, units, matrices, strings or powers
 * ever reach evaluation; length, size, depth and magnitude are bounded.
 */
import type { MathNode } from "mathjs";

/** Loaded on first use: the expression parser is not needed at start-up. */
let loading: Promise<typeof import("./arithmetic.js")> | undefined;
async function arithmetic() {
  loading ??= import("./arithmetic.js");
  return (await loading).math;
}

export const EXPRESSION_LIMITS = { length: 200, nodes: 64, depth: 16, magnitude: 1e6 } as const;

const OPERATORS = new Set(["add", "subtract", "multiply", "divide", "unaryMinus", "unaryPlus"]);

export type ExpressionResult = { ok: true; value: number; text: string } | { ok: false; reason: string };

/** Normalises the typographic operators people paste: × ÷ − and a decimal comma between digits. */
export function normaliseExpression(text: string): string {
  return text
    .replace(/[×xX·](?=\s*[\d(])/g, "*")
    .replace(/÷/g, "/")
    .replace(/[−–]/g, "-")
    .replace(/(\d),(\d)/g, "$1.$2")
    .trim();
}

export async function evaluateExpression(input: string): Promise<ExpressionResult> {
  if (input.length > EXPRESSION_LIMITS.length)
    return { ok: false, reason: `An expression may be at most ${EXPRESSION_LIMITS.length} characters.` };
  const text = normaliseExpression(input);
  if (!/^[\d.+\-*/()\s]+$/.test(text)) {
    return { ok: false, reason: "Only numbers, brackets and + − × ÷ are allowed in an expression." };
  }
  const math = await arithmetic();
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch {
    return { ok: false, reason: "That expression could not be read: check the brackets and operators." };
  }
  let count = 0;
  let tooDeep = false;
  let bad: string | undefined;
  const visit = (n: MathNode, depth: number) => {
    count++;
    if (depth > EXPRESSION_LIMITS.depth) tooDeep = true;
    if (n.type === "ConstantNode") {
      const value = (n as unknown as { value: unknown }).value;
      if (
        typeof value !== "number" ||
        !Number.isFinite(value) ||
        Math.abs(value) > EXPRESSION_LIMITS.magnitude
      ) {
        bad = "Numbers in an expression must be plain and below a million.";
      }
    } else if (n.type === "OperatorNode") {
      const op = n as unknown as { fn: string; implicit?: boolean };
      if (!OPERATORS.has(op.fn)) bad = "Only + − × ÷ are allowed.";
      // "2(128)" is read by mathjs as 2 × 128; say the × instead of guessing it was meant.
      else if (op.implicit) bad = "Write the × between a number and a bracket, like 2 × (128 + 4).";
    } else if (n.type !== "ParenthesisNode") {
      bad = "Only numbers, brackets and + − × ÷ are allowed in an expression.";
    }
    if (!bad && !tooDeep && count <= EXPRESSION_LIMITS.nodes)
      n.forEach((child) => {
        visit(child, depth + 1);
      });
  };
  visit(node, 0);
  if (bad) return { ok: false, reason: bad };
  if (tooDeep || count > EXPRESSION_LIMITS.nodes)
    return { ok: false, reason: "That expression is too long or too deeply nested." };
  const value = node.compile().evaluate({}) as unknown;
  if (typeof value !== "number" || !Number.isFinite(value))
    return { ok: false, reason: "That expression has no finite value (a division by zero?)." };
  return { ok: true, value, text };
}
