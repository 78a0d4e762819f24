// The design file check of CONTRACT section 1, applied at the API edge with the shared schema
// (the same rules the client applies).
import { parseDesign } from '../../shared/api/design';
import type { DesignInput } from '../../shared/control';
import { validationError } from '../errors';

/**
 * Validates a design file.
 * @param candidate - the JSON value sent.
 * @param prefix - request path of the design (`design`).
 * @returns the validated design.
 */
export async function requireValidDesign(candidate: unknown, prefix = 'design'): Promise<DesignInput> {
  const result = parseDesign(candidate);
  if (result.ok) return result.design;
  throw validationError(result.issues.map((i) => ({ path: i.path === '' ? prefix : `${prefix}.${i.path}`, message: i.message })), 'invalid design');
}
