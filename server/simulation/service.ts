// Whole-system runs: of a design sent by the client, and of a frozen revision (stored the first
// time it is asked for, then served as stored).
import { defaultSimulationOptions, type SimulationResult } from '../../shared/simulation';
import { toSimulationOptions, type RevisionSimulationQuery, type SimulateRequest } from '../../shared/api/simulation';
import { notFound } from '../errors';
import type { AppContext } from '../middleware/context';
import { requireValidDesign } from '../designs/designFile';
import { TOOL_VERSION } from '../releases/exporter';
import { findRevision } from '../revisions/repository';
import { findRevisionRun, storeRevisionRun, type RevisionRunRow } from './repository';

/** Points per trace of a stored revision run (enough for the revision page's plots, about 150 KB of JSON). */
export const REVISION_RUN_TRACE_POINTS = 800;

/**
 * Validates the design and runs the scenario in the simulation pool.
 * @param app - services.
 * @param request - design and options.
 * @returns the result.
 */
export async function simulateDesign(app: AppContext, request: SimulateRequest): Promise<SimulationResult> {
  const { design: candidate, ...options } = request;
  const design = await requireValidDesign(candidate);
  return app.simulation.simulate(design, null, toSimulationOptions(options));
}

/**
 * The stored run of a revision: computed from its frozen design and analysis with the default
 * options of the scenario, stored, and served as stored from then on.
 *
 * Why stored on first request rather than at submission: the run is a pure function of the frozen
 * revision, so nothing is lost by computing it when someone first looks; most of the eight
 * scenario/model combinations are never looked at; and submitting stays as fast as before. Once
 * stored, a later Varsmith version never changes what a reviewer saw (the row records the version).
 *
 * @param app - services.
 * @param revisionId - revision id.
 * @param query - which run.
 * @returns the stored run.
 */
export async function revisionRun(app: AppContext, revisionId: number, query: RevisionSimulationQuery): Promise<RevisionRunRow> {
  const key = { revisionId, ...query };
  const stored = await findRevisionRun(key);
  if (stored) return stored;
  const revision = await findRevision(revisionId);
  if (!revision) throw notFound(`revision ${revisionId}`);
  const options = { ...defaultSimulationOptions(query.scenario), model: query.model, harmonicTable: query.harmonicTable, coefficients: query.coefficients, tracePoints: REVISION_RUN_TRACE_POINTS };
  const result = await app.simulation.simulate(revision.design, revision.analysis, options);
  return storeRevisionRun(key, TOOL_VERSION, result);
}
