// Paging of the list routes (designs, revisions, releases, audit, mail). A list answer stays the JSON
// array CONTRACT section 6 describes, now one page of it: `limit` rows from `offset` in the route's
// order; the number of rows matching the filters is the `X-Total-Count` header. A caller that sends
// no paging parameters gets the first page of the route's default size.
import { z } from 'zod';

/** Response header holding the number of rows that match the filters (all pages together). */
export const TOTAL_COUNT_HEADER = 'X-Total-Count';

/** Largest accepted `offset` (a cap, common practice, no source): deeper pages are refused with 400. */
export const PAGE_OFFSET_MAX = 1_000_000;

/** Default and largest page size of each list route. */
export const PAGE_SIZES = {
  designs: { default: 50, max: 200 },
  revisions: { default: 50, max: 200 },
  releases: { default: 50, max: 200 },
  audit: { default: 200, max: 1000 },
  mail: { default: 100, max: 500 },
} as const;

/** A list route that pages. */
export type PagedList = keyof typeof PAGE_SIZES;

/**
 * The `limit` and `offset` query fields of one list route.
 *
 * @param list - which list (its default and largest page size, rows).
 * @returns the zod shape to spread into the route's query schema.
 * @example
 * z.object(pageQueryShape('releases')).parse({}); // => { limit: 50, offset: 0 }
 */
export function pageQueryShape(list: PagedList) {
  const size = PAGE_SIZES[list];
  return {
    limit: z.coerce.number().int('must be an integer').min(1, 'must be at least 1').max(size.max, `must be at most ${size.max}`).default(size.default),
    offset: z.coerce.number().int('must be an integer').min(0, 'must not be negative').max(PAGE_OFFSET_MAX, `must be at most ${PAGE_OFFSET_MAX}`).default(0),
  };
}

/**
 * A text filter of a list query (a name part, an exact name, an address part): at most `max`
 * characters and no control characters (a NUL byte is refused by PostgreSQL and would end in 500).
 *
 * @param max - largest length, characters.
 * @returns the zod schema.
 * @example
 * listFilterText(200).safeParse('a\u0000b').success; // => false
 */
export function listFilterText(max: number) {
  return z.string().max(max, `must be at most ${max} characters`)
    .refine((v) => !/[\u0000-\u001f\u007f]/.test(v), { message: 'must not contain control characters' });
}

/** Which rows of a list: `limit` rows after skipping `offset`. */
export interface PageRequest {
  limit: number;
  offset: number;
}

/** One page of a list with the number of rows matching the filters. */
export interface Page<T> {
  items: T[];
  /** Rows matching the filters, all pages together. */
  total: number;
  limit: number;
  offset: number;
}
