// The design file check of CONTRACT section 1, applied at the API edge with the shared schema
// (`parseDesign` of shared/api/design.ts, the same rules the client applies).
import type { DesignInput } from '../../shared/control';
import { AppError, validationError } from '../errors';

type ParseResult = { ok: true; design: DesignInput } | { ok: false; issues: { path: string; message: string }[] };
type DesignModule = { parseDesign(candidate: unknown): ParseResult };

const DESIGN_SCHEMA_MODULE = '../../shared/api/design';
let loaded: Promise<DesignModule> | null = null;

async function designSchema(): Promise<DesignModule> {
  loaded ??= import(/* @vite-ignore */ DESIGN_SCHEMA_MODULE) as Promise<DesignModule>;
  try {
    return await loaded;
  } catch (err) {
    loaded = null;
    throw new AppError('schema-unavailable', `the design schema could not be loaded: ${(err as Error).message}`, 503);
  }
}

/**
 * Validates a design file.
 * @param candidate - the JSON value sent.
 * @param prefix - request path of the design (`design`).
 * @returns the validated design.
 */
export async function requireValidDesign(candidate: unknown, prefix = 'design'): Promise<DesignInput> {
  const result = (await designSchema()).parseDesign(candidate);
  if (result.ok) return result.design;
  throw validationError(result.issues.map((i) => ({ path: i.path === '' ? prefix : `${prefix}.${i.path}`, message: i.message })), 'invalid design');
}
