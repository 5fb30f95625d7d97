/**
 * A JSON reader for room files (RFC 8259 grammar) that keeps what JSON.parse loses:
 * - numbers keep their source text (`1.0`, `1e3` and `12345678901234567891` stay as written);
 * - objects are key lists, so a key such as `__proto__` or `constructor` is an ordinary key;
 * - nesting is bounded (no recursion at all: the reader keeps its own stack), and containers
 *   deeper than `buildDepth` are checked but not built, so unknown deep fields cost no memory;
 * - a problem comes with its line, column and byte offset, found in one pass.
 */

/** A JSON number as written in the file. */
export class JsonNumber {
  constructor(readonly text: string) {}
  get value(): number {
    return Number(this.text);
  }
}

/** A JSON object: its keys in file order (a repeated key: the last one counts, as in JSON.parse). */
export class JsonObject {
  constructor(
    readonly keys: string[] = [],
    readonly values: JsonValue[] = [],
  ) {}
  get(key: string): JsonValue | undefined {
    for (let i = this.keys.length - 1; i >= 0; i--) if (this.keys[i] === key) return this.values[i];
    return undefined;
  }
  has(key: string): boolean {
    return this.keys.includes(key);
  }
}

/** A container deeper than `buildDepth`: checked for syntax, not kept. */
export class JsonSkipped {
  constructor(readonly kind: 'object' | 'list') {}
}

export type JsonValue = null | boolean | string | JsonNumber | JsonValue[] | JsonObject | JsonSkipped;

export interface JsonReadOptions {
  /** Deepest nesting accepted (the top-level value is depth 1). */
  readonly maxDepth?: number;
  /** Containers deeper than this are not built (they read as JsonSkipped). */
  readonly buildDepth?: number;
}

export interface JsonProblemAt {
  readonly message: string;
  readonly line: number;
  readonly column: number;
  /** 0-based offset in the text (UTF-16 units). */
  readonly offset: number;
  readonly tooDeep?: boolean;
}

export type JsonReadResult = { readonly value: JsonValue; readonly error?: undefined } | { readonly error: JsonProblemAt };

export const JSON_MAX_DEPTH = 64;

/** An open container. Its items wait in the reader's shared scratch list from `start` on. */
interface Frame {
  isObject: boolean;
  build: boolean;
  open: number;
  start: number;
  key: string;
}

class Stop extends Error {
  constructor(
    readonly at: number,
    readonly why: string,
    readonly tooDeep = false,
  ) {
    super(why);
  }
}

function digits(text: string, k: number): number {
  let c = text.charCodeAt(k);
  while (c >= 48 && c <= 57) c = text.charCodeAt(++k);
  return k;
}

const WORD = /true|false|null/y;
/** Where the plain run of a string from `at` ends: at a quote, backslash, control character or the end. */
function plainEnd(text: string, at: number): number {
  const len = text.length;
  while (at < len) {
    const c = text.charCodeAt(at);
    if (c === 34 || c === 92 || c < 0x20) return at;
    at++;
  }
  return at;
}
const ESCAPES: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };

export function readJson(input: string, options: JsonReadOptions = {}): JsonReadResult {
  const maxDepth = options.maxDepth ?? JSON_MAX_DEPTH;
  const buildDepth = options.buildDepth ?? maxDepth;
  const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  const shift = text.length === input.length ? 0 : 1;
  try {
    return { value: new Reader(text, maxDepth, buildDepth).document() };
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    const { line, column } = lineColumn(text, e.at);
    return { error: { message: e.why, line, column, offset: e.at + shift, ...(e.tooDeep ? { tooDeep: true } : {}) } };
  }
}

class Reader {
  private i = 0;
  private readonly stack: Frame[] = [];
  /** Frames are reused by depth, and items gather in one scratch list: few short-lived objects. */
  private readonly frames: Frame[] = [];
  private readonly scratch: JsonValue[] = [];

  constructor(
    private readonly text: string,
    private readonly maxDepth: number,
    private readonly buildDepth: number,
  ) {}

  document(): JsonValue {
    // value() gives a scalar, a whole (empty) container, or NONE when it opened a container:
    // then the container's first item comes next. No recursion at any depth.
    let value = this.value();
    while (this.stack.length > 0) {
      const top = this.stack[this.stack.length - 1];
      if (value === NONE) {
        if (top.isObject) this.key(top);
        value = this.value();
        continue;
      }
      this.attach(top, value);
      value = this.next(top);
    }
    this.ws();
    if (this.i < this.text.length) this.fail('expected the end of the text after the top-level value');
    return value as JsonValue;
  }

  /** After a member or item: a comma and the next value, or the closing bracket (the container). */
  private next(top: Frame): JsonValue | typeof NONE {
    this.ws();
    const close = top.isObject ? 125 : 93;
    const c = this.text.charCodeAt(this.i);
    if (c === close) {
      this.i++;
      this.stack.pop();
      return this.close(top);
    }
    if (c !== 44) {
      if (this.i >= this.text.length) this.unclosed(top);
      this.fail(`expected "," or "${top.isObject ? '}' : ']'}"`);
    }
    this.i++;
    if (top.isObject) this.key(top);
    return this.value();
  }

  private attach(top: Frame, value: JsonValue): void {
    if (!top.build) return;
    if (top.isObject) this.scratch.push(top.key, value);
    else this.scratch.push(value);
  }

  /** The finished container, built in exact-size arrays from the scratch list. */
  private close(top: Frame): JsonValue {
    if (!top.build) return new JsonSkipped(top.isObject ? 'object' : 'list');
    const scratch = this.scratch;
    const start = top.start;
    let out: JsonValue;
    if (top.isObject) {
      const n = (scratch.length - start) / 2;
      const keys = new Array<string>(n);
      const values = new Array<JsonValue>(n);
      for (let k = 0; k < n; k++) {
        keys[k] = scratch[start + 2 * k] as string;
        values[k] = scratch[start + 2 * k + 1];
      }
      out = new JsonObject(keys, values);
    } else out = scratch.slice(start);
    scratch.length = start;
    return out;
  }

  private key(top: Frame): void {
    this.ws();
    if (this.text.charCodeAt(this.i) !== 34) {
      if (this.i >= this.text.length) this.unclosed(top);
      this.fail('expected a property name in double quotes');
    }
    top.key = this.string();
    this.ws();
    if (this.text.charCodeAt(this.i) !== 58) this.fail('expected ":" after the property name');
    this.i++;
  }

  /** A scalar, or NONE after opening a non-empty container (its items follow). */
  private value(): JsonValue | typeof NONE {
    this.ws();
    const c = this.text.charCodeAt(this.i);
    if (c === 123 || c === 91) return this.open(c === 123);
    if (c === 34) return this.string();
    if (c === 45 || (c >= 48 && c <= 57)) return this.number();
    WORD.lastIndex = this.i;
    const w = WORD.exec(this.text);
    if (w) {
      this.i += w[0].length;
      return w[0] === 'null' ? null : w[0] === 'true';
    }
    return this.fail('expected a value');
  }

  /** A number (RFC 8259 grammar), kept as its text. */
  private number(): JsonNumber {
    const text = this.text;
    const start = this.i;
    let k = start;
    if (text.charCodeAt(k) === 45) k++;
    const first = text.charCodeAt(k);
    if (first === 48) k++;
    else if (first >= 49 && first <= 57) k = digits(text, k);
    else this.fail('a malformed number');
    if (text.charCodeAt(k) === 46) {
      const d = digits(text, k + 1);
      if (d === k + 1) this.fail('a malformed number');
      k = d;
    }
    const e = text.charCodeAt(k);
    if (e === 101 || e === 69) {
      let j = k + 1;
      const sign = text.charCodeAt(j);
      if (sign === 43 || sign === 45) j++;
      const d = digits(text, j);
      if (d === j) this.fail('a malformed number');
      k = d;
    }
    const after = text.charCodeAt(k);
    if (after >= 48 && after <= 57) this.fail('a malformed number');
    this.i = k;
    return new JsonNumber(text.slice(start, k));
  }

  private open(isObject: boolean): JsonValue | typeof NONE {
    const depth = this.stack.length + 1;
    if (depth > this.maxDepth) {
      throw new Stop(this.i, `nested more than ${this.maxDepth} levels deep; a room file needs only a few levels`, true);
    }
    const build = depth <= this.buildDepth;
    const open = this.i;
    this.i++;
    this.ws();
    if (this.text.charCodeAt(this.i) === (isObject ? 125 : 93)) {
      this.i++;
      return !build ? new JsonSkipped(isObject ? 'object' : 'list') : isObject ? new JsonObject() : [];
    }
    let frame = this.frames[depth];
    if (!frame) frame = this.frames[depth] = { isObject, build, open: 0, start: 0, key: '' };
    frame.isObject = isObject;
    frame.build = build;
    frame.open = open;
    frame.start = this.scratch.length;
    this.stack.push(frame);
    return NONE;
  }

  private string(): string {
    const text = this.text;
    const start = this.i;
    let at = plainEnd(text, start + 1);
    if (text.charCodeAt(at) === 34) {
      this.i = at + 1;
      return text.slice(start + 1, at);
    }
    let out = text.slice(start + 1, at);
    for (;;) {
      const c = text.charCodeAt(at);
      if (c === 34) break;
      this.i = at;
      if (Number.isNaN(c)) {
        this.i = start;
        throw new Stop(start, 'a string starts here but is not closed (a " is missing)');
      }
      if (c < 0x20) this.fail('a line break or control character inside a string');
      // c is a backslash
      const e = text[at + 1];
      if (e === 'u') {
        const hex = text.slice(at + 2, at + 6);
        if (!/^[0-9a-fA-F]{4}$/.test(hex)) this.fail('a bad \\u escape (four hex digits expected)');
        out += String.fromCharCode(parseInt(hex, 16));
        at += 6;
      } else if (e !== undefined && ESCAPES[e] !== undefined) {
        out += ESCAPES[e];
        at += 2;
      } else this.fail('a bad escape after a backslash');
      const end = plainEnd(text, at);
      out += text.slice(at, end);
      at = end;
    }
    this.i = at + 1;
    return out;
  }

  private ws(): void {
    const text = this.text;
    let c = text.charCodeAt(this.i);
    while (c === 32 || c === 10 || c === 13 || c === 9) c = text.charCodeAt(++this.i);
  }

  private unclosed(top: Frame): never {
    const { line, column } = lineColumn(this.text, top.open);
    const what = top.isObject ? 'object' : 'list';
    throw new Stop(
      this.i,
      `the text ends inside the ${what} opened at line ${line}, column ${column} (a "${top.isObject ? '}' : ']'}" is missing)`,
    );
  }

  private fail(what: string): never {
    if (this.i >= this.text.length && this.stack.length > 0) this.unclosed(this.stack[this.stack.length - 1]);
    const found = this.i >= this.text.length ? 'but the text ends' : `found ${JSON.stringify(this.text.slice(this.i, this.i + 1))}`;
    throw new Stop(this.i, `${what}, ${found}`);
  }
}

const NONE = Symbol('none');

/** 1-based line and column of an offset. */
export function lineColumn(text: string, at: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let k = text.indexOf('\n'); k >= 0 && k < at; k = text.indexOf('\n', k + 1)) {
    line++;
    lineStart = k + 1;
  }
  return { line, column: at - lineStart + 1 };
}
