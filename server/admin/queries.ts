import { z } from 'zod';
import { LIST_LIMITS, pagingFields } from '../../shared/api/lists';
import { idParam } from '../core/ids';

/** Query and path schemas shared by the admin routes: the one list query of shared/api/lists.ts. */
export const pageFields = pagingFields(LIST_LIMITS.admin);
export const pageQuery = z.strictObject(pageFields);
/** Strict ids (server/core/ids.ts): `0x1` or `1e0` answer 404 instead of resolving to 1. */
export const idParams = z.strictObject({ id: idParam('That item') });
