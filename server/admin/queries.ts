import { z } from 'zod';
import { idParam } from '../core/ids';

/** Query and path schemas shared by the admin routes. */
export const pageFields = {
  page: z.coerce.number().int().min(0).max(1_000_000).default(0),
  size: z.coerce.number().int().min(1).max(100).default(25),
};
export const pageQuery = z.strictObject(pageFields);
/** Strict ids (server/core/ids.ts): `0x1` or `1e0` answer 404 instead of resolving to 1. */
export const idParams = z.strictObject({ id: idParam('That item') });
