// Inline validation with the shared schema (the same rules the server applies): the form's own
// read errors first, then parseDesign's issues, both keyed by the design-file path.
import type { DesignInput } from '../../shared/control';
import { parseDesign } from '../../shared/api/design';
import { FIELD_BY_PATH } from './designFields';
import { formatInUnit } from './format';

const RANGE = /^must lie in ([[(])([^,]+), ([^\]]+)\]\s*(\S*)$/;

/**
 * A schema range rule in the field's display unit: "must lie in (1e-7, 1] H" on an mH field
 * reads "must be above 0.0001 mH and at most 1000 mH".
 * @param path - the design-file path of the field.
 * @param message - the schema's message.
 * @returns the message in the form's words.
 */
export function inFieldUnits(path: string, message: string): string {
  const field = FIELD_BY_PATH[path];
  const match = RANGE.exec(message);
  if (!field || !match) return message;
  const [, open, low, high] = match;
  const text = (v: string) => `${formatInUnit(Number(v), field.unit)}${field.unit.symbol ? ` ${field.unit.symbol}` : ''}`;
  const [lo, hi] = [text(low), text(high)];
  return `must be ${open === '(' ? 'above' : 'at least'} ${lo} and at most ${hi}`;
}

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
      if (!(path in errors)) errors[path] = inFieldUnits(path, issue.message);
    }
  }
  const clean = Object.keys(readErrors).length === 0 && result.ok;
  return { design: clean && result.ok ? result.design : null, errors };
}
