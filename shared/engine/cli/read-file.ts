/**
 * Reading local files for the command line: only regular files (a FIFO, a device such as
 * /dev/zero, a folder or a socket is refused before it is opened for reading), at most a stated
 * size, read in chunks and decoded as strict UTF-8 piece by piece, so a reader can stop at the
 * first bad row without reading (or holding) the rest.
 */
import { closeSync, constants, fstatSync, openSync, readSync, statSync } from 'node:fs';
import { decodeUtf8, describeIssue } from '../io/index';
import { CliError, idList } from './args';

/** Room files above this size are refused (stated in --help). */
export const MAX_FILE_BYTES = 256 * 1024 * 1024;
/** Id lists (--starters-file and the like) above this size are refused. */
export const MAX_ID_FILE_BYTES = 16 * 1024 * 1024;

const CHUNK_BYTES = 1024 * 1024;

/** A path as shown in a message: at most 80 characters (the end, which names the file). */
export function shownPath(file: string): string {
  return file.length > 80 ? `...${file.slice(-77)}` : file;
}

/** Opens a regular file for reading; everything else is refused with a reason. */
function openRegular(file: string, max: number): number {
  const path = shownPath(file);
  let fd: number;
  try {
    const st = statSync(file);
    if (st.isDirectory()) throw new CliError(`${path}: cannot read the file (is a folder, not a file)`);
    if (!st.isFile()) {
      throw new CliError(`${path}: cannot read the file (not a regular file: a pipe, device or socket); give the path of a room file`);
    }
    // O_NONBLOCK: should the path have become a FIFO since, opening it does not wait for a writer.
    fd = openSync(file, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    if (e instanceof CliError) throw e;
    throw new CliError(`${path}: cannot read the file (${why(e)})`);
  }
  const st = fstatSync(fd);
  if (!st.isFile()) {
    closeSync(fd);
    throw new CliError(`${path}: cannot read the file (not a regular file: a pipe, device or socket)`);
  }
  if (st.size > max) {
    closeSync(fd);
    throw new CliError(`${path}: the file is larger than ${max / 1024 / 1024} MiB, the most read; split the room`);
  }
  return fd;
}

function why(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EISDIR') return 'is a folder, not a file';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  return code ?? 'unknown reason';
}

/** Reads a whole file as UTF-8 text (for JSON and GraphML, which are read whole). */
export function readTextFile(file: string, what: string, max = MAX_FILE_BYTES): string {
  return [...textChunks(file, what, max, Infinity)].join('');
}

/**
 * Yields the file's text in pieces of about 1 MiB, each cut at a UTF-8 character boundary and
 * decoded strictly. Stops with a CliError past `max` bytes (a file that grows while read).
 */
export function* textChunks(file: string, what: string, max = MAX_FILE_BYTES, chunkBytes = CHUNK_BYTES): Generator<string> {
  const fd = openRegular(file, max);
  const size = Math.min(chunkBytes, max + 1, Math.max(fstatSync(fd).size + 1, 1));
  const buffer = Buffer.allocUnsafe(Math.min(size, CHUNK_BYTES * 64));
  let carry: Buffer = Buffer.alloc(0);
  let offset = 0;
  let lines = 0;
  try {
    for (;;) {
      const n = readSync(fd, buffer, 0, buffer.length, null);
      const end = n === 0;
      if (offset + n > max) throw new CliError(`${shownPath(file)}: the file is larger than ${max / 1024 / 1024} MiB, the most read`);
      const bytes = carry.length > 0 ? Buffer.concat([carry, buffer.subarray(0, n)]) : buffer.subarray(0, n);
      const cut = end ? bytes.length : boundary(bytes);
      const piece = bytes.subarray(0, cut);
      const decoded = decodeUtf8(piece, what);
      if (decoded.error) {
        const at = decoded.error;
        const line = (at.line ?? 1) + lines;
        const message = at.message.replace(/^byte (\d+)/, (_, b: string) => `byte ${Number(b) + offset}`);
        throw new CliError(`${shownPath(file)}: ${describeIssue({ ...at, line, message })}`);
      }
      offset += cut;
      carry = Buffer.from(bytes.subarray(cut));
      for (let k = decoded.text.indexOf('\n'); k >= 0; k = decoded.text.indexOf('\n', k + 1)) lines++;
      if (decoded.text.length > 0) yield decoded.text;
      if (end) return;
    }
  } finally {
    closeSync(fd);
  }
}

/** Where the last complete UTF-8 character ends (a cut there never splits a character). */
function boundary(b: Uint8Array): number {
  const k = b.length;
  // step back over at most 3 continuation bytes to the lead byte of the last character
  let back = 0;
  while (back < 3 && k - back - 1 >= 0 && (b[k - back - 1] & 0xc0) === 0x80) back++;
  const lead = k - back - 1;
  if (lead < 0) return k;
  const c = b[lead];
  const need = c >= 0xf0 ? 4 : c >= 0xe0 ? 3 : c >= 0xc0 ? 2 : 1;
  return back + 1 >= need ? k : lead;
}

/**
 * Ids from `--NAME IDS` or `--NAME-file FILE` (one id per line, exactly as written: nothing is
 * trimmed; blank lines and a byte-order mark are skipped). Giving both is an error.
 */
export function idsFromFlags(flags: Map<string, string>, name: string): string[] | undefined {
  const file = flags.get(`${name}-file`);
  if (file !== undefined && flags.has(name)) throw new CliError(`give --${name} or --${name}-file, not both`);
  if (file === undefined) return flags.has(name) ? idList(flags, name) : undefined;
  const text = readTextFile(file, `--${name}-file`, MAX_ID_FILE_BYTES).replace(/^\uFEFF/, '');
  const ids = text.split(/\r\n|\n|\r/).filter((line) => line.trim() !== '');
  if (ids.length === 0) throw new CliError(`--${name}-file ${shownPath(file)}: the file lists no ids (one id per line)`);
  return ids;
}
