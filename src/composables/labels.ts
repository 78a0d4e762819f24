// The product's own words for the identifiers of the analysis result (CONTRACT section 3 keys
// stay as they are in the JSON; this is only what the pages show): loops, blocks, sections,
// discretization methods, gains with their units, revision states.
import { BLOCK_NAMES, harmonicName, sectionName, sectionRoleName, type BlockId, type LoopId, type Severity } from '../../shared/control';
import type { RevisionStatus } from '../api/types';

/** Loop names, the same on every page. */
export const LOOP_LABELS: Record<LoopId, string> = {
  current: 'Current loop (PR)',
  voltage: 'DC-link voltage loop (PI)',
  pll: 'PLL',
};

/** Controller block names (the core's, so check messages and pages agree). */
export const BLOCK_LABELS: Record<BlockId, string> = BLOCK_NAMES;

/** Discretization methods by their result key, in the product's words. */
export const METHOD_LABELS: Record<string, string> = {
  'tustin-prewarp': 'Tustin, prewarped',
  tustin: 'Tustin',
  'forward-euler': 'Forward Euler',
  'backward-euler': 'Backward Euler',
  zoh: 'Zero-order hold',
  'impulse-invariant': 'Impulse invariance',
  none: 'Pure gain (not discretized)',
};

/** Revision states as people say them. */
export const STATUS_LABELS: Record<RevisionStatus, string> = {
  'in-review': 'in review',
  approved: 'approved',
  'changes-requested': 'sent back',
  released: 'released',
  superseded: 'superseded',
};

/** Severity words. */
export const SEVERITY_LABELS: Record<Severity, string> = { error: 'Error', warning: 'Warning', info: 'Note' };

/**
 * Badge colour of a revision state.
 * @param status - the state (or `draft` for a design never submitted).
 * @returns a Quasar colour name.
 */
export function statusColor(status: RevisionStatus | 'draft'): string {
  if (status === 'released') return 'positive';
  if (status === 'approved') return 'info';
  if (status === 'in-review') return 'accent';
  if (status === 'changes-requested') return 'warning';
  return 'grey-6';
}

/**
 * Label of a revision state, `draft` for a design never submitted.
 * @param status - the state.
 * @returns the words.
 */
export function statusLabel(status: RevisionStatus | 'draft'): string {
  return status === 'draft' ? 'draft' : STATUS_LABELS[status];
}

/**
 * A discretization method's name; unknown keys are shown capitalised with spaces.
 * @param method - the key of `resonanceByMethodHz` or `BlockResult.method`.
 * @returns the name.
 */
export function methodLabel(method: string): string {
  const known = METHOD_LABELS[method];
  if (known) return known;
  const words = method.replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** A harmonic order in words (`fundamental`, `3rd harmonic`). */
export const harmonicLabel = harmonicName;
/** A section role in words (`resonator, 3rd harmonic`). */
export const sectionRoleLabel = sectionRoleName;
/** Where a section sits (`Current controller (PR) · resonator, 3rd harmonic`). */
export const sectionLabel = sectionName;

/** A gain of a block as shown: its name and the unit keyword of its value. */
export interface GainLabel {
  label: string;
  unit: string | null;
}

const GAIN_LABELS: Partial<Record<BlockId, Record<string, GainLabel>>> = {
  'current-pr': { kp: { label: 'proportional gain kp', unit: 'V/A' } },
  'voltage-pi': {
    kp: { label: 'proportional gain kp', unit: 'A/V' },
    ki: { label: 'integral gain ki', unit: 'A/(V·s)' },
    plantGain: { label: 'plant gain Kv', unit: 'V/(A·s)' },
  },
  'pll-pi': {
    kp: { label: 'proportional gain kp', unit: 'rad/s per pu' },
    ki: { label: 'integral gain ki', unit: 'rad/s² per pu' },
    naturalFrequencyRadPerS: { label: 'natural frequency ωn', unit: 'rad/s' },
  },
  'sogi-d': { k: { label: 'SOGI gain k', unit: null } },
  'sogi-q': { k: { label: 'SOGI gain k', unit: null } },
  'reactive-lpf': {
    cutoffHz: { label: 'cutoff', unit: 'Hz' },
    order: { label: 'order', unit: null },
    reactiveEstimateFactor: { label: 'estimate factor', unit: null },
  },
};

/**
 * The name and unit of one gain of a block; resonant gains are named per harmonic.
 * @param blockId - the block.
 * @param key - the gain key of the result (`kp`, `resonantGains`...).
 * @param harmonic - for `resonantGains`, the harmonic order of the element.
 * @returns label and unit keyword.
 */
export function gainLabel(blockId: BlockId, key: string, harmonic?: number): GainLabel {
  if (key === 'resonantGains') return { label: `resonant gain kr, ${harmonicLabel(harmonic ?? 1)}`, unit: 'V/A' };
  return GAIN_LABELS[blockId]?.[key] ?? { label: key, unit: null };
}

/** The loop figures the pages show, with their names and units. */
export const LOOP_METRICS: { key: 'crossoverHz' | 'phaseMarginDeg' | 'gainMarginDb' | 'peakSensitivity' | 'maxPoleRadius'; label: string; unit: string | null; digits: number }[] = [
  { key: 'crossoverHz', label: 'crossover', unit: 'Hz', digits: 4 },
  { key: 'phaseMarginDeg', label: 'phase margin', unit: 'deg', digits: 3 },
  { key: 'gainMarginDb', label: 'gain margin', unit: 'dB', digits: 3 },
  { key: 'peakSensitivity', label: 'peak sensitivity', unit: null, digits: 3 },
  { key: 'maxPoleRadius', label: 'largest pole radius', unit: null, digits: 6 },
];
