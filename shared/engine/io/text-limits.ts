/**
 * Input text checks shared by the parsers: size cap and UTF-8 decoding of raw bytes (the
 * browser's File and Node's Buffer both give a Uint8Array).
 */
import { DEFAULT_LIMITS, IssueList, type Issue, type ParseOptions } from './issues';

export function checkTextSize(text: string, options: ParseOptions, issues: IssueList, file?: string): boolean {
  const max = options.maxChars ?? DEFAULT_LIMITS.maxChars;
  if (text.length <= max) return true;
  issues.error('too-large', `the file has ${text.length} characters, more than the ${max} allowed; split the room or raise the limit`, {
    file,
  });
  return false;
}

export type DecodeResult = { readonly text: string; readonly error?: undefined } | { readonly text?: undefined; readonly error: Issue };

/** Decodes UTF-8 strictly; other encodings get a message naming the first bad byte's line. */
export function decodeUtf8(bytes: Uint8Array, file = 'file'): DecodeResult {
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)) {
    return { error: encodingIssue(file, 1, 'the file is UTF-16; save it as UTF-8 (in a spreadsheet: "CSV UTF-8")') };
  }
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes) };
  } catch {
    const { line, offset } = firstInvalid(bytes);
    return {
      error: encodingIssue(file, line, `byte ${offset + 1} is not valid UTF-8 (the file may be Latin-1 or Windows-1252); save it as UTF-8`),
    };
  }
}

function encodingIssue(file: string, line: number, message: string): Issue {
  return { severity: 'error', code: 'encoding', file, line, message };
}

/** Finds the first byte that breaks UTF-8, with its line. */
function firstInvalid(b: Uint8Array): { line: number; offset: number } {
  let line = 1;
  let i = 0;
  while (i < b.length) {
    const c = b[i];
    if (c === 0x0a) line++;
    let extra = -1;
    if (c < 0x80) extra = 0;
    else if (c >= 0xc2 && c <= 0xdf) extra = 1;
    else if (c >= 0xe0 && c <= 0xef) extra = 2;
    else if (c >= 0xf0 && c <= 0xf4) extra = 3;
    if (extra < 0) return { line, offset: i };
    for (let k = 1; k <= extra; k++) {
      if (i + k >= b.length || (b[i + k] & 0xc0) !== 0x80) return { line, offset: i };
    }
    i += extra + 1;
  }
  return { line, offset: Math.max(0, b.length - 1) };
}
