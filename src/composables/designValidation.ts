// Inline validation with the shared schema (the same rules the server applies): the form's own
// read errors first, then parseDesign's issues, both keyed by the design-file path.
import type { DesignInput } from '../../shared/control';
import { parseDesign } from '../../shared/api/design';

/** Outcome of validating a candidate. */
export interface DesignValidation {
  design: DesignInput | null;
  errors: Record<string, string>;
}

/**
 * Validates a candidate design from the form.
 * @param candidate - the design as typed, SI.
 * @param readErrors - errors the form found while reading the texts (take precedence).
 * @returns the valid design (or null) and the errors by path.
 */
export function validateCandidate(candidate: unknown, readErrors: Record<string, string>): DesignValidation {
  const result = parseDesign(candidate);
  const errors: Record<string, string> = { ...readErrors };
  if (!result.ok) {
    for (const issue of result.issues) {
      const path = issue.path === '' ? '(design)' : issue.path;
      if (!(path in errors)) errors[path] = issue.message;
    }
  }
  const clean = Object.keys(readErrors).length === 0 && result.ok;
  return { design: clean && result.ok ? result.design : null, errors };
}
