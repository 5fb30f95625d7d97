/**
 * Runs in a worker thread (server/rooms/parse-upload.ts): reads one upload with the engine's
 * readers, after a nesting-depth check, so a hostile file costs this thread's memory and time,
 * never the request thread's.
 */
import type { ImportFormat } from '../../shared/api/rooms';
import { nestingDepth } from './nesting';
import { readImport, type ParsedImport, type Upload } from './import';

export interface ParseTask {
  file: Upload;
  people?: Upload;
  format: ImportFormat;
  directed: boolean | undefined;
  maxDepth: number;
}

export type ParseOutcome = { ok: true; parsed: ParsedImport } | { ok: false; depth: number };

export default function parseTask(task: ParseTask): ParseOutcome {
  const file = { name: task.file.name, bytes: Buffer.from(task.file.bytes) };
  const people = task.people && { name: task.people.name, bytes: Buffer.from(task.people.bytes) };
  if (task.format !== 'csv') {
    const depth = nestingDepth(file.bytes, task.format, task.maxDepth);
    if (depth > task.maxDepth) return { ok: false, depth };
  }
  return { ok: true, parsed: readImport(file, people, task.format, task.directed) };
}
