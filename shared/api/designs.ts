// Design working-copy payloads (CONTRACT section 6: /api/designs). The design itself is checked
// by `parseDesign` (shared/api/design.ts); here it is only "some JSON object".
import { z } from 'zod';
import type { DesignInput } from '../control/types';
import { personSchema } from './common';
import { listFilterText, pageQueryShape } from './paging';

/** Revision states: in review, then approved or sent back; released; superseded by a newer submission. */
export const revisionStatusSchema = z.enum(['in-review', 'approved', 'changes-requested', 'released', 'superseded']);
/** A revision state. */
export type RevisionStatus = z.infer<typeof revisionStatusSchema>;

/** Body of `POST /api/designs`. */
export const createDesignRequestSchema = z.object({ design: z.record(z.string(), z.unknown()) });
/** A new design (the design file is validated by parseDesign). */
export type CreateDesignRequest = { design: DesignInput };

/** Body of `PUT /api/designs/:id`: the new content and the `version` the edit started from. */
export const saveDesignRequestSchema = z.object({
  design: z.record(z.string(), z.unknown()),
  baseVersion: z.number().int('must be an integer').nonnegative('must not be negative'),
});
/** A save of the working copy. */
export type SaveDesignRequest = { design: DesignInput; baseVersion: number };

/** A revision in short form. */
export const revisionSummarySchema = z.object({
  id: z.number().int(),
  designId: z.number().int(),
  number: z.number().int(),
  status: revisionStatusSchema,
  summary: z.string(),
  createdAt: z.string(),
  author: personSchema,
  errorCount: z.number().int(),
  warningCount: z.number().int(),
});
/** A revision in short form. */
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

/** A release in short form. */
export const releaseSummarySchema = z.object({
  id: z.number().int(),
  version: z.string(),
  revisionNumber: z.number().int(),
  createdAt: z.string(),
  withdrawnAt: z.string().nullable(),
});
/** A release in short form. */
export type ReleaseSummary = z.infer<typeof releaseSummarySchema>;

/** One row of `GET /api/designs`. */
export const designSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  owner: personSchema,
  version: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
  latestRevision: revisionSummarySchema.nullable(),
  latestRelease: releaseSummarySchema.nullable(),
});
/** A design row. */
export type DesignSummary = z.infer<typeof designSummarySchema>;

/** `GET /api/designs/:id`: the summary plus the working copy; send `version` back as `baseVersion`. */
export type DesignDetail = DesignSummary & { design: DesignInput };

/** Orders of `GET /api/designs`: by name or by last save, `-` first for descending. */
export const designSortSchema = z.enum(['name', '-name', 'updatedAt', '-updatedAt']);
/** An order of the designs list. */
export type DesignSort = z.infer<typeof designSortSchema>;

/**
 * Query of `GET /api/designs`: optional case-insensitive name filter, status of the latest revision,
 * one design by id (the row a page needs without walking the list), order (default by name), one page.
 */
export const listDesignsQuerySchema = z.object({
  q: listFilterText(200).optional(),
  id: z.coerce.number().int('must be an integer').positive('must be positive').optional(),
  status: revisionStatusSchema.optional(),
  sort: designSortSchema.default('name'),
  ...pageQueryShape('designs'),
});
/** A designs-list query. */
export type ListDesignsQuery = z.infer<typeof listDesignsQuerySchema>;

/** Body of `409` on a stale save: the error plus the version now stored. */
export type StaleSaveDetails = { currentVersion: number };
