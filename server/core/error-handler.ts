import type { NextFunction, Request, Response } from 'express';
import type { ErrorEnvelope } from '../../shared/api/errors';
import { databaseAnswer } from './db-errors';
import { HttpError } from './http-error';

interface BodyParserError {
  type?: string;
  status?: number;
  code?: string;
  message?: string;
}

/** Maps library errors that are really the client's doing to clear messages. */
function asOperational(err: unknown): HttpError | undefined {
  if (err instanceof HttpError) return err;
  const e = err as BodyParserError;
  if (e?.type === 'entity.parse.failed') return new HttpError(400, 'bad_json', 'The request body is not valid JSON.');
  if (e?.type === 'entity.too.large') return new HttpError(413, 'too_large', 'The request is too large.');
  if (e?.type === 'encoding.unsupported' || e?.type === 'charset.unsupported') {
    return new HttpError(415, 'bad_encoding', 'Send the request as UTF-8.');
  }
  if (e?.code === 'LIMIT_FILE_SIZE') return new HttpError(413, 'too_large', 'The file is larger than the upload limit.');
  if (e?.code && String(e.code).startsWith('LIMIT_')) return new HttpError(400, 'bad_upload', e.message ?? 'The upload was refused.');
  return databaseAnswer(err);
}

/** The one error handler, registered after every route. */
export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction): void {
  const known = asOperational(err);
  if (res.headersSent) {
    req.log?.error({ err }, 'error after headers were sent');
    res.end();
    return;
  }
  if (known) {
    if (known.status >= 500) req.log?.warn({ err }, known.message);
    if (known.status === 503) res.set('Retry-After', '5');
    const body: ErrorEnvelope = { error: { code: known.code, message: known.message, details: known.details } };
    res.status(known.status).json(body);
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  const body: ErrorEnvelope = {
    error: {
      code: 'internal',
      message: `Something went wrong on our side. Quote request id ${typeof req.id === 'object' ? JSON.stringify(req.id) : String(req.id)} if you report it.`,
    },
  };
  res.status(500).json(body);
}
