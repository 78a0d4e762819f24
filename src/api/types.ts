// Client-side view of the API payloads of CONTRACT section 6 that the shared DTO schemas
// (shared/api) do not export yet. Replace each with the z.infer type as the schemas land.
import type { AnalysisResult, DesignInput } from '../../shared/control';

/** The four roles of CONTRACT section 6. */
export type Role = 'engineer' | 'reviewer' | 'tester' | 'admin';

/** Every role, in the order the navigation lists them. */
export const ROLES: readonly Role[] = ['engineer', 'reviewer', 'tester', 'admin'];

/** The signed-in account. */
export interface SessionUser {
  id: number | string;
  email: string;
  name: string;
  role: Role;
}

/** Answer of `POST /api/auth/login`. */
export interface LoginResponse {
  token: string;
  user: SessionUser;
}

/** Revision status. */
export type RevisionStatus = 'in-review' | 'approved' | 'changes-requested' | 'released' | string;

/** Short form of a revision inside a design summary. */
export interface RevisionSummary {
  id: number | string;
  number: number;
  status: RevisionStatus;
  summary?: string | null;
  createdAt?: string | null;
  author?: { id: number | string; name: string; email?: string } | null;
}

/** Short form of a release inside a design summary. */
export interface ReleaseSummary {
  id: number | string;
  version: string;
  createdAt?: string | null;
}

/** One row of `GET /api/designs`. */
export interface DesignSummary {
  id: number | string;
  name: string;
  owner?: { id: number | string; name: string; email?: string } | null;
  updatedAt?: string | null;
  version?: number;
  latestRevision?: RevisionSummary | null;
  latestRelease?: ReleaseSummary | null;
}

/** Working copy of a design (`GET /api/designs/:id`). */
export interface DesignDetail extends DesignSummary {
  design: DesignInput;
  /** Optimistic-locking version to send back as `baseVersion`. */
  version: number;
}

/** A frozen revision (`GET /api/revisions/:id`). */
export interface RevisionDetail extends RevisionSummary {
  designId: number | string;
  design: DesignInput;
  analysis: AnalysisResult;
}
