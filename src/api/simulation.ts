// Whole-system runs over HTTP (POST /api/simulate, GET /api/revisions/:id/simulation).
import type { RevisionRun, RevisionSimulationQuery, SimulateRequest } from '../../shared/api/simulation';
import type { SimulationResult } from '../../shared/simulation';
import { apiRequest } from './client';

/**
 * Runs a scenario on the server.
 * @param request - design and options.
 * @returns the result.
 */
export async function simulateOnServer(request: SimulateRequest): Promise<SimulationResult> {
  return apiRequest<SimulationResult>('POST', '/api/simulate', request);
}

/**
 * The stored run of a revision (computed by the server the first time it is asked for).
 * @param revisionId - revision id.
 * @param query - scenario, model, harmonic table, coefficients.
 * @returns the stored run.
 */
export async function getRevisionRun(revisionId: string | number, query: RevisionSimulationQuery): Promise<RevisionRun> {
  const params = new URLSearchParams({ scenario: query.scenario, model: query.model, harmonicTable: query.harmonicTable, coefficients: query.coefficients });
  return apiRequest<RevisionRun>('GET', `/api/revisions/${encodeURIComponent(String(revisionId))}/simulation?${params.toString()}`);
}
