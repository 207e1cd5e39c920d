// Where a JSON text first breaks the grammar (RFC 8259), and what was expected there. Used only
// after JSON.parse has failed, because engines differ in whether their message gives a position.

export interface SyntaxProblem {
  offset: number;
  line: number;
  column: number;
  expected: string;
}

class Stop extends Error {
  constructor(
    readonly offset: number,
    readonly expected: string,
  ) {
    super(expected);
  }
}

export function findJsonSyntaxError(text: string): SyntaxProblem | null {
  let i = 0;
  const ws = () => {
    while (i < text.length && ' \t\n\r'.includes(text[i])) i++;
  };
  const fail = (expected: string): never => {
    throw new Stop(i, expected);
  };
  const string = () => {
    if (text[i] !== '"') fail('a string in double quotes');
    i++;
    while (i < text.length && text[i] !== '"') {
      const c = text.charCodeAt(i);
      if (c < 0x20) fail('a closing " before the end of the line (control characters must be escaped)');
      if (text[i] === '\\') {
        i++;
        if (text[i] === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 1, i + 5))) fail('four hex digits after \\u');
          i += 5;
          continue;
        }
        if (!'"\\/bfnrt'.includes(text[i] ?? '')) fail('an escape such as \\" \\\\ \\n or \\u0041');
      }
      i++;
    }
    if (i >= text.length) fail('a closing "');
    i++;
  };
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === '{') {
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        string();
        ws();
        if (text[i] !== ':') fail("':' after the field name");
        i++;
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          return;
        }
        fail("',' or '}' after a field's value");
      }
    }
    if (c === '[') {
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value();
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          return;
        }
        fail("',' or ']' after an array item");
      }
    }
    if (c === '"') return string();
    const lit = /^(true|false|null)/.exec(text.slice(i, i + 5));
    if (lit) {
      i += lit[1].length;
      return;
    }
    const num = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (num && num[0] !== '-') {
      i += num[0].length;
      return;
    }
    fail('a value (object, array, string, number, true, false or null)');
  };
  try {
    value();
    ws();
    if (i < text.length) fail('the end of the document after the top-level value');
    return null;
  } catch (err) {
    if (!(err instanceof Stop)) throw err;
    let line = 1;
    let start = 0;
    for (let k = 0; k < err.offset && k < text.length; k++) {
      if (text.charCodeAt(k) === 10) {
        line++;
        start = k + 1;
      }
    }
    return { offset: err.offset, line, column: err.offset - start + 1, expected: err.expected };
  }
}
