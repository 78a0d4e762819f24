import { createHash } from 'node:crypto';

/**
 * Canonical JSON: object keys sorted by UTF-16 code units at every level, no whitespace, numbers
 * as JavaScript prints them (shortest round-trip). Two equal designs give the same text whatever
 * their key order, so the SHA-256 of the inputs identifies the design.
 *
 * @param value - JSON-compatible value (no NaN or Infinity).
 * @returns the canonical text.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) throw new RangeError('canonicalJson: non-finite number');
    return JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/**
 * SHA-256 in lower-case hex.
 *
 * @param data - text (UTF-8) or bytes.
 * @returns 64 hex digits.
 */
export function sha256Hex(data: string | Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}
