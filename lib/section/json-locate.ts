/**
 * Finds where a JSON text is malformed, with line and column (1-based), independent of
 * the JavaScript engine's own error wording (which differs between Node and browsers).
 * Only called after JSON.parse has failed, so it need not be fast.
 */
export interface JsonSyntaxProblem {
  message: string;
  line: number;
  column: number;
  offset: number;
}

class Stop extends Error {
  constructor(
    readonly at: number,
    message: string,
  ) {
    super(message);
  }
}

export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1,
    col = 1;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text[i] === '\n') {
      line++;
      col = 1;
    } else col++;
  }
  return { line, column: col };
}

function show(ch: string | undefined): string {
  if (ch === undefined) return 'the end of the file';
  if (ch === '\n') return 'a line break';
  return `'${ch}'`;
}

/** The first syntax error of `text` as JSON, or null when it is valid JSON. */
export function locateJsonError(text: string): JsonSyntaxProblem | null {
  let i = 0;
  const n = text.length;
  const ws = () => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const fail = (message: string): never => {
    throw new Stop(i, message);
  };
  const str = () => {
    i++; // opening quote
    while (i < n) {
      const c = text[i]!;
      if (c === '"') {
        i++;
        return;
      }
      if (c === '\\') {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) {
            i++;
            fail('bad \\u escape in a string (needs 4 hex digits)');
          }
          i += 6;
          continue;
        }
        if (e !== undefined && '"\\/bfnrt'.includes(e)) {
          i += 2;
          continue;
        }
        i++;
        fail(`bad escape \\${e ?? ''} in a string`);
      }
      if (c === '\n') fail('a string may not contain a line break (missing closing quote?)');
      if (c < ' ') fail('a string may not contain control characters');
      i++;
    }
    fail('a string is not closed (missing ")');
  };
  const num = () => {
    const m = /^-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/.exec(text.slice(i, i + 400));
    if (!m) fail(`bad number`);
    i += m![0].length;
  };
  let depth = 0;
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === undefined) fail('unexpected end of the file: a value is missing');
    if (c === '{') {
      if (++depth > 512) fail('nested too deeply');
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        depth--;
        return;
      }
      for (;;) {
        ws();
        if (text[i] !== '"') {
          if (text[i] === '}') fail("trailing comma before '}' (JSON allows none)");
          fail(`expected a property name in double quotes but found ${show(text[i])}`);
        }
        str();
        ws();
        if (text[i] !== ':') fail(`expected ':' after the property name but found ${show(text[i])}`);
        i++;
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          depth--;
          return;
        }
        fail(`expected ',' or '}' after a property value but found ${show(text[i])}`);
      }
    }
    if (c === '[') {
      if (++depth > 512) fail('nested too deeply');
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        depth--;
        return;
      }
      for (;;) {
        ws();
        if (text[i] === ']') fail("trailing comma before ']' (JSON allows none)");
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          depth--;
          return;
        }
        fail(`expected ',' or ']' after a list item but found ${show(text[i])}`);
      }
    }
    if (c === '"') return str();
    if (c === '-' || (c >= '0' && c <= '9')) return num();
    for (const lit of ['true', 'false', 'null']) {
      if (text.startsWith(lit, i)) {
        i += lit.length;
        return;
      }
    }
    if (c === "'") fail("strings must use double quotes, not '");
    if (c === '/') fail('JSON allows no comments');
    fail(`unexpected ${show(c)}: expected a value (object, list, string, number, true, false or null)`);
  };
  try {
    value();
    ws();
    if (i < n) fail(`unexpected ${show(text[i])} after the end of the JSON value`);
    return null;
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    const { line, column } = lineColumn(text, e.at);
    return { message: e.message, line, column, offset: e.at };
  }
}
