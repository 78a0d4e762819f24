// Designs: create, list, read and save working copies with an optimistic lock.
import type { DesignInput } from '../../shared/control';
import type { ListDesignsQuery } from '../../shared/api/designs';
import { AppError, conflict, notFound } from '../errors';
import { record } from '../audit/service';
import type { AppContext, UserActor } from '../middleware/context';
import { findDesign, findDesignByName, insertDesign, listDesignRows, updateDesignIfVersion, type DesignListRow, type DesignRow } from './repository';
import { requireValidDesign } from './designFile';

/**
 * Lists designs.
 * @param q - name and status filters, order, page.
 * @returns one page of rows and how many match.
 */
export function listDesigns(q: ListDesignsQuery): Promise<{ rows: DesignListRow[]; total: number }> {
  return listDesignRows(q);
}

/**
 * Loads a design or fails with 404.
 * @param id - design id.
 * @returns the row.
 */
export async function getDesign(id: number): Promise<DesignRow> {
  const row = await findDesign(id);
  if (!row) throw notFound(`design ${id}`);
  return row;
}

const nameTaken = (name: string): AppError => new AppError('name-taken', `a design named "${name}" already exists`, 409, { fields: [{ path: 'design.name', message: 'is already used by another design' }] });

/**
 * Creates a design owned by the engineer.
 * @param app - services.
 * @param actor - the engineer.
 * @param candidate - the design file sent.
 * @returns the row.
 */
export async function createDesign(app: AppContext, actor: UserActor, candidate: unknown): Promise<DesignRow> {
  const design = await requireValidDesign(candidate);
  return app.db.write(async (t) => {
    if (await findDesignByName(design.name, t)) throw nameTaken(design.name);
    const row = await insertDesign({ name: design.name, ownerId: actor.id, design }, t);
    await record(t, actor, 'design.create', 'design', row.id, { name: row.name });
    return row;
  });
}

/**
 * Saves a working copy; 409 when someone saved since `baseVersion`.
 * @param app - services.
 * @param actor - the engineer.
 * @param id - design id.
 * @param candidate - the design file sent.
 * @param baseVersion - version the edit started from.
 * @returns the saved row.
 */
export async function saveDesign(app: AppContext, actor: UserActor, id: number, candidate: unknown, baseVersion: number): Promise<DesignRow> {
  const design: DesignInput = await requireValidDesign(candidate);
  return app.db.write(async (t) => {
    const current = await findDesign(id, t);
    if (!current) throw notFound(`design ${id}`);
    const stale = () => conflict('stale-version', `design ${id} was saved by someone else (now version ${current.version}, your edit started from ${baseVersion}); reload and reapply your change`, { currentVersion: current.version });
    if (current.version !== baseVersion) throw stale();
    if (design.name !== current.name) {
      const other = await findDesignByName(design.name, t);
      if (other && other.id !== id) throw nameTaken(design.name);
    }
    if (!(await updateDesignIfVersion(id, design, baseVersion, t))) throw stale();
    await record(t, actor, 'design.save', 'design', id, { version: baseVersion + 1 });
    return (await findDesign(id, t)) as DesignRow;
  });
}
