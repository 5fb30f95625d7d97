import type { z } from 'zod';
import type { FieldError } from '../../shared/api/errors';
import { badRequest } from './http-error';

/** Parses with a zod schema; a failure becomes a 400 whose details name each field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown, where = 'request body'): z.infer<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const fields: FieldError[] = result.error.issues.map((issue) => {
    const path = issue.path.join('.');
    if (issue.code === 'unrecognized_keys') {
      return { field: issue.keys.join(', '), message: `Unknown field${issue.keys.length > 1 ? 's' : ''}: ${issue.keys.join(', ')}.` };
    }
    return { field: path || '(root)', message: issue.message };
  });
  const summary = fields.map((f) => (f.field === '(root)' ? f.message : `${f.field}: ${f.message}`)).join('; ');
  throw badRequest(`Please check the ${where}: ${summary}`, { fields });
}
