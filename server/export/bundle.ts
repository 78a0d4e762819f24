import type { AnalysisResult, DesignInput } from '../../shared/control/index';
import { firmwareSet, float32GoldenVectors, goldenVectors, limitVectors, type GoldenVector } from '../../shared/firmware/index';
import { canonicalJson, sha256Hex } from './canonical';
import { presentBundle, SAFETY_CAUTION, VECTOR_SAMPLES, VECTOR_SEED, type ExportMeta } from './presenter';
import { renderTemplate } from './render';
import { buildZip, type ZipFile } from './zip';

/** What a bundle is built from; `createdAt` comes from the revision (never the wall clock). */
export interface BundleInput {
  design: DesignInput;
  analysis: AnalysisResult;
  version: string;
  revision: number | null;
  createdAt: Date;
  draft: boolean;
  toolVersion: string;
}

/** A built bundle. */
export interface Bundle {
  zip: Buffer;
  sha256: string;
  fileName: string;
  manifest: object;
}

/** Format tag of the bundle manifest. */
export const MANIFEST_FORMAT = 'varsmith-manifest/1';

/**
 * Every file of the bundle except the manifest, paths relative to the root folder, sorted.
 *
 * @param input - bundle input.
 * @returns the files and the root folder name.
 */
export function renderBundleFiles(input: BundleInput): { root: string; slug: string; files: ZipFile[] } {
  const meta: ExportMeta = { version: input.version, revision: input.revision, draft: input.draft, toolVersion: input.toolVersion, createdAt: input.createdAt };
  let vectors: GoldenVector[];
  try {
    const set = firmwareSet(input.design, input.analysis);
    const options = { samples: VECTOR_SAMPLES, seed: VECTOR_SEED };
    const f0 = input.design.grid.frequencyHz;
    const ts = input.analysis.sampleTimeS;
    vectors = [
      ...(set.arithmetic === 'float32' ? float32GoldenVectors(set, f0, ts, options) : goldenVectors(input.analysis, f0, options)),
      ...limitVectors(set, input.design, ts, VECTOR_SAMPLES),
    ];
  } catch (err) {
    throw new Error(`cannot build the golden vectors of this design: ${(err as Error).message}`, { cause: err });
  }
  const view = presentBundle(input.design, input.analysis, meta, vectors);
  const text = (s: string): Buffer => Buffer.from(s, 'utf8');
  const files: ZipFile[] = [
    { path: 'Makefile', content: text(renderTemplate('Makefile', view)) },
    { path: 'REPORT.md', content: text(renderTemplate('REPORT.md', view)) },
    { path: `include/${view.headerFile}`, content: text(renderTemplate('coefficients.h', view)) },
    { path: `include/${view.apiHeaderFile}`, content: text(renderTemplate('filter.h', view)) },
    { path: `src/${view.sourceFile}`, content: text(renderTemplate('filter.c', view)) },
    { path: `test/${view.vectorsHeaderFile}`, content: text(renderTemplate('vectors.h', view)) },
    { path: `test/${view.vectorsFile}`, content: text(renderTemplate('vectors.c', view)) },
    { path: 'test/run_vectors.c', content: text(renderTemplate('run_vectors.c', view)) },
  ].sort((p, q) => (p.path < q.path ? -1 : p.path > q.path ? 1 : 0));
  return { root: `${view.slug}-${input.version}`, slug: view.slug, files };
}

/**
 * Builds the export bundle (CONTRACT section 5): header, portable C99 source, golden vectors,
 * harness, Makefile, REPORT.md and manifest.json under `<slug>-<version>/`, zipped
 * deterministically (same input, same bytes).
 *
 * @param input - design, analysis, version, revision, creation time, draft flag, tool version.
 * @returns the zip bytes, their SHA-256, the suggested file name and the manifest object.
 */
export async function buildBundle(input: BundleInput): Promise<Bundle> {
  if (Number.isNaN(input.createdAt.getTime())) throw new RangeError('buildBundle: createdAt is not a valid date');
  const { root, slug, files } = renderBundleFiles(input);
  const manifest = {
    format: MANIFEST_FORMAT,
    status: input.draft ? 'DRAFT' : 'release',
    draft: input.draft,
    design: input.design.name,
    slug,
    version: input.version,
    revision: input.revision,
    createdAt: input.createdAt.toISOString(),
    toolVersion: input.toolVersion,
    inputsSha256: sha256Hex(canonicalJson(input.design)),
    inputs: input.design,
    safety: SAFETY_CAUTION.join(' '),
    files: files.map((f) => ({ path: f.path, bytes: f.content.length, sha256: sha256Hex(f.content) })),
  };
  const all: ZipFile[] = [...files, { path: 'manifest.json', content: Buffer.from(`${JSON.stringify(manifest, null, 2)}\n`, 'utf8') }];
  const zip = await buildZip(root, all, input.createdAt);
  return { zip, sha256: sha256Hex(zip), fileName: `${root}${input.draft ? '-draft' : ''}.zip`, manifest };
}
