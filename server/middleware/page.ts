// Sends one page of a list: the rows as the JSON array CONTRACT section 6 describes, the number of
// rows matching the filters in the `X-Total-Count` header (shared/api/paging.ts).
import type { Response } from 'express';
import { TOTAL_COUNT_HEADER } from '../../shared/api/paging';

/**
 * Answers with one page.
 * @param res - the response.
 * @param items - the presented rows of the page.
 * @param total - rows matching the filters, all pages together.
 */
export function sendPage(res: Response, items: unknown[], total: number): void {
  res.set(TOTAL_COUNT_HEADER, String(total));
  res.json(items);
}
