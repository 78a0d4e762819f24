// Storage of revision runs; returns plain objects.
import { UniqueConstraintError } from 'sequelize';
import type { SimulationResult } from '../../shared/simulation';
import { RevisionSimulationModel } from './model';

/** Which run of a revision. */
export interface RevisionRunKey {
  revisionId: number;
  scenario: string;
  model: string;
  harmonicTable: string;
  coefficients: string;
}

/** A stored run. */
export interface RevisionRunRow extends RevisionRunKey {
  id: number;
  toolVersion: string;
  result: SimulationResult;
  createdAt: Date;
}

const plain = (m: RevisionSimulationModel): RevisionRunRow => ({
  id: m.id, revisionId: m.revisionId, scenario: m.scenario, model: m.model, harmonicTable: m.harmonicTable, coefficients: m.coefficients,
  toolVersion: m.toolVersion, result: JSON.parse(m.result) as SimulationResult, createdAt: m.createdAt,
});

/**
 * The stored run with these options.
 * @param key - revision and options.
 * @returns the row or null.
 */
export async function findRevisionRun(key: RevisionRunKey): Promise<RevisionRunRow | null> {
  const m = await RevisionSimulationModel.findOne({ where: { ...key } });
  return m ? plain(m) : null;
}

/**
 * Stores a run unless another request stored the same one first (one row per key; the first wins).
 * @param key - revision and options.
 * @param toolVersion - Varsmith version that computed it.
 * @param result - the result.
 * @returns the stored row (this one or the earlier one).
 */
export async function storeRevisionRun(key: RevisionRunKey, toolVersion: string, result: SimulationResult): Promise<RevisionRunRow> {
  try {
    return plain(await RevisionSimulationModel.create({ ...key, toolVersion, result: JSON.stringify(result) }));
  } catch (err) {
    if (!(err instanceof UniqueConstraintError)) throw err;
    const existing = await findRevisionRun(key);
    if (!existing) throw err;
    return existing;
  }
}
