// The design form's fields: where each value lives in `varsmith-design/1`, its label, what it
// measures and the unit it is shown in. Texts are what the user typed; `readDesignTexts` turns
// them into a candidate design (SI) plus the errors that are the form's own (unreadable text).
import { resolveSignals, type Arithmetic, type DesignInput, type SectionStructure } from '../../shared/control';
import { formatInUnit, parseQuantity, type Dimension, type DisplayUnit } from './units';

/** One numeric input of the form. */
export interface FieldSpec {
  /** Key path in the design file, e.g. `filter.inductanceH`. */
  path: string;
  label: string;
  dimension: Dimension;
  unit: DisplayUnit;
  /** Gains: blank means "designed by rule" (null in the file). */
  optional?: boolean;
  /** Signals and limits: blank means the documented default (the key is left out of the file). */
  defaulted?: boolean;
  /** Which filter topology shows the field (absent = always). */
  topology?: 'L' | 'LCL';
  hint?: string;
}

/** A titled group of fields. */
export interface FieldGroup {
  id: string;
  title: string;
  fields: FieldSpec[];
}

const u = (symbol: string, exponent = 0): DisplayUnit => ({ symbol, exponent });

/** The form layout, in reading order. Gains of the current loop's resonators are rendered per harmonic. */
export const FIELD_GROUPS: FieldGroup[] = [
  {
    id: 'grid', title: 'Grid and rating', fields: [
      { path: 'grid.voltageRmsV', label: 'Grid voltage (RMS)', dimension: 'V', unit: u('V') },
      { path: 'grid.frequencyHz', label: 'Grid frequency', dimension: 'Hz', unit: u('Hz') },
      { path: 'rating.apparentPowerVA', label: 'Rated apparent power', dimension: 'VA', unit: u('kVA', 3) },
    ],
  },
  {
    id: 'filter', title: 'Output filter', fields: [
      { path: 'filter.inductanceH', label: 'Inductance', dimension: 'H', unit: u('mH', -3), topology: 'L' },
      { path: 'filter.inverterInductanceH', label: 'Inverter-side inductance L1', dimension: 'H', unit: u('mH', -3), topology: 'LCL' },
      { path: 'filter.gridInductanceH', label: 'Grid-side inductance L2', dimension: 'H', unit: u('mH', -3), topology: 'LCL' },
      { path: 'filter.capacitanceF', label: 'Filter capacitance Cf', dimension: 'F', unit: u('µF', -6), topology: 'LCL' },
      { path: 'filter.dampingResistanceOhm', label: 'Damping resistance Rd', dimension: 'Ohm', unit: u('Ω'), topology: 'LCL' },
      { path: 'filter.resistanceOhm', label: 'Series resistance', dimension: 'Ohm', unit: u('mΩ', -3) },
    ],
  },
  {
    id: 'dc-link', title: 'DC link', fields: [
      { path: 'dcLink.capacitanceF', label: 'DC-link capacitance', dimension: 'F', unit: u('µF', -6) },
      { path: 'dcLink.voltageRefV', label: 'DC-link voltage reference', dimension: 'V', unit: u('V') },
    ],
  },
  {
    id: 'sampling', title: 'Switching and sampling', fields: [
      { path: 'sampling.switchingFrequencyHz', label: 'Switching frequency', dimension: 'Hz', unit: u('kHz', 3) },
      { path: 'sampling.updatesPerCarrier', label: 'Updates per carrier period', dimension: 'count', unit: u(''), hint: '1 = single update, 2 = double update' },
      { path: 'sampling.computationDelaySamples', label: 'Computation delay', dimension: 'count', unit: u('samples') },
    ],
  },
  {
    id: 'current-loop', title: 'Current loop (PR)', fields: [
      { path: 'currentLoop.crossoverHz', label: 'Target crossover', dimension: 'Hz', unit: u('Hz') },
      { path: 'currentLoop.resonantBandwidthHz', label: 'Resonant bandwidth', dimension: 'Hz', unit: u('Hz'), hint: '0 = ideal resonators' },
      { path: 'currentLoop.kp', label: 'Proportional gain kp', dimension: 'gain', unit: u('V/A'), optional: true },
    ],
  },
  {
    id: 'voltage-loop', title: 'DC-link voltage loop (PI)', fields: [
      { path: 'voltageLoop.crossoverHz', label: 'Target crossover', dimension: 'Hz', unit: u('Hz') },
      { path: 'voltageLoop.phaseMarginDeg', label: 'Target phase margin', dimension: 'deg', unit: u('°') },
      { path: 'voltageLoop.kp', label: 'Proportional gain kp', dimension: 'gain', unit: u('A/V'), optional: true },
      { path: 'voltageLoop.ki', label: 'Integral gain ki', dimension: 'gain', unit: u('A/(V·s)'), optional: true },
    ],
  },
  {
    id: 'pll', title: 'Grid synchronisation (SOGI-PLL)', fields: [
      { path: 'pll.sogiGain', label: 'SOGI gain k', dimension: 'gain', unit: u('') },
      { path: 'pll.settlingTimeS', label: 'Settling time', dimension: 's', unit: u('ms', -3) },
      { path: 'pll.dampingRatio', label: 'Damping ratio', dimension: 'gain', unit: u('') },
      { path: 'pll.kp', label: 'Loop-filter kp', dimension: 'gain', unit: u('rad/s per pu'), optional: true },
      { path: 'pll.ki', label: 'Loop-filter ki', dimension: 'gain', unit: u('rad/s² per pu'), optional: true },
    ],
  },
  {
    id: 'reactive', title: 'Reactive-current estimator', fields: [
      { path: 'reactiveFilter.cutoffHz', label: 'Low-pass cutoff', dimension: 'Hz', unit: u('Hz') },
    ],
  },
  {
    id: 'signals', title: 'Signals and limits', fields: [
      { path: 'signals.currentSenseFullScaleA', label: 'Current sense full scale (peak)', dimension: 'A', unit: u('A'), defaulted: true },
      { path: 'signals.gridVoltageSenseFullScaleV', label: 'Grid-voltage sense full scale (peak)', dimension: 'V', unit: u('V'), defaulted: true },
      { path: 'signals.dcVoltageSenseFullScaleV', label: 'DC-link sense full scale', dimension: 'V', unit: u('V'), defaulted: true },
      { path: 'signals.adcBits', label: 'ADC resolution', dimension: 'count', unit: u('bits'), defaulted: true },
      { path: 'signals.pwmCarrierCounts', label: 'PWM carrier period', dimension: 'count', unit: u('counts'), defaulted: true },
      { path: 'limits.currentReferencePeakA', label: 'Current reference limit (peak)', dimension: 'A', unit: u('A'), defaulted: true },
      { path: 'limits.modulationIndexMax', label: 'Modulation index limit', dimension: 'ratio', unit: u(''), defaulted: true },
      { path: 'limits.pllFrequencyDeviationHz', label: 'PLL frequency limit (±)', dimension: 'Hz', unit: u('Hz'), defaulted: true },
    ],
  },
];

/** The optional sections of a design file the form keeps whole (CONTRACT sections 7 and 9). */
const KEPT_SECTIONS = ['signals', 'limits', 'firmware', 'envelope'] as const;

/** Every numeric field by path. */
export const FIELD_BY_PATH: Record<string, FieldSpec> = Object.fromEntries(FIELD_GROUPS.flatMap((g) => g.fields).map((f) => [f.path, f]));

/** Unit of the per-harmonic resonant gains. */
export const RESONANT_GAIN_UNIT: DisplayUnit = u('V/A');

/** What the user typed, field by field, plus the non-numeric choices. */
export interface DesignTexts {
  name: string;
  topology: 'L' | 'LCL';
  reactiveOrder: 1 | 2;
  wordBits: 16 | 32;
  /** `fixedPoint.arithmetic` and `fixedPoint.structure`; null = absent (the default). */
  arithmetic: Arithmetic | null;
  structure: SectionStructure | null;
  /** `firmware.symbolPrefix` as typed (blank = none). */
  symbolPrefix: string;
  /** The optional sections as loaded (signals, limits, firmware, envelope): keys the form does not show are kept. */
  kept: Partial<Pick<DesignInput, (typeof KEPT_SECTIONS)[number]>>;
  harmonics: string;
  /** Per-harmonic gain texts, aligned with the harmonics as typed. */
  resonantGains: string[];
  values: Record<string, string>;
  /**
   * Values shown shortened (√2 reads `1.41421`): while the text is unchanged the design keeps the
   * exact stored value, so opening and saving a design never changes it.
   */
  exact?: Record<string, { text: string; valueSi: number }>;
}

/** Significant digits above which a stored value is shown shortened in its field. */
export const FIELD_MAX_DIGITS = 8;

function significantDigits(text: string): number {
  return text.replace(/^-/, '').replace(/e.*$/, '').replace('.', '').replace(/^0+/, '').length;
}

function getPath(object: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), object);
}

function setPath(object: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.');
  let node = object;
  for (const key of keys.slice(0, -1)) {
    if (!node[key] || typeof node[key] !== 'object') node[key] = {};
    node = node[key] as Record<string, unknown>;
  }
  node[keys[keys.length - 1]] = value;
}

/**
 * The texts that show a design (SI values written in display units).
 * @param design - a design file.
 * @returns the form texts.
 */
export function designToTexts(design: DesignInput): DesignTexts {
  const values: Record<string, string> = {};
  const exact: Record<string, { text: string; valueSi: number }> = {};
  for (const field of Object.values(FIELD_BY_PATH)) {
    const raw = getPath(design, field.path);
    if (typeof raw !== 'number') {
      values[field.path] = '';
      continue;
    }
    const full = formatInUnit(raw, field.unit);
    if (significantDigits(full) > FIELD_MAX_DIGITS) {
      const shown = formatInUnit(Number(raw.toPrecision(6)), field.unit);
      values[field.path] = shown;
      exact[field.path] = { text: shown, valueSi: raw };
    } else {
      values[field.path] = full;
    }
  }
  const gains = design.currentLoop.resonantGains;
  return {
    name: design.name,
    topology: design.filter.topology,
    reactiveOrder: design.reactiveFilter.order,
    wordBits: design.fixedPoint.wordBits,
    arithmetic: design.fixedPoint.arithmetic ?? null,
    structure: design.fixedPoint.structure ?? null,
    symbolPrefix: design.firmware?.symbolPrefix ?? '',
    kept: JSON.parse(JSON.stringify(Object.fromEntries(KEPT_SECTIONS.filter((k) => design[k] !== undefined).map((k) => [k, design[k]])))),
    harmonics: design.currentLoop.harmonics.join(', '),
    resonantGains: design.currentLoop.harmonics.map((_, i) => (gains && typeof gains[i] === 'number' ? formatInUnit(gains[i], RESONANT_GAIN_UNIT) : '')),
    values,
    exact,
  };
}

/** A candidate design and the form's own errors by path. */
export interface ReadTexts {
  /** The design as typed, in SI; may still break the schema's rules (parseDesign decides). */
  candidate: Record<string, unknown>;
  errors: Record<string, string>;
}

/**
 * Reads the texts into a candidate design.
 * @param texts - the form texts.
 * @returns the candidate (SI) and the errors of text that cannot be read.
 */
export function readDesignTexts(texts: DesignTexts): ReadTexts {
  const errors: Record<string, string> = {};
  const candidate: Record<string, unknown> = { format: 'varsmith-design/1', name: texts.name };
  setPath(candidate, 'filter.topology', texts.topology);
  // Sections the form shows only in part keep every other key as loaded.
  for (const [key, section] of Object.entries(JSON.parse(JSON.stringify(texts.kept ?? {})) as Record<string, unknown>)) candidate[key] = section;
  for (const field of Object.values(FIELD_BY_PATH)) {
    if (field.topology && field.topology !== texts.topology) continue;
    const text = texts.values[field.path] ?? '';
    const kept = texts.exact?.[field.path];
    const parsed = kept && kept.text === text ? { ok: true as const, valueSi: kept.valueSi } : parseQuantity(text, field.dimension, field.unit);
    if (!parsed.ok) {
      errors[field.path] = parsed.message;
      setPath(candidate, field.path, Number.NaN);
    } else if (parsed.valueSi === null && field.defaulted) {
      deletePath(candidate, field.path);
    } else if (parsed.valueSi === null && !field.optional) {
      errors[field.path] = 'Required.';
      setPath(candidate, field.path, null);
    } else {
      setPath(candidate, field.path, parsed.valueSi);
    }
  }
  const harmonicTexts = texts.harmonics.split(/[\s,;]+/).filter((t) => t !== '');
  const harmonics = harmonicTexts.map(Number);
  if (harmonicTexts.length === 0) errors['currentLoop.harmonics'] = 'List at least one harmonic, e.g. 1, 3, 5.';
  else if (harmonics.some((h) => !Number.isInteger(h))) errors['currentLoop.harmonics'] = 'Harmonics are whole numbers separated by commas.';
  setPath(candidate, 'currentLoop.harmonics', harmonics);
  const gainTexts = harmonics.map((_, i) => texts.resonantGains[i] ?? '');
  const gains = gainTexts.map((t, i) => {
    const parsed = parseQuantity(t, 'gain', RESONANT_GAIN_UNIT);
    if (!parsed.ok) errors[`currentLoop.resonantGains.${i}`] = parsed.message;
    return parsed.ok ? parsed.valueSi : Number.NaN;
  });
  const given = gains.filter((g) => g !== null).length;
  if (given === 0) setPath(candidate, 'currentLoop.resonantGains', null);
  else {
    if (given < gains.length) {
      gains.forEach((g, i) => {
        if (g === null) errors[`currentLoop.resonantGains.${i}`] = 'Give every resonant gain or none (blank all to design them by rule).';
      });
    }
    setPath(candidate, 'currentLoop.resonantGains', gains);
  }
  setPath(candidate, 'reactiveFilter.order', texts.reactiveOrder);
  setPath(candidate, 'fixedPoint.wordBits', texts.wordBits);
  if (texts.arithmetic) setPath(candidate, 'fixedPoint.arithmetic', texts.arithmetic);
  if (texts.structure) setPath(candidate, 'fixedPoint.structure', texts.structure);
  const prefix = (texts.symbolPrefix ?? '').trim();
  if (prefix === '') deletePath(candidate, 'firmware.symbolPrefix');
  else setPath(candidate, 'firmware.symbolPrefix', prefix);
  for (const key of KEPT_SECTIONS) {
    const section = candidate[key];
    if (section && typeof section === 'object' && !Array.isArray(section) && Object.keys(section).length === 0) delete candidate[key];
  }
  if (texts.name.trim() === '') errors.name = 'Give the design a name.';
  return { candidate, errors };
}

// Removes a key (absent = the documented default); parents are kept (emptied sections are dropped by the caller).
function deletePath(object: Record<string, unknown>, path: string): void {
  const keys = path.split('.');
  let node: unknown = object;
  for (const key of keys.slice(0, -1)) {
    if (!node || typeof node !== 'object') return;
    node = (node as Record<string, unknown>)[key];
  }
  if (node && typeof node === 'object') delete (node as Record<string, unknown>)[keys[keys.length - 1]];
}

/**
 * The documented defaults of the signal and limit fields for the design the form holds, as
 * display texts (what a blank field means), from the core's `resolveSignals`.
 * @param candidate - the candidate design read from the texts (may be incomplete).
 * @returns display texts by field path; empty when the plant values are not readable yet.
 */
export function signalDefaultTexts(candidate: Record<string, unknown>): Record<string, string> {
  const bare = { ...candidate, signals: {}, limits: {} } as unknown as DesignInput;
  const out: Record<string, string> = {};
  try {
    const r = resolveSignals(bare);
    const values: Record<string, number> = {
      'signals.currentSenseFullScaleA': r.currentSenseFullScaleA,
      'signals.gridVoltageSenseFullScaleV': r.gridVoltageSenseFullScaleV,
      'signals.dcVoltageSenseFullScaleV': r.dcVoltageSenseFullScaleV,
      'signals.adcBits': r.adcBits,
      'signals.pwmCarrierCounts': r.pwmCarrierCounts,
      'limits.currentReferencePeakA': r.currentReferencePeakA,
      'limits.modulationIndexMax': r.modulationIndexMax,
      'limits.pllFrequencyDeviationHz': r.pllFrequencyDeviationHz,
    };
    for (const [path, value] of Object.entries(values)) {
      if (Number.isFinite(value)) out[path] = formatInUnit(Number(value.toPrecision(4)), FIELD_BY_PATH[path].unit);
    }
  } catch {
    // plant values not readable yet: no placeholders
  }
  return out;
}
