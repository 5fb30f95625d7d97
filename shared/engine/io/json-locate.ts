/**
 * Finds where JSON text first goes wrong (RFC 8259 grammar), for a message with a line and
 * column: Node's JSON.parse does not always say. Only run after JSON.parse has failed. O(length).
 */
export interface JsonProblem {
  readonly line: number;
  readonly column: number;
  readonly message: string;
}

export function locateJsonError(text: string): JsonProblem | undefined {
  let i = 0;
  const ws = () => {
    while (i < text.length && ' \t\n\r'.includes(text[i])) i++;
  };
  const fail = (what: string): never => {
    throw new Error(i >= text.length ? `${what}, but the text ends` : `${what}, found ${JSON.stringify(text[i])}`);
  };
  // Iterative over containers to survive deep nesting.
  const stack: ('{' | '[')[] = [];
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === '{' || c === '[') {
      stack.push(c);
      i++;
      ws();
      if (text[i] === (c === '{' ? '}' : ']')) {
        i++;
        stack.pop();
        return;
      }
      member();
      return;
    }
    if (c === '"') return str();
    const m = /^(-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?|true|false|null)/.exec(text.slice(i, i + 400));
    if (!m) fail('expected a value');
    i += m![0].length;
  };
  const str = () => {
    i++;
    while (i < text.length && text[i] !== '"') {
      if (text[i] === '\\') i++;
      else if (text.charCodeAt(i) < 0x20) fail('a line break or control character inside a string');
      i++;
    }
    if (i >= text.length) fail('a string is not closed');
    i++;
  };
  const member = () => {
    if (stack[stack.length - 1] === '{') {
      ws();
      if (text[i] !== '"') fail('expected a property name in double quotes');
      str();
      ws();
      if (text[i] !== ':') fail('expected ":"');
      i++;
    }
    value();
  };
  try {
    value();
    while (stack.length > 0) {
      ws();
      const close = stack[stack.length - 1] === '{' ? '}' : ']';
      if (text[i] === ',') {
        i++;
        ws();
        member();
      } else if (text[i] === close) {
        i++;
        stack.pop();
      } else fail(`expected "," or "${close}"`);
    }
    ws();
    if (i < text.length) fail('expected the end of the text');
    return undefined;
  } catch (e) {
    let line = 1;
    let col = 1;
    for (let k = 0; k < i && k < text.length; k++) {
      if (text.charCodeAt(k) === 10) {
        line++;
        col = 1;
      } else col++;
    }
    return { line, column: col, message: (e as Error).message };
  }
}
