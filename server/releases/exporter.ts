// The bundle and header generators of server/export, as the team flow uses them.
import { readFileSync } from 'node:fs';
import { buildBundle as buildExportBundle, renderCoefficientHeader, type Bundle, type BundleInput } from '../export/index';

/** Input of the export generators (`createdAt` is the revision's time, never the wall clock). */
export type ExportInput = BundleInput;

/** A built bundle. */
export type BuiltBundle = Bundle;

/** The tool version written into bundles (package.json). */
export const TOOL_VERSION: string = (JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }).version;

/**
 * Builds a bundle zip.
 * @param input - design, analysis, version, revision, time, draft flag, tool version.
 * @returns bytes, SHA-256, file name and manifest.
 */
export function buildBundle(input: ExportInput): Promise<BuiltBundle> {
  return buildExportBundle(input);
}

/**
 * Renders the coefficient header text.
 * @param input - as for buildBundle.
 * @returns the header source.
 */
export async function renderHeader(input: ExportInput): Promise<string> {
  return renderCoefficientHeader(input.design, input.analysis, { version: input.version, revision: input.revision, draft: input.draft, toolVersion: input.toolVersion, createdAt: input.createdAt });
}
