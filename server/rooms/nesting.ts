import type { ImportFormat } from '../../shared/api/rooms';

/**
 * How deep a JSON or XML text nests, counted in one pass over the bytes without parsing, and
 * stopped as soon as it passes `stopAbove` (so a million-level file costs microseconds).
 * JSON: brackets and braces outside strings. XML: open tags minus close tags (comments,
 * declarations and self-closing tags do not count).
 */
export function nestingDepth(bytes: Uint8Array, format: ImportFormat, stopAbove: number): number {
  return format === 'json' ? jsonDepth(bytes, stopAbove) : xmlDepth(bytes, stopAbove);
}

function jsonDepth(b: Uint8Array, stopAbove: number): number {
  let depth = 0;
  let max = 0;
  let inString = false;
  for (let i = 0; i < b.length; i++) {
    const c = b[i];
    if (inString) {
      if (c === 0x5c)
        i++; // backslash: skip the escaped byte
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      if (++depth > max && (max = depth) > stopAbove) return max;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return max;
}

function xmlDepth(b: Uint8Array, stopAbove: number): number {
  let depth = 0;
  let max = 0;
  for (let i = 0; i < b.length; i++) {
    if (b[i] !== 0x3c) continue; // '<'
    const next = b[i + 1];
    if (next === 0x2f)
      depth--; // '</'
    else if (next !== 0x21 && next !== 0x3f) {
      // an open tag, unless it closes itself ('/>') before its '>'
      let j = i + 1;
      while (j < b.length && b[j] !== 0x3e) j++;
      if (b[j - 1] !== 0x2f && ++depth > max && (max = depth) > stopAbove) return max;
      i = j;
    }
  }
  return max;
}
