import { HttpParams } from '@angular/common/http';
import type { PageQuery } from '../../../shared/api/lists';

/** A list query (shared/api/lists.ts) as URL parameters; empty values are left out so the server's defaults apply. */
export function pageParams<Q extends PageQuery>(q: Q): HttpParams {
  let params = new HttpParams();
  for (const [k, v] of Object.entries(q) as [string, unknown][]) if (v !== undefined && v !== '') params = params.set(k, String(v));
  return params;
}
