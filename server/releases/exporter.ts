// The bundle and header generators of server/export, loaded on first use.
import { readFileSync } from 'node:fs';
import type { AnalysisResult, DesignInput } from '../../shared/control';
import { AppError } from '../errors';

/** Input of the export generators. */
export interface ExportInput {
  design: DesignInput;
  analysis: AnalysisResult;
  version: string;
  revision: number | null;
  createdAt: string;
  draft: boolean;
  toolVersion: string;
}

/** A built bundle. */
export interface BuiltBundle {
  zip: Buffer;
  sha256: string;
  fileName: string;
  manifest: unknown;
}

interface ExportModule {
  buildBundle(input: ExportInput): Promise<BuiltBundle>;
  renderCoefficientHeader(input: ExportInput): string | Promise<string>;
}

/** The tool version written into bundles (package.json). */
export const TOOL_VERSION: string = (JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }).version;

const EXPORT_MODULE = '../export/index';
let loaded: Promise<ExportModule> | null = null;

async function exporter(): Promise<ExportModule> {
  loaded ??= import(/* @vite-ignore */ EXPORT_MODULE) as Promise<ExportModule>;
  try {
    return await loaded;
  } catch (err) {
    loaded = null;
    throw new AppError('export-unavailable', `the bundle generator could not be loaded: ${(err as Error).message}`, 503);
  }
}

/**
 * Builds a bundle zip.
 * @param input - design, analysis, version, revision, time, draft flag, tool version.
 * @returns bytes, SHA-256, file name and manifest.
 */
export async function buildBundle(input: ExportInput): Promise<BuiltBundle> {
  return (await exporter()).buildBundle(input);
}

/**
 * Renders the coefficient header text.
 * @param input - as for buildBundle.
 * @returns the header source.
 */
export async function renderHeader(input: ExportInput): Promise<string> {
  return (await exporter()).renderCoefficientHeader(input);
}
