import { z } from 'zod';

/** Query and path schemas shared by the admin routes. */
export const pageFields = {
  page: z.coerce.number().int().min(0).max(1_000_000).default(0),
  size: z.coerce.number().int().min(1).max(100).default(25),
};
export const pageQuery = z.strictObject(pageFields);
export const idParams = z.strictObject({ id: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER) });
