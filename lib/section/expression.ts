/**
 * Safe arithmetic expressions for dimensions and material values ("w/2 + d").
 *
 * A small recursive-descent parser and tree evaluator: no `eval`, no `Function`, no access
 * to anything but the numbers and names given. Pure and framework-free; the editor calls
 * it on every keystroke, the resolver on every value.
 *
 * Grammar (lowest precedence first; `^` binds tighter than unary minus, so -2^2 = -4,
 * and is right-associative, so 2^3^2 = 2^9):
 *   expr    := term (("+" | "-") term)*
 *   term    := unary (("*" | "/") unary)*
 *   unary   := ("-" | "+") unary | power
 *   power   := primary ("^" unary)?
 *   primary := number | name | name "(" expr ("," expr)* ")" | "(" expr ")"
 * Numbers: 1, 0.5, .5, 1e-3, 2.5E+4. Names: a letter or _ then letters, digits, _.
 * Constant: pi. Functions: sqrt abs min max sin cos tan atan log exp (angles in radians,
 * log is the natural logarithm).
 *
 * Columns in messages are 1-based character positions in the expression text.
 */

export type ExprNode =
  | { kind: 'number'; value: number; column: number }
  | { kind: 'name'; name: string; column: number }
  | { kind: 'unary'; op: '-' | '+'; arg: ExprNode; column: number }
  | { kind: 'binary'; op: '+' | '-' | '*' | '/' | '^'; left: ExprNode; right: ExprNode; column: number }
  | { kind: 'call'; fn: string; args: ExprNode[]; column: number };

export interface ExpressionProblem {
  message: string;
  /** 1-based column in the expression text, where known. */
  column?: number;
}

export type ParseExpressionResult = { ok: true; node: ExprNode } | { ok: false; error: ExpressionProblem };
export type EvaluateResult = { ok: true; value: number } | { ok: false; error: ExpressionProblem };

/** Built-in constants. Variables may not use these names. */
export const CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI };

interface FnSpec {
  minArgs: number;
  maxArgs: number;
  apply: (args: number[]) => number;
}

/** Built-in functions. Variables may not use these names. */
const FUNCTIONS: Readonly<Record<string, FnSpec>> = {
  sqrt: { minArgs: 1, maxArgs: 1, apply: (a) => Math.sqrt(a[0]!) },
  abs: { minArgs: 1, maxArgs: 1, apply: (a) => Math.abs(a[0]!) },
  min: { minArgs: 1, maxArgs: Infinity, apply: (a) => Math.min(...a) },
  max: { minArgs: 1, maxArgs: Infinity, apply: (a) => Math.max(...a) },
  sin: { minArgs: 1, maxArgs: 1, apply: (a) => Math.sin(a[0]!) },
  cos: { minArgs: 1, maxArgs: 1, apply: (a) => Math.cos(a[0]!) },
  tan: { minArgs: 1, maxArgs: 1, apply: (a) => Math.tan(a[0]!) },
  atan: { minArgs: 1, maxArgs: 1, apply: (a) => Math.atan(a[0]!) },
  log: { minArgs: 1, maxArgs: 1, apply: (a) => Math.log(a[0]!) },
  exp: { minArgs: 1, maxArgs: 1, apply: (a) => Math.exp(a[0]!) },
};

export const FUNCTION_NAMES: readonly string[] = Object.keys(FUNCTIONS);

/** True when `name` is a built-in constant or function (not usable as a variable name). */
export function isReservedName(name: string): boolean {
  return Object.hasOwn(CONSTANTS, name) || Object.hasOwn(FUNCTIONS, name);
}

/** Longest expression text accepted (same as LIMITS.expressionLength in schema.ts). */
const MAX_LENGTH = 200;
/** Deepest nesting accepted (parentheses, unary signs, powers). */
const MAX_DEPTH = 64;

type Token =
  | { t: 'num'; value: number; col: number; text: string }
  | { t: 'name'; name: string; col: number }
  | { t: 'op'; op: '+' | '-' | '*' | '/' | '^' | '(' | ')' | ','; col: number }
  | { t: 'end'; col: number };

class ParseFailure extends Error {
  constructor(
    message: string,
    readonly column: number,
  ) {
    super(message);
  }
}

function describe(tok: Token): string {
  switch (tok.t) {
    case 'num':
      return `number ${tok.text}`;
    case 'name':
      return `name '${tok.name}'`;
    case 'op':
      return `'${tok.op}'`;
    case 'end':
      return 'end of expression';
  }
}

function tokenise(text: string): Token[] {
  const out: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const ch = text[i]!;
    if (ch === ' ' || ch === '\t' || ch === '\n' || ch === '\r') {
      i++;
      continue;
    }
    const col = i + 1;
    if ((ch >= '0' && ch <= '9') || (ch === '.' && /[0-9]/.test(text[i + 1] ?? ''))) {
      const m = /^(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?/.exec(text.slice(i))!;
      let len = m[0].length;
      // "1e" or "1e+" without digits: report at the exponent.
      if (/^[eE]/.test(text.slice(i + len)) && !/^[eE][+-]?[0-9]/.test(text.slice(i + len))) {
        throw new ParseFailure(`incomplete exponent in number at column ${col}`, col);
      }
      const numText = m[0];
      const value = Number(numText);
      if (!Number.isFinite(value)) throw new ParseFailure(`number ${numText} is too large at column ${col}`, col);
      out.push({ t: 'num', value, col, text: numText });
      i += len;
      // A number directly followed by a letter ("2w") is a common slip: say so.
      if (/[A-Za-z_]/.test(text[i] ?? '')) {
        const name = /^[A-Za-z_][A-Za-z0-9_]*/.exec(text.slice(i))![0];
        throw new ParseFailure(
          `missing operator between ${numText} and '${name}' at column ${i + 1} (write ${numText}*${name})`,
          i + 1,
        );
      }
      continue;
    }
    if (/[A-Za-z_]/.test(ch)) {
      const m = /^[A-Za-z_][A-Za-z0-9_]*/.exec(text.slice(i))!;
      out.push({ t: 'name', name: m[0], col });
      i += m[0].length;
      continue;
    }
    if ('+-*/^(),'.includes(ch)) {
      out.push({ t: 'op', op: ch as '+', col });
      i++;
      continue;
    }
    if (ch === '−' || ch === '–') {
      // Typographic minus or en dash pasted from a document.
      out.push({ t: 'op', op: '-', col });
      i++;
      continue;
    }
    if (ch === '×' || ch === '·') {
      out.push({ t: 'op', op: '*', col });
      i++;
      continue;
    }
    throw new ParseFailure(`unexpected character '${ch}' at column ${col}`, col);
  }
  out.push({ t: 'end', col: text.length + 1 });
  return out;
}

class Parser {
  private pos = 0;
  private depth = 0;
  constructor(private readonly tokens: Token[]) {}

  private peek(): Token {
    return this.tokens[this.pos]!;
  }
  private next(): Token {
    return this.tokens[this.pos++]!;
  }
  private isOp(op: string): boolean {
    const t = this.peek();
    return t.t === 'op' && t.op === op;
  }
  private enter(col: number): void {
    if (++this.depth > MAX_DEPTH) throw new ParseFailure(`expression nested too deeply at column ${col}`, col);
  }

  parseAll(): ExprNode {
    const node = this.expr();
    const t = this.peek();
    if (t.t !== 'end') {
      if (t.t === 'op' && t.op === ')') throw new ParseFailure(`unmatched ')' at column ${t.col}`, t.col);
      throw new ParseFailure(`unexpected ${describe(t)} at column ${t.col}`, t.col);
    }
    return node;
  }

  private expr(): ExprNode {
    let left = this.term();
    while (this.isOp('+') || this.isOp('-')) {
      const op = this.next() as Extract<Token, { t: 'op' }>;
      const right = this.term();
      left = { kind: 'binary', op: op.op as '+' | '-', left, right, column: op.col };
    }
    return left;
  }

  private term(): ExprNode {
    let left = this.unary();
    while (this.isOp('*') || this.isOp('/')) {
      const op = this.next() as Extract<Token, { t: 'op' }>;
      const right = this.unary();
      left = { kind: 'binary', op: op.op as '*' | '/', left, right, column: op.col };
    }
    return left;
  }

  private unary(): ExprNode {
    if (this.isOp('-') || this.isOp('+')) {
      const op = this.next() as Extract<Token, { t: 'op' }>;
      this.enter(op.col);
      const arg = this.unary();
      this.depth--;
      return { kind: 'unary', op: op.op as '-' | '+', arg, column: op.col };
    }
    return this.power();
  }

  private power(): ExprNode {
    const base = this.primary();
    if (this.isOp('^')) {
      const op = this.next();
      this.enter(op.col);
      const exponent = this.unary(); // right-associative; allows 2^-1
      this.depth--;
      return { kind: 'binary', op: '^', left: base, right: exponent, column: op.col };
    }
    return base;
  }

  private primary(): ExprNode {
    const t = this.next();
    if (t.t === 'num') return { kind: 'number', value: t.value, column: t.col };
    if (t.t === 'name') {
      if (this.isOp('(')) {
        const open = this.next();
        this.enter(open.col);
        const args: ExprNode[] = [];
        if (this.isOp(')')) {
          this.next();
        } else {
          for (;;) {
            args.push(this.expr());
            if (this.isOp(',')) {
              this.next();
              continue;
            }
            if (this.isOp(')')) {
              this.next();
              break;
            }
            const bad = this.peek();
            if (bad.t === 'end') throw new ParseFailure(`missing ')' at column ${bad.col}`, bad.col);
            throw new ParseFailure(`expected ',' or ')' but found ${describe(bad)} at column ${bad.col}`, bad.col);
          }
        }
        this.depth--;
        return { kind: 'call', fn: t.name, args, column: t.col };
      }
      return { kind: 'name', name: t.name, column: t.col };
    }
    if (t.t === 'op' && t.op === '(') {
      this.enter(t.col);
      const inner = this.expr();
      const close = this.peek();
      if (!(close.t === 'op' && close.op === ')')) {
        if (close.t === 'end') throw new ParseFailure(`missing ')' at column ${close.col}`, close.col);
        throw new ParseFailure(`expected ')' but found ${describe(close)} at column ${close.col}`, close.col);
      }
      this.next();
      this.depth--;
      return inner;
    }
    if (t.t === 'end') {
      if (t.col === 1) throw new ParseFailure('empty expression', 1);
      throw new ParseFailure(`unexpected end of expression at column ${t.col}`, t.col);
    }
    throw new ParseFailure(`unexpected ${describe(t)} at column ${t.col}`, t.col);
  }
}

/** Parse an expression into a tree. Never throws. */
export function parseExpression(text: string): ParseExpressionResult {
  if (typeof text !== 'string') return { ok: false, error: { message: 'expression must be text' } };
  if (text.length > MAX_LENGTH) {
    return { ok: false, error: { message: `expression is longer than ${MAX_LENGTH} characters` } };
  }
  try {
    const node = new Parser(tokenise(text)).parseAll();
    return { ok: true, node };
  } catch (e) {
    if (e instanceof ParseFailure) return { ok: false, error: { message: e.message, column: e.column } };
    throw e;
  }
}

class EvalFailure extends Error {
  constructor(
    message: string,
    readonly column?: number,
  ) {
    super(message);
  }
}

function evalNode(node: ExprNode, values: Readonly<Record<string, number>>): number {
  switch (node.kind) {
    case 'number':
      return node.value;
    case 'name': {
      if (Object.hasOwn(values, node.name)) return values[node.name]!;
      if (Object.hasOwn(CONSTANTS, node.name)) return CONSTANTS[node.name]!;
      if (Object.hasOwn(FUNCTIONS, node.name)) {
        throw new EvalFailure(`'${node.name}' is a function: write ${node.name}(…) at column ${node.column}`, node.column);
      }
      throw new EvalFailure(`unknown name '${node.name}' at column ${node.column}`, node.column);
    }
    case 'unary': {
      const v = evalNode(node.arg, values);
      return node.op === '-' ? -v : v;
    }
    case 'binary': {
      const a = evalNode(node.left, values);
      const b = evalNode(node.right, values);
      switch (node.op) {
        case '+':
          return a + b;
        case '-':
          return a - b;
        case '*':
          return a * b;
        case '/':
          if (b === 0) throw new EvalFailure(`division by zero at column ${node.column}`, node.column);
          return a / b;
        case '^':
          return Math.pow(a, b);
      }
    }
    // eslint-disable-next-line no-fallthrough
    case 'call': {
      const spec = Object.hasOwn(FUNCTIONS, node.fn) ? FUNCTIONS[node.fn] : undefined;
      if (!spec) {
        const hint = Object.hasOwn(values, node.fn) ? ` ('${node.fn}' is a variable, not a function)` : '';
        throw new EvalFailure(`unknown function '${node.fn}' at column ${node.column}${hint}`, node.column);
      }
      const n = node.args.length;
      if (n < spec.minArgs || n > spec.maxArgs) {
        const want =
          spec.maxArgs === Infinity
            ? `at least ${spec.minArgs} argument${spec.minArgs === 1 ? '' : 's'}`
            : `${spec.minArgs} argument${spec.minArgs === 1 ? '' : 's'}`;
        throw new EvalFailure(`'${node.fn}' takes ${want}, got ${n} at column ${node.column}`, node.column);
      }
      return spec.apply(node.args.map((a) => evalNode(a, values)));
    }
  }
}

/**
 * Evaluate an expression (text or a parsed tree) with the given variable values.
 * Fails with a message for syntax errors, unknown names or functions, wrong argument
 * counts, division by zero and results that are not finite numbers (sqrt(-1), 1e308*10).
 */
export function evaluateExpression(
  expression: string | ExprNode,
  values: Readonly<Record<string, number>> = {},
): EvaluateResult {
  let node: ExprNode;
  if (typeof expression === 'string') {
    const parsed = parseExpression(expression);
    if (!parsed.ok) return parsed;
    node = parsed.node;
  } else {
    node = expression;
  }
  try {
    const value = evalNode(node, values);
    if (!Number.isFinite(value)) return { ok: false, error: { message: 'result is not a finite number' } };
    return { ok: true, value };
  } catch (e) {
    if (e instanceof EvalFailure) return { ok: false, error: { message: e.message, column: e.column } };
    throw e;
  }
}

function collectNames(node: ExprNode, into: Set<string>): void {
  switch (node.kind) {
    case 'number':
      return;
    case 'name':
      if (!Object.hasOwn(CONSTANTS, node.name)) into.add(node.name);
      return;
    case 'unary':
      collectNames(node.arg, into);
      return;
    case 'binary':
      collectNames(node.left, into);
      collectNames(node.right, into);
      return;
    case 'call':
      for (const a of node.args) collectNames(a, into);
      return;
  }
}

/**
 * Names an expression refers to (variables, not constants or function names), in order of
 * first appearance. An expression that does not parse has no dependencies.
 */
export function expressionDependencies(expression: string | number | ExprNode): string[] {
  if (typeof expression === 'number') return [];
  let node: ExprNode;
  if (typeof expression === 'string') {
    const parsed = parseExpression(expression);
    if (!parsed.ok) return [];
    node = parsed.node;
  } else {
    node = expression;
  }
  const names = new Set<string>();
  collectNames(node, names);
  return [...names];
}

export interface VariableProblem {
  /** The variable the problem is about. */
  name: string;
  message: string;
  column?: number;
  /** For cycles: the variables on the cycle, the first repeated at the end. */
  cycle?: string[];
}

export type ResolveVariablesResult =
  | { ok: true; values: Record<string, number> }
  | {
      ok: false;
      errors: VariableProblem[];
      /** The variables that could be resolved despite the errors (for live drawing). */
      values: Record<string, number>;
    };

/**
 * Resolve named variables, each a number or an expression over the others. Reports every
 * variable that cannot be evaluated: syntax errors, unknown names, reserved names,
 * non-finite values and cycles ("variables form a cycle: w → d → w").
 */
export function resolveVariables(vars: Readonly<Record<string, number | string>> | undefined): ResolveVariablesResult {
  const values: Record<string, number> = {};
  const errors: VariableProblem[] = [];
  if (!vars) return { ok: true, values };
  const names = Object.keys(vars);
  const nodes = new Map<string, ExprNode>();
  const failed = new Set<string>();

  for (const name of names) {
    if (name === '__proto__') {
      errors.push({ name, message: `'__proto__' cannot be a variable name` });
      failed.add(name);
      continue;
    }
    if (isReservedName(name)) {
      errors.push({ name, message: `variable '${name}': '${name}' is a built-in ${Object.hasOwn(CONSTANTS, name) ? 'constant' : 'function'} and cannot be a variable name` });
      failed.add(name);
      continue;
    }
    const raw = vars[name];
    if (typeof raw === 'number') {
      if (!Number.isFinite(raw)) {
        errors.push({ name, message: `variable '${name}': must be a finite number` });
        failed.add(name);
      } else {
        values[name] = raw;
      }
      continue;
    }
    const parsed = parseExpression(String(raw));
    if (!parsed.ok) {
      errors.push({ name, message: `variable '${name}': ${parsed.error.message}`, column: parsed.error.column });
      failed.add(name);
      continue;
    }
    nodes.set(name, parsed.node);
  }

  // Depth-first evaluation with an explicit path, so cycles can be named.
  const state = new Map<string, 'visiting' | 'done'>();
  const reportedCycles = new Set<string>();
  const visit = (name: string, path: string[]): boolean => {
    if (Object.hasOwn(values, name)) return true;
    if (failed.has(name)) return false;
    const node = nodes.get(name);
    if (!node) return false;
    const st = state.get(name);
    if (st === 'visiting') {
      const start = path.indexOf(name);
      const cycle = [...path.slice(start), name];
      const key = [...cycle.slice(0, -1)].sort().join(',');
      if (!reportedCycles.has(key)) {
        reportedCycles.add(key);
        errors.push({ name, message: `variables form a cycle: ${cycle.join(' → ')}`, cycle });
      }
      for (const n of cycle) failed.add(n);
      return false;
    }
    if (st === 'done') return Object.hasOwn(values, name);
    state.set(name, 'visiting');
    path.push(name);
    let ok = true;
    for (const dep of expressionDependencies(node)) {
      if (!Object.hasOwn(vars, dep)) continue; // reported as an unknown name below
      if (!visit(dep, path)) ok = false;
    }
    path.pop();
    state.set(name, 'done');
    if (!ok) {
      if (!failed.has(name)) {
        const bad = expressionDependencies(node).filter((d) => Object.hasOwn(vars, d) && !Object.hasOwn(values, d));
        errors.push({ name, message: `variable '${name}': depends on ${bad.map((b) => `'${b}'`).join(', ')}, which cannot be evaluated` });
        failed.add(name);
      }
      return false;
    }
    const r = evaluateExpression(node, values);
    if (!r.ok) {
      errors.push({ name, message: `variable '${name}': ${r.error.message}`, column: r.error.column });
      failed.add(name);
      return false;
    }
    values[name] = r.value;
    return true;
  };
  for (const name of names) visit(name, []);

  if (errors.length > 0) return { ok: false, errors, values };
  return { ok: true, values };
}
