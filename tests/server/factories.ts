// Factories for test data (the design values are the example of CONTRACT section 1).
import { analyzeDesign, type DesignInput } from '../../shared/control';
import { contractExampleDesign } from '../../shared/api/designExample';
import type { AppContext } from '../../server/middleware/context';
import { insertDesign } from '../../server/designs/repository';
import { insertRevision } from '../../server/revisions/repository';
import { REVISION_ANALYSIS_OPTIONS } from '../../server/revisions/service';
import { insertRelease } from '../../server/releases/repository';
import { buildBundle, TOOL_VERSION } from '../../server/releases/exporter';
import { sha256Hex } from '../../server/releases/service';
import { findUserByEmail } from '../../server/users/repository';

/**
 * A valid L-filter design.
 * @param overrides - top-level fields to replace.
 * @returns the design.
 */
export function buildDesign(overrides: Partial<DesignInput> = {}): DesignInput {
  return { ...contractExampleDesign('SC-3 bench unit'), ...overrides } as DesignInput;
}

/** What `insertReleases` made. */
export interface InsertedReleases {
  designId: number;
  revisionIds: number[];
  releaseIds: number[];
}

/**
 * Stores a design with `count` released revisions (versions `0.1.0`, `0.2.0`, ...) straight through the
 * repositories, in one transaction: real frozen design and analysis texts, and one real bundle built
 * once and stored under every release. For list tests and the list bench, where building a bundle
 * per release through the API would take most of the time.
 * @param ctx - the booted app's services.
 * @param name - design name.
 * @param count - how many releases (the loop's cap is the caller's number).
 * @returns the ids made.
 */
export async function insertReleases(ctx: AppContext, name: string, count: number): Promise<InsertedReleases> {
  const design = buildDesign({ name });
  const analysis = analyzeDesign(design, REVISION_ANALYSIS_OPTIONS);
  const owner = await findUserByEmail('engineer@varsmith.test');
  if (!owner) throw new Error('the demo engineer is missing');
  const built = await buildBundle({ design, analysis, version: '0.1.0', revision: 1, createdAt: new Date('2026-01-01T00:00:00Z'), draft: false, toolVersion: TOOL_VERSION });
  return ctx.db.write(async (t) => {
    const row = await insertDesign({ name, ownerId: owner.id, design }, t);
    const out: InsertedReleases = { designId: row.id, revisionIds: [], releaseIds: [] };
    for (let i = 1; i <= count; i++) {
      const rev = await insertRevision({ designId: row.id, number: i, authorId: owner.id, summary: `set ${i}`, status: 'released', design, analysis, errorCount: 0, warningCount: 0 }, t);
      const rel = await insertRelease({
        designId: row.id, revisionId: rev.id, version: `0.${i}.0`, fileName: built.fileName, sha256: sha256Hex(built.zip),
        sizeBytes: built.zip.length, bundle: built.zip, releasedById: owner.id,
      }, t);
      out.revisionIds.push(rev.id);
      out.releaseIds.push(rel.id);
    }
    return out;
  });
}
