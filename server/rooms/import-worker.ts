/**
 * Runs in a worker thread (server/rooms/parse-upload.ts): reads one upload with the engine's
 * readers (which refuse deep nesting themselves, naming line and column), so a hostile file
 * costs this thread's memory and time, never the request thread's.
 */
import type { ImportFormat } from '../../shared/api/rooms';
import { readImport, type ParsedImport, type Upload } from './import';

export interface ParseTask {
  file: Upload;
  people?: Upload;
  format: ImportFormat;
  directed: boolean | undefined;
}

export type ParseOutcome = { ok: true; parsed: ParsedImport };

export default function parseTask(task: ParseTask): ParseOutcome {
  const file = { name: task.file.name, bytes: Buffer.from(task.file.bytes) };
  const people = task.people && { name: task.people.name, bytes: Buffer.from(task.people.bytes) };
  return { ok: true, parsed: readImport(file, people, task.format, task.directed) };
}
