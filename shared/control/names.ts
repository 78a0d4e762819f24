/**
 * Names of the controller blocks and their sections as people read them, used in check messages
 * and by the client (the ids of CONTRACT section 3 stay as they are in the JSON).
 */
import type { BlockId } from './types';

/** Block names. */
export const BLOCK_NAMES: Record<BlockId, string> = {
  'current-pr': 'Current controller (PR)',
  'voltage-pi': 'DC-link voltage PI',
  'pll-pi': 'PLL loop filter (PI)',
  'sogi-d': 'SOGI, in-phase output',
  'sogi-q': 'SOGI, quadrature output',
  'reactive-lpf': 'Reactive-current low-pass',
};

/**
 * A harmonic order in words.
 * @param harmonic - the order (1 = fundamental).
 * @returns `fundamental`, `3rd harmonic`, `11th harmonic`...
 * @example
 * harmonicName(3); // => '3rd harmonic'
 */
export function harmonicName(harmonic: number): string {
  if (harmonic === 1) return 'fundamental';
  const tens = harmonic % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[harmonic % 10] ?? 'th';
  return `${harmonic}${suffix} harmonic`;
}

/**
 * A section role in words: `resonant-h3` reads `resonator, 3rd harmonic`.
 * @param role - the section role of the result.
 * @returns the words.
 * @example
 * sectionRoleName('resonant-h1'); // => 'resonator, fundamental'
 */
export function sectionRoleName(role: string): string {
  const h = /^resonant-h(\d+)$/.exec(role);
  if (h) return `resonator, ${harmonicName(Number(h[1]))}`;
  if (role === 'pi') return 'PI';
  return role.replace(/-/g, ' ');
}

/**
 * Where a section sits: the block alone when it has one section, else block and section.
 * @param blockId - the block.
 * @param role - the section role.
 * @param sectionsInBlock - how many sections the block has.
 * @returns e.g. `Current controller (PR) · resonator, 3rd harmonic`.
 * @example
 * sectionName('voltage-pi', 'pi', 1); // => 'DC-link voltage PI'
 */
export function sectionName(blockId: BlockId, role: string, sectionsInBlock: number): string {
  return sectionsInBlock > 1 ? `${BLOCK_NAMES[blockId]} · ${sectionRoleName(role)}` : BLOCK_NAMES[blockId];
}
