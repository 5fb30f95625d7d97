/**
 * A small XML reader for GraphML: elements, attributes, text, CDATA, comments and processing
 * instructions, the five predefined entities and numeric character references. No DTD, no
 * entity expansion, no external loads. Iterative (its own stack, no recursion), nesting bounded,
 * and elements deeper than `buildDepth` are checked for well-formedness but not kept. Every
 * problem comes with its line, column and offset, and names the element involved.
 */
import { lineColumn } from './json-reader';

export interface XmlElement {
  /** Local name (namespace prefix removed). */
  readonly name: string;
  /** Attribute local names and values, flat: [name0, value0, name1, value1, ...]. */
  readonly attrs: string[];
  readonly children: XmlElement[];
  /** Text directly inside the element (entities decoded). */
  text: string;
  /** 0-based offset of the `<` that opens it. */
  readonly at: number;
}

export interface XmlProblemAt {
  readonly message: string;
  readonly line: number;
  readonly column: number;
  readonly offset: number;
  readonly tooDeep?: boolean;
}

export type XmlReadResult = { readonly root: XmlElement; readonly error?: undefined } | { readonly error: XmlProblemAt };

export const XML_MAX_DEPTH = 64;

class Stop extends Error {
  constructor(
    readonly at: number,
    readonly why: string,
    readonly tooDeep = false,
  ) {
    super(why);
  }
}

interface Open {
  readonly qname: string;
  readonly at: number;
  readonly el?: XmlElement;
}

const NAME = /[A-Za-z_:\u00C0-\uFFFF][-A-Za-z0-9._:\u00B7\u00C0-\uFFFF]*/y;
const ENTITY = /&(#x[0-9a-fA-F]{1,6}|#[0-9]{1,7}|lt|gt|amp|quot|apos);/g;
const NAMED: Record<string, string> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };

export function attrOf(el: XmlElement, name: string): string | undefined {
  for (let i = 0; i < el.attrs.length; i += 2) if (el.attrs[i] === name) return el.attrs[i + 1];
  return undefined;
}

export function readXml(input: string, buildDepth = 4, maxDepth = XML_MAX_DEPTH): XmlReadResult {
  const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  const shift = text.length === input.length ? 0 : 1;
  try {
    return { root: scan(text, buildDepth, maxDepth) };
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    const { line, column } = lineColumn(text, e.at);
    return { error: { message: e.why, line, column, offset: e.at + shift, ...(e.tooDeep ? { tooDeep: true } : {}) } };
  }
}

// eslint-disable-next-line max-lines-per-function -- one character-level scanner whose position and element stack are shared by every branch; split, each branch would need them passed in and out.
function scan(text: string, buildDepth: number, maxDepth: number): XmlElement {
  const stack: Open[] = [];
  let root: XmlElement | undefined;
  let rootSeen = false;
  let i = 0;
  const place = (at: number) => {
    const { line, column } = lineColumn(text, at);
    return `line ${line}, column ${column}`;
  };
  const addText = (from: number, to: number, raw: boolean) => {
    if (to <= from) return;
    const top = stack[stack.length - 1];
    if (!top) {
      const stray = /\S/.exec(text.slice(from, to));
      if (stray) throw new Stop(from + stray.index, `text outside the ${rootSeen ? 'root element (after its end)' : 'root element'}`);
      return;
    }
    if (top.el) top.el.text += raw ? text.slice(from, to) : decode(text.slice(from, to));
  };
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    addText(i, lt < 0 ? text.length : lt, false);
    if (lt < 0) break;
    i = lt;
    if (text.startsWith('<?', i)) i = skipTo(text, i, '?>', 'a processing instruction "<?"');
    else if (text.startsWith('<!--', i)) i = skipTo(text, i, '-->', 'a comment "<!--"');
    else if (text.startsWith('<![CDATA[', i)) {
      const end = skipTo(text, i, ']]>', 'a CDATA section');
      addText(i + 9, end - 3, true);
      i = end;
    } else if (text.startsWith('<!', i)) throw new Stop(i, 'a markup declaration "<!" is not accepted here; remove it');
    else if (text.startsWith('</', i)) {
      const name = nameAt(text, i + 2, 'an end tag "</"');
      let k = i + 2 + name.length;
      while (isSpace(text.charCodeAt(k))) k++;
      if (text.charCodeAt(k) !== 62) throw new Stop(k, `the end tag </${clipName(name)}> is not closed with ">"`);
      const top = stack.pop();
      if (!top) throw new Stop(i, `</${clipName(name)}> closes an element that was never opened`);
      if (top.qname !== name) {
        throw new Stop(i, `</${clipName(name)}> does not match <${clipName(top.qname)}> opened at ${place(top.at)}`);
      }
      i = k + 1;
    } else {
      if (rootSeen && stack.length === 0) throw new Stop(i, 'a second root element; a GraphML file has one <graphml> element');
      const depth = stack.length + 1;
      if (depth > maxDepth) throw new Stop(i, `elements nested more than ${maxDepth} levels deep; GraphML needs only a few`, true);
      const qname = nameAt(text, i + 1, 'a tag "<"');
      const keep = depth <= buildDepth && (depth === 1 || stack[stack.length - 1].el !== undefined);
      const attrs: string[] = [];
      let k = i + 1 + qname.length;
      for (;;) {
        const before = k;
        while (isSpace(text.charCodeAt(k))) k++;
        const c = text.charCodeAt(k);
        if (c === 62 || (c === 47 && text.charCodeAt(k + 1) === 62)) break;
        if (Number.isNaN(c)) throw new Stop(i, `the tag <${clipName(qname)}> opened here is not closed with ">"`);
        if (k === before) throw new Stop(k, `expected a space, ">" or "/>" in the tag <${clipName(qname)}>`);
        k = attribute(text, k, qname, attrs, keep);
      }
      const selfClosing = text.charCodeAt(k) === 47;
      const el: XmlElement | undefined = keep ? { name: localName(qname), attrs, children: [], text: '', at: i } : undefined;
      if (el) {
        const parent = stack[stack.length - 1]?.el;
        if (parent) parent.children.push(el);
        else if (depth === 1) root = el;
      }
      rootSeen = true;
      if (!selfClosing) stack.push({ qname, at: i, el });
      i = k + (selfClosing ? 2 : 1);
    }
  }
  const open = stack[stack.length - 1];
  if (open) {
    const name = clipName(open.qname);
    throw new Stop(text.length, `the file ends while <${name}> (opened at ${place(open.at)}) is still open; add </${name}>`);
  }
  if (!root) throw new Stop(text.length, 'there is no element at all; a GraphML file starts with <graphml>');
  return root;
}

/** Reads one attribute at k; returns the offset after its closing quote. */
function attribute(text: string, k: number, tag: string, attrs: string[], keep: boolean): number {
  const name = nameAt(text, k, `an attribute of <${clipName(tag)}>`);
  let j = k + name.length;
  while (isSpace(text.charCodeAt(j))) j++;
  if (text.charCodeAt(j) !== 61) throw new Stop(j, `the attribute ${clipName(name)} of <${clipName(tag)}> needs ="value"`);
  j++;
  while (isSpace(text.charCodeAt(j))) j++;
  const quote = text[j];
  if (quote !== '"' && quote !== "'") throw new Stop(j, `the value of attribute ${clipName(name)} must be in quotes`);
  const end = text.indexOf(quote, j + 1);
  const lt = text.indexOf('<', j + 1);
  if (end < 0 || (lt >= 0 && lt < end)) {
    throw new Stop(j, `the value of attribute ${clipName(name)} of <${clipName(tag)}> opened here has no closing ${quote}`);
  }
  const local = localName(name);
  if (keep && !name.startsWith('xmlns')) {
    for (let a = 0; a < attrs.length; a += 2) {
      if (attrs[a] === local) throw new Stop(k, `the attribute ${clipName(name)} is given twice in <${clipName(tag)}>`);
    }
    attrs.push(local, decode(text.slice(j + 1, end)));
  }
  return end + 1;
}

function skipTo(text: string, from: number, close: string, what: string): number {
  const end = text.indexOf(close, from + 2);
  if (end < 0) throw new Stop(from, `${what} starts here but is never closed with "${close}"`);
  return end + close.length;
}

function nameAt(text: string, at: number, what: string): string {
  NAME.lastIndex = at;
  const m = NAME.exec(text);
  if (!m) {
    const found = at >= text.length ? 'the text ends' : `found ${JSON.stringify(text[at])}`;
    throw new Stop(at, `${what} must be followed by a name, ${found}`);
  }
  return m[0];
}

function localName(qname: string): string {
  const colon = qname.indexOf(':');
  return colon < 0 ? qname : qname.slice(colon + 1);
}

function clipName(name: string): string {
  return name.length > 40 ? `${name.slice(0, 40)}...` : name;
}

function isSpace(c: number): boolean {
  return c === 32 || c === 10 || c === 13 || c === 9;
}

function decode(s: string): string {
  if (!s.includes('&')) return s;
  return s.replace(ENTITY, (all, e: string) => {
    if (e[0] !== '#') return NAMED[e];
    const code = e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10);
    return code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : all;
  });
}
