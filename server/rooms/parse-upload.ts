/**
 * Uploads are read in worker threads (a small piscina pool), never on the request thread: a
 * deeply nested or huge file cannot stall other requests or the health probe. Each thread has a
 * memory cap (IMPORT_WORKER_MB, worker resourceLimits); a file that needs more answers 400 naming
 * the cap (the readers themselves refuse nesting deeper than 64 levels). A thread that ran out of
 * memory is replaced by the pool.
 */
import { Piscina } from 'piscina';
import type { ImportFormat } from '../../shared/api/rooms';
import { config } from '../config';
import { HttpError } from '../core/http-error';
import type { ParsedImport, Upload } from './import';
import type { ParseOutcome, ParseTask } from './import-worker';

let pool: Piscina | undefined;

function workers(): Piscina {
  const here = import.meta.url;
  pool ??= new Piscina({
    filename: new URL(here.endsWith('.ts') ? './import-worker.ts' : './import-worker.js', here).href,
    minThreads: 0,
    maxThreads: 2,
    idleTimeout: 30_000,
    maxQueue: 16,
    resourceLimits: { maxOldGenerationSizeMb: config.IMPORT_WORKER_MB, maxYoungGenerationSizeMb: 32, stackSizeMb: 4 },
  });
  return pool;
}

export async function parseUpload(
  file: Upload,
  people: Upload | undefined,
  format: ImportFormat,
  directed: boolean | undefined,
): Promise<ParsedImport> {
  const task: ParseTask = { file, people, format, directed };
  let outcome: ParseOutcome;
  try {
    outcome = (await workers().run(task)) as ParseOutcome;
  } catch (err) {
    throw uploadFailure(err, file.name);
  }
  return outcome.parsed;
}

function uploadFailure(err: unknown, name: string): HttpError {
  const e = err as { code?: string; message?: string; name?: string };
  if (e?.code === 'ERR_WORKER_OUT_OF_MEMORY') {
    return new HttpError(
      400,
      'too_big_to_read',
      `"${name}" needs more than ${config.IMPORT_WORKER_MB} MB of memory to read (the limit for one upload). Split the room into smaller files.`,
      { limitMb: config.IMPORT_WORKER_MB },
    );
  }
  if (e?.name === 'RangeError' || /call stack/i.test(e?.message ?? '')) {
    return new HttpError(400, 'too_deep', `"${name}" nests too deeply to read. Export it again from the program that made it.`);
  }
  if (/queue is at limit/i.test(e?.message ?? '')) {
    return new HttpError(503, 'busy', 'The server is reading many files right now. Try again in a few seconds.');
  }
  return err as HttpError;
}

export async function stopUploadWorkers(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
