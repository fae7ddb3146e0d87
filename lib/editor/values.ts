/** Helpers for section values (a number or an expression string) as the editor edits them. */
import type { Value } from '../section/schema';
import { expressionDependencies } from '../section/expression';

/** Round away binary noise (0.1 + 0.2) so that typed and stored numbers stay readable. */
export function tidy(n: number): number {
  if (!Number.isFinite(n)) return n;
  if (Math.abs(n) < 1e-300) return 0;
  return Number(n.toPrecision(12));
}

/**
 * Add a constant to a value. Numbers stay numbers; expressions keep their dependency on
 * the variables and gain (or update) a trailing constant: "w/2" + 0.5 → "w/2 + 0.5".
 */
export function addToValue(v: Value, d: number): Value {
  if (d === 0) return v;
  if (typeof v === 'number') return tidy(v + d);
  const m = /^(.*\S)\s*([+-])\s*(\d+(?:\.\d*)?(?:e[+-]?\d+)?)$/i.exec(v);
  if (m && !/[*/^(]\s*$/.test(m[1]!) && !/(^|[^A-Za-z0-9_])[0-9.]+e$/i.test(m[1]!) && depthZero(m[1]!)) {
    const c = tidy((m[2] === '-' ? -1 : 1) * Number(m[3]) + d);
    if (c === 0) return m[1]!;
    return `${m[1]} ${c < 0 ? '-' : '+'} ${Math.abs(c)}`;
  }
  // "+" and "-" bind loosest, so appending a term never needs parentheses.
  return `${v} ${d < 0 ? '-' : '+'} ${Math.abs(tidy(d))}`;
}

/** Parentheses balanced at the end of the string (so a trailing "+ c" is a top-level term). */
function depthZero(s: string): boolean {
  let depth = 0;
  for (const ch of s) {
    if (ch === '(') depth++;
    else if (ch === ')') depth--;
  }
  return depth === 0;
}

/** Parse what a user typed into a dimension field: a plain number stays a number, anything else is an expression. */
export function parseTyped(text: string): Value {
  const t = text.trim();
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t)) return Number(t);
  return t;
}

export function formatValue(v: Value): string {
  return typeof v === 'number' ? String(tidy(v)) : v;
}

/** Variables an expression refers to (constants and function names left out). */
export function identifiersOf(expr: string): string[] {
  return expressionDependencies(expr);
}

/** Rename identifier `from` to `to` inside an expression (whole identifiers only). */
export function renameIdentifier(expr: string, from: string, to: string): string {
  const re = new RegExp(`(?<![A-Za-z0-9_.])${from}(?![A-Za-z0-9_])(?!\\s*\\()`, 'g');
  return expr.replace(re, to);
}
