import { describe, expect, it } from 'vitest';
import {
  evaluateExpression,
  expressionDependencies,
  parseExpression,
  resolveVariables,
} from '@/lib/section/expression';

// Precedence and associativity follow the usual conventions of mathematics and of most
// programming languages with a power operator (common practice, no published source):
// ^ binds tighter than unary minus and is right-associative.
const value = (text: string, vars: Record<string, number> = {}) => {
  const r = evaluateExpression(text, vars);
  if (!r.ok) throw new Error(`${text}: ${r.error.message}`);
  return r.value;
};
const problem = (text: string, vars: Record<string, number> = {}) => {
  const r = evaluateExpression(text, vars);
  if (r.ok) throw new Error(`${text} evaluated to ${r.value}, expected an error`);
  return r.error;
};

describe('evaluateExpression', () => {
  it('numbers in every accepted spelling', () => {
    expect(value('1')).toBe(1);
    expect(value('0.5')).toBe(0.5);
    expect(value('.25')).toBe(0.25);
    expect(value('1e-3')).toBe(0.001);
    expect(value('2.5E+2')).toBe(250);
  });

  it('precedence: * and / before + and -, left to right', () => {
    expect(value('1 + 2 * 3')).toBe(7);
    expect(value('(1 + 2) * 3')).toBe(9);
    expect(value('8 / 4 / 2')).toBe(1);
    expect(value('8 - 4 - 2')).toBe(2);
    expect(value('2 * 3 ^ 2')).toBe(18);
  });

  it('^ is right-associative and binds tighter than unary minus', () => {
    expect(value('2 ^ 3 ^ 2')).toBe(512);
    expect(value('(2 ^ 3) ^ 2')).toBe(64);
    expect(value('-2 ^ 2')).toBe(-4);
    expect(value('(-2) ^ 2')).toBe(4);
    expect(value('2 ^ -1')).toBe(0.5);
  });

  it('unary minus and plus', () => {
    expect(value('-3')).toBe(-3);
    expect(value('--3')).toBe(3);
    expect(value('+3 - -2')).toBe(5);
    expect(value('-w / 2', { w: 4 })).toBe(-2);
  });

  it('variables, pi and functions', () => {
    expect(value('w/2 + d', { w: 3, d: 0.25 })).toBe(1.75);
    expect(value('2*pi')).toBeCloseTo(2 * Math.PI, 15);
    expect(value('sqrt(16) + abs(-2)')).toBe(6);
    expect(value('min(3, 1, 2) + max(3, 1, 2)')).toBe(4);
    expect(value('sin(pi/2) + cos(0) + tan(0) + atan(1)*4')).toBeCloseTo(2 + Math.PI, 14);
    expect(value('log(exp(2))')).toBeCloseTo(2, 15);
  });

  it('reports unknown names with their column', () => {
    const e = problem('w/2 + wd', { w: 1 });
    expect(e.message).toBe("unknown name 'wd' at column 7");
    expect(e.column).toBe(7);
    expect(problem('wd + 1').message).toBe("unknown name 'wd' at column 1");
  });

  it('reports a missing parenthesis with its column', () => {
    const e = problem('(w + 2 * 3', { w: 1 });
    expect(e.message).toBe("missing ')' at column 11");
    expect(problem('sqrt(4').message).toBe("missing ')' at column 7");
    expect(problem('(1))').message).toBe("unmatched ')' at column 4");
  });

  it('reports other syntax errors with positions', () => {
    expect(problem('1 + ').message).toBe('unexpected end of expression at column 5');
    expect(problem('1 $ 2').message).toBe("unexpected character '$' at column 3");
    expect(problem('2w', { w: 1 }).message).toContain("missing operator between 2 and 'w' at column 2");
    expect(problem('1 2').message).toBe('unexpected number 2 at column 3');
    expect(problem('').message).toBe('empty expression');
    expect(problem('* 2').message).toBe("unexpected '*' at column 1");
  });

  it('reports bad functions and argument counts', () => {
    expect(problem('foo(1)').message).toBe("unknown function 'foo' at column 1");
    expect(problem('1 + sqrt(1, 2)').message).toBe("'sqrt' takes 1 argument, got 2 at column 5");
    expect(problem('max()').message).toBe("'max' takes at least 1 argument, got 0 at column 1");
    expect(problem('sqrt + 1').message).toContain("'sqrt' is a function");
  });

  it('refuses results that are not finite numbers', () => {
    expect(problem('1/0').message).toBe('division by zero at column 2');
    expect(problem('sqrt(-1)').message).toBe('result is not a finite number');
    expect(problem('1e308 * 10').message).toBe('result is not a finite number');
    expect(problem('1e999').message).toContain('too large');
  });

  it('never runs code: hostile text is only a syntax error', () => {
    for (const t of ['constructor', '__proto__', 'process.exit(1)', 'this', 'alert("x")', 'a=1', '`x`']) {
      const r = evaluateExpression(t, {});
      expect(r.ok).toBe(false);
    }
  });

  it('refuses overlong and deeply nested text without a stack overflow', () => {
    expect(parseExpression('1+'.repeat(150) + '1').ok).toBe(false);
    expect(parseExpression('('.repeat(100) + '1' + ')'.repeat(100)).ok).toBe(false);
    expect(parseExpression('-'.repeat(120) + '1').ok).toBe(false);
  });
});

describe('expressionDependencies', () => {
  it('lists variable names once, in order, without constants and functions', () => {
    expect(expressionDependencies('w/2 + max(d, pi) + w')).toEqual(['w', 'd']);
    expect(expressionDependencies(3)).toEqual([]);
    expect(expressionDependencies('(')).toEqual([]);
  });
});

describe('resolveVariables', () => {
  it('resolves chains in any order', () => {
    const r = resolveVariables({ d: 'w/2 + g', w: 2, g: 't*3', t: 0.1 });
    expect(r.ok).toBe(true);
    expect(r.values.d).toBeCloseTo(1.3, 15);
  });

  it('names the variables of a cycle', () => {
    const r = resolveVariables({ w: 'd + 1', d: 'w * 2', h: 1 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const cycle = r.errors.find((e) => e.cycle);
    expect(cycle?.message).toBe('variables form a cycle: w → d → w');
    expect(r.values.h).toBe(1);
  });

  it('a self-reference is a cycle', () => {
    const r = resolveVariables({ w: 'w + 1' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.message).toBe('variables form a cycle: w → w');
  });

  it('reports unknown names, reserved names and dependants of broken variables', () => {
    const r = resolveVariables({ a: 'b + zz', b: 1, pi: 3, c: 'a * 2' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const messages = r.errors.map((e) => e.message);
    expect(messages).toContain("variable 'a': unknown name 'zz' at column 5");
    expect(messages.some((m) => m.includes("'pi' is a built-in constant"))).toBe(true);
    expect(messages).toContain("variable 'c': depends on 'a', which cannot be evaluated");
    expect(r.values.b).toBe(1);
  });
});
