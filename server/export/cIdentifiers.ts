import { createHash } from 'node:crypto';
import type { BlockId } from '../../shared/control/index';

/**
 * The C naming scheme of exported bundles.
 *
 * - Prefix `p`: the design slug with dashes as underscores, at most 16 characters (so every external
 *   name `p_` + at most 14 characters stays within the 31 significant characters C99 guarantees
 *   for external identifiers); a longer one keeps its first 11 characters, then `_` and the first 4
 *   hex digits of the SHA-256 of the whole slug, so long names that share a start stay distinct. A `v` is put in front when the slug would start with a digit or with
 *   a pattern C99 section 7.26 or POSIX reserves for the library (`is`/`to`/`str`/`mem`/`wcs` + a
 *   lower-case letter, `int`/`uint`, `e` + digit, `sig`, `lc_`, `pri`, `scn`).
 * - A design with `firmware.symbolPrefix` uses it instead (see {@link designCNames}): stable across renames.
 * - Functions and types (lower case): `p_clamp`, `p_limit`, `p_floor_shift`, `p_round_shift`,
 *   `p_taps_step`, `p_taps_step_limited`, `p_delay_clear`, `p_group_init`, `p_group_reset`,
 *   `p_group_step`, `p_group_step_limited`, `p_pi_reset`, `p_pi_step`, `p_voltage_pi_step`,
 *   `p_pll_pi_step`, `p_current_pr_step`, `p_word` (the signal type), `struct p_taps`,
 *   `struct p_delay`, `struct p_group`, `struct p_pi_taps`, `struct p_pi_state`, one table per
 *   block `p_<block>_taps` (block id with underscores) and `p_voltage_pi_gains`, `p_pll_pi_gains`.
 * - Macros (upper case): `P_WORD_BITS`, `P_SIGNAL_MAX`, per section
 *   `P_<BLOCK>_<ROLE>_{B0,B1,B2,A0,A1,A2,SHIFT}` (integers) and `..._{B0..A2}_REAL` (the doubles),
 *   per block `P_<BLOCK>_SECTIONS`; scaling constants `P_SCALE_*`.
 * No `_t` suffixes (POSIX reserves them) and nothing starts with an underscore.
 */
export interface CNames {
  /** Lower-case prefix without trailing underscore. */
  prefix: string;
  /** Upper-case macro prefix without trailing underscore. */
  macro: string;
}

const RESERVED_START = /^(?:(?:is|to|str|mem|wcs)[a-z]|u?int|e[0-9]|sig|lc_|pri|scn|[0-9])/;

/**
 * C prefix of a design slug (see the module comment for the rules).
 *
 * @param slug - design slug from `designSlug`.
 * @returns lower- and upper-case prefixes, both valid C99 identifier starts.
 */
export function cNames(slug: string): CNames {
  let base = slug.toLowerCase().replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  if (base === '') base = 'design';
  if (RESERVED_START.test(base)) base = `v${base}`;
  if (base.length > 16) base = `${base.slice(0, 11).replace(/_+$/g, '')}_${createHash('sha256').update(slug).digest('hex').slice(0, 4)}`;
  return { prefix: base, macro: base.toUpperCase() };
}

/** The C names of a design and where they came from. */
export interface DesignCNames extends CNames {
  /** `symbol-prefix`: the stable `firmware.symbolPrefix`; `display-name`: derived from the name (changes when it is renamed). */
  source: 'symbol-prefix' | 'display-name';
  /** Base of the generated file names: the prefix in lower case, or the slug. */
  fileBase: string;
}

/**
 * C names of a design: the stable symbol prefix when the design has one (validated by the schema
 * as a C identifier prefix that no C library name can start with; functions use it in lower case,
 * macros in upper case), otherwise the name-derived prefix of {@link cNames}.
 *
 * @param symbolPrefix - `firmware.symbolPrefix` of the design, or null/undefined.
 * @param slug - design slug.
 * @returns prefixes, their source and the file base name.
 */
export function designCNames(symbolPrefix: string | null | undefined, slug: string): DesignCNames {
  if (symbolPrefix) return { prefix: symbolPrefix.toLowerCase(), macro: symbolPrefix.toUpperCase(), source: 'symbol-prefix', fileBase: symbolPrefix.toLowerCase() };
  return { ...cNames(slug), source: 'display-name', fileBase: slug };
}

/**
 * Lower-case C token of a block id: `current-pr` -> `current_pr`.
 *
 * @param id - block id.
 * @returns the token.
 */
export function blockToken(id: BlockId): string {
  return id.replace(/-/g, '_');
}

/**
 * Upper-case C token of a section role: `resonant-h3` -> `RESONANT_H3`; anything outside
 * [A-Za-z0-9] becomes an underscore.
 *
 * @param role - section role from the analysis.
 * @returns the token.
 */
export function roleToken(role: string): string {
  const token = role.toUpperCase().replace(/[^A-Z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  return token === '' ? 'SECTION' : token;
}

/**
 * Checks that a string is a valid C99 identifier (letters, digits, underscore, not starting with a digit).
 *
 * @param name - candidate identifier.
 * @returns true when valid.
 */
export function isCIdentifier(name: string): boolean {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(name);
}
