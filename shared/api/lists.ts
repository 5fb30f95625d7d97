/**
 * The one shape of every paged list (rooms, people, ties, accounts, audit log, outbox): the query
 * `?page&pageSize&sort&direction&q` and the answer Page<T>. Each list has its own sort keys,
 * defaults and largest page (LIST_LIMITS); the server's zod schema comes from pageQuerySchema.
 */
import { z } from 'zod';

export const SORT_DIRECTIONS = ['asc', 'desc'] as const;
export type SortDirection = (typeof SORT_DIRECTIONS)[number];

export interface PageQuery<S extends string = string> {
  /** 0-based. */
  page?: number;
  pageSize?: number;
  sort?: S;
  direction?: SortDirection;
  /** Case-insensitive text filter. */
  q?: string;
}

export interface Page<T> {
  items: T[];
  total: number;
  /** 0-based, as asked. */
  page: number;
  pageSize: number;
}

/** A query once the server parsed it: defaults filled in. */
export interface ListParams<S extends string = string> {
  page: number;
  pageSize: number;
  sort: S;
  direction: SortDirection;
  q?: string;
}

export const LIST_LIMITS = {
  /** Longest text filter. */
  qMax: 200,
  /** Rooms, people and ties. */
  rooms: { pageSizeDefault: 50, pageSizeMax: 500 },
  /** Accounts, audit log and outbox. */
  admin: { pageSizeDefault: 25, pageSizeMax: 100 },
} as const;

export interface PageQueryOptions<S extends string> {
  sorts: readonly [S, ...S[]];
  sort: S;
  direction: SortDirection;
  pageSizeDefault: number;
  pageSizeMax: number;
}

/** The query fields of a list with sort keys (strings, as in a URL); messages say what to fix. */
export function pageQueryFields<S extends string>(o: PageQueryOptions<S>) {
  return {
    ...pagingFields(o),
    sort: z.enum(o.sorts, `sort must be one of ${o.sorts.join(', ')}.`).default(o.sort as never),
    direction: z.enum(SORT_DIRECTIONS, 'direction must be asc or desc.').default(o.direction),
  };
}

/** page, pageSize and q alone, for a list in one fixed order (audit log, outbox). */
export function pagingFields(o: { pageSizeDefault: number; pageSizeMax: number }) {
  return {
    page: z.coerce.number({ error: 'page must be a number.' }).int().min(0, 'page starts at 0.').max(1_000_000).default(0),
    pageSize: z.coerce
      .number({ error: 'pageSize must be a number.' })
      .int()
      .min(1, 'pageSize is at least 1.')
      .max(o.pageSizeMax, `pageSize can be at most ${o.pageSizeMax}.`)
      .default(o.pageSizeDefault),
    q: z.string().trim().max(LIST_LIMITS.qMax, `q can be at most ${LIST_LIMITS.qMax} characters.`).optional(),
  };
}
