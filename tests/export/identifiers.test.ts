import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cNames, designSlug } from '../../server/export/index';
import { isCIdentifier } from '../../server/export/cIdentifiers';

// C99 6.4.2.1 (identifier syntax), 5.2.4.1 (31 significant initial characters of external
// identifiers), 7.26 (future library directions) and POSIX's reserved `_t` suffix.
const RESERVED = /^(?:(?:is|to|str|mem|wcs)[a-z]|u?int|e[0-9]|sig|lc_|pri|scn)/;

describe('design slug and C prefix', () => {
  it.each([
    ['SC-3 bench unit', 'sc-3-bench-unit', 'sc_3_bench_unit'],
    ['3kW island-grid LCL/16', '3kw-island-grid-lcl-16', 'v3kw_island_ae6d'],
    ['  --Ünïcode Rig--  ', 'unicode-rig', 'unicode_rig'],
    ['island', 'island', 'visland'],
    ['string rig', 'string-rig', 'vstring_rig'],
    ['Integrator', 'integrator', 'vintegrator'],
    ['***', 'design', 'design'],
  ])('%j -> slug %s, prefix %s', (name, slug, prefix) => {
    expect(designSlug(name)).toBe(slug);
    expect(cNames(designSlug(name)).prefix).toBe(prefix);
    expect(cNames(designSlug(name)).macro).toBe(prefix.toUpperCase());
  });

  it('every name gives a valid, unreserved C prefix of at most 16 characters (property)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 80 }), (name) => {
      const slug = designSlug(name);
      expect(slug).toMatch(/^[a-z0-9]+(?:-[a-z0-9]+)*$/);
      const { prefix, macro } = cNames(slug);
      expect(isCIdentifier(prefix)).toBe(true);
      expect(isCIdentifier(`${macro}_COEFS_H`)).toBe(true);
      expect(prefix.length).toBeLessThanOrEqual(16);
      expect(prefix).not.toMatch(RESERVED);
      expect(prefix).not.toMatch(/^_|_$|__/);
    }), { numRuns: 500 });
  });

  it('long slugs sharing their first characters keep distinct prefixes', () => {
    const a = cNames(designSlug('Harbour substation inverter A'));
    const b = cNames(designSlug('Harbour substation inverter B'));
    expect(a.prefix).not.toBe(b.prefix);
    expect(a.prefix.startsWith('harbour_sub')).toBe(true);
  });
});
