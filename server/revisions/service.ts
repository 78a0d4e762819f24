// Revisions: freeze the working copy with its server-computed analysis; read; compare.
import { createTwoFilesPatch } from 'diff';
import { analyzeDesign, type AnalysisResult } from '../../shared/control';
import type { ListRevisionsQuery, RevisionDiff } from '../../shared/api/revisions';
import { AppError, notFound } from '../errors';
import { record } from '../audit/service';
import type { AppContext, UserActor } from '../middleware/context';
import { notifyRole } from '../mail/notify';
import { designExists, findDesign, lockDesign } from '../designs/repository';
import { requireValidDesign } from '../designs/designFile';
import { renderHeader, TOOL_VERSION, type ExportInput } from '../releases/exporter';
import { compareRevisions } from './diff';
import {
  findRevision, insertRevision, listRevisionSummaries, maxRevisionNumber, openRevisionsBefore, setRevisionStatus, type RevisionRow, type RevisionSummaryRow,
} from './repository';

/** Analysis options for frozen revisions: numbers only, no plot data (the contract's server analysis). */
export const REVISION_ANALYSIS_OPTIONS = { sweepPoints: 0, responseSamples: 0 } as const;

/**
 * Analyses a design for a revision; a core failure becomes 422 with its message.
 * @param design - the validated design.
 * @returns the analysis.
 */
function analyseForRevision(design: Parameters<typeof analyzeDesign>[0]): AnalysisResult {
  try {
    return analyzeDesign(design, REVISION_ANALYSIS_OPTIONS);
  } catch (err) {
    throw new AppError('analysis-failed', `the design could not be analysed: ${(err as Error).message}`, 422);
  }
}

/**
 * Freezes the saved working copy as the next revision, in review; older open revisions are superseded.
 * The copy is analysed before the transaction; inside it the design row is locked, so the number is
 * the next one even with submissions arriving at once through several server processes.
 * @param app - services.
 * @param actor - the engineer.
 * @param designId - design id.
 * @param summary - what changed.
 * @returns the new revision.
 */
export async function submitRevision(app: AppContext, actor: UserActor, designId: number, summary: string): Promise<RevisionRow> {
  const design = await findDesign(designId);
  if (!design) throw notFound(`design ${designId}`);
  const frozen = await requireValidDesign(design.design, 'design');
  const analysis = analyseForRevision(frozen);
  const revision = await app.db.write(async (t) => {
    if (!(await lockDesign(designId, t))) throw notFound(`design ${designId}`);
    const number = (await maxRevisionNumber(designId, t)) + 1;
    const row = await insertRevision({
      designId, number, authorId: actor.id, summary, status: 'in-review', design: frozen, analysis,
      errorCount: analysis.checks.filter((c) => c.severity === 'error').length,
      warningCount: analysis.checks.filter((c) => c.severity === 'warning').length,
    }, t);
    for (const older of await openRevisionsBefore(designId, number, t)) {
      await setRevisionStatus(older.id, 'superseded', t);
      await record(t, actor, 'revision.supersede', 'revision', older.id, { designId, number: older.number, by: number });
    }
    await record(t, actor, 'revision.submit', 'revision', row.id, { designId, number, designVersion: design.version });
    return row;
  });
  await notifyRole(app, 'reviewer', `[Varsmith] ${revision.design.name} r${revision.number} waits for review`,
    `${actor.name} submitted revision r${revision.number} of "${revision.design.name}" for review.\n\nSummary: ${summary}\n\n` +
    `Checks: ${revision.errorCount} error(s), ${revision.warningCount} warning(s).\n\nOpen it: ${app.config.publicUrl}/revisions/${revision.id}\n`);
  return revision;
}

/**
 * Loads a revision or fails with 404.
 * @param id - revision id.
 * @returns the row.
 */
export async function getRevision(id: number): Promise<RevisionRow> {
  const row = await findRevision(id);
  if (!row) throw notFound(`revision ${id}`);
  return row;
}

/**
 * Lists the revisions of a design, newest first.
 * @param designId - design id.
 * @param page - limit and offset.
 * @returns one page of rows (no design, no analysis) and how many there are.
 */
export async function revisionsOfDesign(designId: number, page: ListRevisionsQuery): Promise<{ rows: RevisionSummaryRow[]; total: number }> {
  if (!(await designExists(designId))) throw notFound(`design ${designId}`);
  return listRevisionSummaries(designId, page);
}

/**
 * Export input for a revision's header (the release version is not known yet: the header says "unreleased").
 * @param row - the revision.
 * @param version - the version to stamp.
 * @returns the export input.
 */
export function exportInputOf(row: RevisionRow, version: string): ExportInput {
  return { design: row.design, analysis: row.analysis, version, revision: row.number, createdAt: row.createdAt, draft: false, toolVersion: TOOL_VERSION };
}

/** Version stamped into headers rendered for review and diff (not a release). */
export const REVIEW_HEADER_VERSION = '0.0.0-review';

/**
 * The generated coefficient header of a revision.
 * @param id - revision id.
 * @returns the header text.
 */
export async function revisionHeader(id: number): Promise<string> {
  return renderHeader(exportInputOf(await getRevision(id), REVIEW_HEADER_VERSION));
}

/**
 * Compares two revisions (any designs).
 * @param aId - the "before" revision.
 * @param bId - the "after" revision.
 * @returns the changes and a unified diff of the headers.
 */
export async function diffRevisions(aId: number, bId: number): Promise<RevisionDiff> {
  const [a, b] = [await getRevision(aId), await getRevision(bId)];
  const [ha, hb] = [await renderHeader(exportInputOf(a, REVIEW_HEADER_VERSION)), await renderHeader(exportInputOf(b, REVIEW_HEADER_VERSION))];
  const headerDiff = ha === hb ? '' : createTwoFilesPatch(`revision-${a.number}.h`, `revision-${b.number}.h`, ha, hb, `design ${a.designId} r${a.number}`, `design ${b.designId} r${b.number}`);
  return {
    from: { id: a.id, number: a.number, designId: a.designId },
    to: { id: b.id, number: b.number, designId: b.designId },
    ...compareRevisions(a, b),
    headerDiff,
  };
}
