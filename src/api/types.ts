// API payload types for the client, from the shared DTO schemas (shared/api, z.infer types).
export type { Role } from '../../shared/api/common';
export type { LoginResponse, SessionUser } from '../../shared/api/auth';
export type { DesignDetail, DesignSummary, ReleaseSummary, RevisionStatus, RevisionSummary, StaleSaveDetails } from '../../shared/api/designs';
export type { RevisionDetail } from '../../shared/api/revisions';
export type { Page, PageRequest } from '../../shared/api/paging';
