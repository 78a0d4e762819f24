/**
 * Design slug: the design name in lower case, every run of characters outside [a-z0-9] replaced by
 * one dash, no leading or trailing dash, at most 48 characters; `design` when nothing is left.
 * Used for the bundle's root folder and file names; C identifiers are derived from it (cIdentifiers.ts).
 *
 * @param name - design name as typed (any Unicode).
 * @returns the slug, e.g. `sc-3-bench-unit` for "SC-3 bench unit".
 */
export function designSlug(name: string): string {
  const ascii = name.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase();
  const slug = ascii.replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 48).replace(/-+$/g, '');
  return slug === '' ? 'design' : slug;
}
