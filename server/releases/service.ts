// Releases: an approved revision with no error check, built once under a version unique per design.
import { createHash } from 'node:crypto';
import type { ListReleasesQuery } from '../../shared/api/releases';
import { AppError, conflict, forbidden, notFound } from '../errors';
import { record } from '../audit/service';
import type { Actor, AppContext, UserActor } from '../middleware/context';
import { notifyRole } from '../mail/notify';
import { designIdByName, findDesign, lockDesign } from '../designs/repository';
import { requireValidDesign } from '../designs/designFile';
import { analyzeDesign } from '../../shared/control';
import { findRevision, lockRevision, setRevisionStatus } from '../revisions/repository';
import { exportInputOf } from '../revisions/service';
import { buildBundle, TOOL_VERSION } from './exporter';
import { reportOfBundle } from './report';
import {
  findRelease, findReleaseByVersion, insertRelease, listReleaseRows, lockRelease, markWithdrawn, releaseBytes, type ReleaseListRow, type ReleaseRow,
} from './repository';

/**
 * SHA-256 hex of bytes.
 * @param bytes - data.
 * @returns lower-case hex digest.
 */
export const sha256Hex = (bytes: Buffer): string => createHash('sha256').update(bytes).digest('hex');

/**
 * Releases a revision. The bundle is built before the transaction; inside it the design row and then
 * the revision row are locked (the order every writer of both keeps), the rules are checked again on
 * what is committed, and the version is taken: of concurrent requests for one version, one wins and
 * the others get 409, in one process or several.
 * @param app - services.
 * @param actor - engineer or admin.
 * @param revisionId - revision id.
 * @param version - semver.
 * @returns the release.
 */
export async function release(app: AppContext, actor: UserActor, revisionId: number, version: string): Promise<ReleaseRow> {
  const revision = await findRevision(revisionId);
  if (!revision) throw notFound(`revision ${revisionId}`);
  const refuse = (r: typeof revision) => {
    if (r.status !== 'approved') throw conflict('not-approved', `revision ${r.number} is ${r.status}; only an approved revision can be released`, { status: r.status });
    const errors = r.analysis.checks.filter((c) => c.severity === 'error');
    if (errors.length > 0) throw new AppError('error-checks', `revision ${r.number} has ${errors.length} error check(s): ${errors.map((c) => c.id).join(', ')}`, 422, { details: { checks: errors.map((c) => c.id) } });
  };
  refuse(revision);
  const duplicate = () => conflict('version-taken', `version ${version} is already released for this design`, { version });
  if (await findReleaseByVersion(revision.designId, version)) throw duplicate();
  const built = await buildBundle(exportInputOf(revision, version));
  const sha256 = sha256Hex(built.zip);
  const row = await app.db.write(async (t) => {
    await lockDesign(revision.designId, t);
    const again = await lockRevision(revisionId, t);
    if (!again) throw notFound(`revision ${revisionId}`);
    refuse(again);
    if (await findReleaseByVersion(revision.designId, version, t)) throw duplicate();
    const created = await insertRelease({ designId: revision.designId, revisionId, version, fileName: built.fileName, sha256, sizeBytes: built.zip.length, bundle: built.zip, releasedById: actor.id }, t);
    await setRevisionStatus(revisionId, 'released', t);
    await record(t, actor, 'release.create', 'release', created.id, { designId: revision.designId, revision: revision.number, version, sha256 });
    return created;
  });
  await notifyRole(app, 'tester', `[Varsmith] ${revision.design.name} ${version} released (from r${revision.number})`,
    `${actor.name} released "${revision.design.name}" version ${version}, made from revision r${revision.number}.\n\nSHA-256: ${sha256}\n\n` +
    `Download: ${app.config.publicUrl}/releases/${row.id}\nBench pull: npx varsmith pull --server ${app.config.publicUrl} --token <token> --design "${revision.design.name}" --set-version ${version} -o ${row.fileName}\n`);
  return row;
}

/**
 * Lists releases.
 * @param q - design name, design id, version and text filters; page.
 * @returns one page of rows, newest first, and how many match.
 */
export async function listReleases(q: ListReleasesQuery): Promise<{ rows: ReleaseListRow[]; total: number }> {
  let designId = q.designId;
  if (q.design !== undefined) {
    const named = await designIdByName(q.design);
    if (named === null || (designId !== undefined && designId !== named)) return { rows: [], total: 0 };
    designId = named;
  }
  return listReleaseRows({ designId, version: q.version, q: q.q }, q);
}

/**
 * Loads a release or fails with 404.
 * @param id - release id.
 * @returns the row.
 */
export async function getRelease(id: number): Promise<ReleaseRow> {
  const row = await findRelease(id);
  if (!row) throw notFound(`release ${id}`);
  return row;
}

/**
 * The stored bytes of a release, checked against the recorded SHA-256; the download is audited.
 * @param app - services.
 * @param actor - user or token.
 * @param id - release id.
 * @returns row and bytes.
 */
export async function downloadRelease(app: AppContext, actor: Actor, id: number): Promise<{ row: ReleaseRow; bytes: Buffer }> {
  const row = await getRelease(id);
  const bytes = await releaseBytes(id);
  if (!bytes || sha256Hex(bytes) !== row.sha256) throw new AppError('integrity', `stored bundle of release ${id} does not match its recorded SHA-256`, 500);
  await app.db.write((t) => record(t, actor, 'release.download', 'release', id, { version: row.version, sha256: row.sha256 }));
  return { row, bytes };
}

/**
 * The report of a released set, from its stored bundle.
 * @param id - release id.
 * @returns the Markdown text.
 */
export async function releaseReport(id: number): Promise<string> {
  await getRelease(id);
  const bytes = await releaseBytes(id);
  if (!bytes) throw notFound(`bundle of release ${id}`);
  const report = await reportOfBundle(bytes);
  if (report === null) throw notFound(`report of release ${id}`);
  return report;
}

/**
 * Withdraws a release: it stays listed and downloadable, marked with who, when and why.
 * @param app - services.
 * @param actor - engineer or admin.
 * @param id - release id.
 * @param reason - why.
 * @returns the row.
 */
export async function withdrawRelease(app: AppContext, actor: UserActor, id: number, reason: string): Promise<ReleaseRow> {
  return app.db.write(async (t) => {
    const row = await lockRelease(id, t);
    if (!row) throw notFound(`release ${id}`);
    if (row.withdrawnAt !== null) throw conflict('already-withdrawn', `release ${row.version} was already withdrawn`);
    await markWithdrawn(id, actor.id, reason, t);
    await record(t, actor, 'release.withdraw', 'release', id, { version: row.version, reason });
    return (await findRelease(id, t)) as ReleaseRow;
  });
}

/**
 * Builds a draft bundle of a saved working copy (not stored, marked draft).
 * @param app - services.
 * @param actor - the engineer.
 * @param designId - design id.
 * @returns the bundle.
 */
export async function draftBundle(app: AppContext, actor: UserActor, designId: number): Promise<{ zip: Buffer; fileName: string; sha256: string }> {
  if (actor.role !== 'engineer') throw forbidden('only engineers export drafts');
  const design = await findDesign(designId);
  if (!design) throw notFound(`design ${designId}`);
  const valid = await requireValidDesign(design.design);
  let analysis;
  try {
    analysis = analyzeDesign(valid, { sweepPoints: 0, responseSamples: 0 });
  } catch (err) {
    throw new AppError('analysis-failed', `the design could not be analysed: ${(err as Error).message}`, 422);
  }
  const built = await buildBundle({ design: valid, analysis, version: `0.0.0-draft.${design.version}`, revision: null, createdAt: design.updatedAt, draft: true, toolVersion: TOOL_VERSION });
  await app.db.write((t) => record(t, actor, 'draft.export', 'design', designId, { designVersion: design.version }));
  return { zip: built.zip, fileName: built.fileName, sha256: sha256Hex(built.zip) };
}
