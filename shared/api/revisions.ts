// Revision, review and diff payloads (CONTRACT section 6: /api/revisions).
import { z } from 'zod';
import type { AnalysisResult, DesignInput } from '../control/types';
import { idParamSchema, personSchema } from './common';
import { pageQueryShape } from './paging';
import type { RevisionSummary } from './designs';

/** Query of `GET /api/designs/:id/revisions`: optionally only the revisions numbered below `before`; one page, newest first. */
export const listRevisionsQuerySchema = z.object({
  before: z.coerce.number().int('must be an integer').positive('must be positive').optional(),
  ...pageQueryShape('revisions'),
});
/** A revisions-list query. */
export type ListRevisionsQuery = z.infer<typeof listRevisionsQuerySchema>;

/** Body of `POST /api/designs/:id/revisions`. */
export const submitRevisionRequestSchema = z.object({
  summary: z.string().trim().min(1, 'must not be empty').max(2000, 'must be at most 2000 characters'),
});
/** A submission. */
export type SubmitRevisionRequest = z.infer<typeof submitRevisionRequestSchema>;

/** Review decisions. */
export const reviewDecisionSchema = z.enum(['approve', 'changes']);
/** A review decision. */
export type ReviewDecision = z.infer<typeof reviewDecisionSchema>;

/** Body of `POST /api/revisions/:id/reviews`; a comment is required when sending back. */
export const createReviewRequestSchema = z
  .object({ decision: reviewDecisionSchema, comment: z.string().trim().max(4000, 'must be at most 4000 characters').default('') })
  .refine((v) => v.decision === 'approve' || v.comment.length > 0, { path: ['comment'], message: 'must explain the requested changes' });
/** A review. */
export type CreateReviewRequest = z.infer<typeof createReviewRequestSchema>;

/** One review as shown with its revision. */
export const reviewSchema = z.object({
  id: z.number().int(),
  revisionId: z.number().int(),
  reviewer: personSchema,
  decision: reviewDecisionSchema,
  comment: z.string(),
  createdAt: z.string(),
});
/** A review. */
export type Review = z.infer<typeof reviewSchema>;

/** One row of `GET /api/designs/:id/revisions`: the revision with its reviews (the comments reach the author). */
export type RevisionListItem = RevisionSummary & { reviews: Review[] };

/** `GET /api/revisions/:id`: the frozen design, its server-computed analysis and its reviews. */
export type RevisionDetail = RevisionSummary & {
  designName: string;
  design: DesignInput;
  analysis: AnalysisResult;
  reviews: Review[];
  release: { id: number; version: string } | null;
};

/** Route parameters of `GET /api/revisions/:a/diff/:b`. */
export const diffParamsSchema = z.object({ a: idParamSchema, b: idParamSchema });

/** One changed value: where, before, after. `null` stands for "absent". */
export type DiffChange = { path: string; before: unknown; after: unknown };

/** `GET /api/revisions/:a/diff/:b`: what changed from revision a to revision b. */
export type RevisionDiff = {
  from: { id: number; number: number; designId: number };
  to: { id: number; number: number; designId: number };
  inputs: DiffChange[];
  gains: DiffChange[];
  coefficients: DiffChange[];
  fixedCoefficients: DiffChange[];
  formats: DiffChange[];
  margins: DiffChange[];
  checks: { added: DiffChange[]; removed: DiffChange[]; changed: DiffChange[] };
  /** Unified diff of the generated coefficient header (empty string when identical). */
  headerDiff: string;
};
