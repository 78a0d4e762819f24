// Field-by-field differences between two designs, for the save-conflict dialog.
import type { DesignInput } from '../../shared/control';
import { FIELD_BY_PATH } from './designFields';
import { formatInUnit } from './units';

/** One changed leaf value. */
export interface DesignChange {
  path: string;
  before: string;
  after: string;
}

function flatten(value: unknown, prefix: string, out: Record<string, string>): void {
  if (Array.isArray(value)) {
    out[prefix] = JSON.stringify(value);
    return;
  }
  if (value && typeof value === 'object') {
    for (const [key, child] of Object.entries(value as Record<string, unknown>)) flatten(child, prefix ? `${prefix}.${key}` : key, out);
    return;
  }
  const field = FIELD_BY_PATH[prefix];
  if (value === null || value === undefined) out[prefix] = field?.optional ? 'designed by rule' : '—';
  else if (typeof value === 'number' && field) out[prefix] = `${formatInUnit(value, field.unit)}${field.unit.symbol ? ` ${field.unit.symbol}` : ''}`;
  else out[prefix] = String(value);
}

/**
 * Leaf paths whose values differ between `before` and `after`, sorted by path, written in the
 * form's display units.
 * @param before - one design.
 * @param after - the other.
 * @returns the changes; absent leaves show as "—".
 */
export function diffDesigns(before: DesignInput, after: DesignInput): DesignChange[] {
  const a: Record<string, string> = {};
  const b: Record<string, string> = {};
  flatten(before, '', a);
  flatten(after, '', b);
  const paths = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
  return paths.filter((p) => a[p] !== b[p]).map((p) => ({ path: p, before: a[p] ?? '—', after: b[p] ?? '—' }));
}
