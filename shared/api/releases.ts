// Release and access-token payloads (CONTRACT section 6: /api/releases, /api/tokens).
import { z } from 'zod';
import { personSchema, semverSchema } from './common';
import { listFilterText, pageQueryShape } from './paging';

/** Body of `POST /api/revisions/:id/release`. */
export const createReleaseRequestSchema = z.object({ version: semverSchema });
/** A release request. */
export type CreateReleaseRequest = z.infer<typeof createReleaseRequestSchema>;

/** Body of `POST /api/releases/:id/withdraw`: the reason is kept with the release. */
export const withdrawReleaseRequestSchema = z.object({ reason: z.string().trim().min(1, 'must not be empty').max(2000) });
/** A withdrawal. */
export type WithdrawReleaseRequest = z.infer<typeof withdrawReleaseRequestSchema>;

/**
 * Query of `GET /api/releases`: optional filters by design name (exact), design id, version (exact)
 * and `q` (case-insensitive part of the design name or the version); one page, newest first.
 */
export const listReleasesQuerySchema = z.object({
  design: listFilterText(200).optional(),
  designId: z.coerce.number().int().positive().optional(),
  version: semverSchema.optional(),
  q: listFilterText(200).optional(),
  ...pageQueryShape('releases'),
});
/** A release filter. */
export type ListReleasesQuery = z.infer<typeof listReleasesQuerySchema>;

/** A released set. */
export const releaseSchema = z.object({
  id: z.number().int(),
  designId: z.number().int(),
  designName: z.string(),
  revisionId: z.number().int(),
  revisionNumber: z.number().int(),
  version: z.string(),
  fileName: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  releasedBy: personSchema,
  createdAt: z.string(),
  withdrawnAt: z.string().nullable(),
  withdrawnReason: z.string().nullable(),
  withdrawnBy: personSchema.nullable(),
});
/** A released set. */
export type Release = z.infer<typeof releaseSchema>;

/** Body of `POST /api/tokens`. */
export const createTokenRequestSchema = z.object({ name: z.string().trim().min(1, 'must not be empty').max(120) });
/** A token request. */
export type CreateTokenRequest = z.infer<typeof createTokenRequestSchema>;

/** A read-only access token as listed (never the secret). */
export const accessTokenSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  owner: personSchema,
  prefix: z.string(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
/** A listed token. */
export type AccessToken = z.infer<typeof accessTokenSchema>;

/** Answer of `POST /api/tokens`: the secret, shown this once. */
export type CreatedAccessToken = AccessToken & { secret: string };
