// The design schema beyond the single-mutation table: more rejected classes (each names its key),
// and fast-check properties: random valid designs are accepted and survive a JSON round trip unchanged,
// and a random leaf corrupted into a string, a NaN-like value or an absurd magnitude is rejected at its own path.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { parseDesign } from '../../shared/api/design';
import type { DesignInput } from '../../shared/control/types';

const demo = JSON.parse(readFileSync(new URL('../../examples/sc5-field-lcl-240v.json', import.meta.url), 'utf8')) as DesignInput;
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- mutations poke at arbitrary keys of a JSON clone
type Json = any;
const clone = (): Json => JSON.parse(JSON.stringify(demo));

function issuePaths(input: unknown): string[] {
  const r = parseDesign(input);
  return r.ok ? [] : r.issues.map((i) => i.path);
}

function messageAt(input: unknown, path: string): string | undefined {
  const r = parseDesign(input);
  return r.ok ? undefined : r.issues.find((i) => i.path === path)?.message;
}

describe('design schema, further rejected classes', () => {
  const cases: [string, (d: Json) => void, string, RegExp][] = [
    ['repeated harmonic', (d) => (d.currentLoop.harmonics = [1, 3, 3]), 'currentLoop.harmonics', /repeat/],
    ['harmonic order above 50', (d) => (d.currentLoop.harmonics = [1, 51]), 'currentLoop.harmonics.1', /lie in/],
    ['no harmonic at all', (d) => (d.currentLoop.harmonics = []), 'currentLoop.harmonics', /at least/],
    ['harmonics not an array', (d) => (d.currentLoop.harmonics = 3), 'currentLoop.harmonics', /array/],
    ['LCL without its grid-side inductance', (d) => delete d.filter.gridInductanceH, 'filter.gridInductanceH', /required/],
    ['LCL capacitor of zero', (d) => (d.filter.capacitanceF = 0), 'filter.capacitanceF', /lie in/],
    ['L key on an LCL filter', (d) => (d.filter.inductanceH = 1e-3), 'filter', /unknown key.*inductanceH/],
    ['fractional computation delay', (d) => (d.sampling.computationDelaySamples = 1.5), 'sampling.computationDelaySamples', /integer/],
    ['three updates per carrier', (d) => (d.sampling.updatesPerCarrier = 3), 'sampling.updatesPerCarrier', /lie in/],
    ['boolean for a number', (d) => (d.dcLink.voltageRefV = true), 'dcLink.voltageRefV', /number/],
    ['null section', (d) => (d.pll = null), 'pll', /./],
    ['unknown key at the root', (d) => (d.comment = 'x'), '(root)', /unknown key.*comment/],
    ['resonant gain given as text', (d) => (d.currentLoop.resonantGains = d.currentLoop.harmonics.map(() => '100')), 'currentLoop.resonantGains.0', /number/],
    ['resonant gains not an array', (d) => (d.currentLoop.resonantGains = 5), 'currentLoop.resonantGains', /null or an array/],
    ['voltage loop as fast as the grid', (d) => (d.voltageLoop.crossoverHz = 60), 'voltageLoop.crossoverHz', /grid frequency/],
    ['empty name', (d) => (d.name = '   '), 'name', /empty/],
    ['phase margin of 90 degrees', (d) => (d.voltageLoop.phaseMarginDeg = 90), 'voltageLoop.phaseMarginDeg', /lie in/],
  ];
  it.each(cases)('rejects %s and names the key', (_name, mutate, path, rule) => {
    const d = clone();
    mutate(d);
    const message = messageAt(d, path);
    expect(message, `issues at ${JSON.stringify(issuePaths(d))}`).toBeDefined();
    expect(message).toMatch(rule);
  });

  it('the demo LCL design itself is accepted', () => {
    expect(issuePaths(clone())).toHaveLength(0);
  });
});

// A valid design generator: values inside the schema's ranges and the cross-field rules (sampling rate above
// twice every harmonic, targets below Nyquist, voltage loop below the grid frequency).
const validDesign: fc.Arbitrary<DesignInput> = fc
  .record({
    name: fc.string({ minLength: 1, maxLength: 40 }).filter((s) => s.trim() === s && s.length > 0),
    voltageRmsV: fc.double({ min: 50, max: 480, noNaN: true }),
    frequencyHz: fc.constantFrom(50, 60),
    apparentPowerVA: fc.double({ min: 100, max: 50_000, noNaN: true }),
    lcl: fc.boolean(),
    l1: fc.double({ min: 1e-4, max: 2e-2, noNaN: true }),
    l2: fc.double({ min: 1e-4, max: 5e-3, noNaN: true }),
    cf: fc.double({ min: 1e-7, max: 5e-5, noNaN: true }),
    rOhm: fc.double({ min: 0, max: 1, noNaN: true }),
    dcF: fc.double({ min: 1e-4, max: 1e-2, noNaN: true }),
    vdc: fc.double({ min: 100, max: 900, noNaN: true }),
    fsw: fc.double({ min: 5_000, max: 50_000, noNaN: true }),
    updates: fc.constantFrom(1, 2),
    delay: fc.integer({ min: 0, max: 2 }),
    harmonics: fc.uniqueArray(fc.integer({ min: 1, max: 25 }), { minLength: 1, maxLength: 6 }),
    withGains: fc.boolean(),
    order: fc.constantFrom<1 | 2>(1, 2),
    wordBits: fc.constantFrom<16 | 32>(16, 32),
    kp: fc.option(fc.double({ min: 0.01, max: 100, noNaN: true }), { nil: null }),
  })
  .map((r) => ({
    format: 'varsmith-design/1' as const,
    name: r.name,
    grid: { voltageRmsV: r.voltageRmsV, frequencyHz: r.frequencyHz },
    rating: { apparentPowerVA: r.apparentPowerVA },
    filter: r.lcl
      ? { topology: 'LCL' as const, inverterInductanceH: r.l1, gridInductanceH: r.l2, capacitanceF: r.cf, dampingResistanceOhm: 2 * r.rOhm, resistanceOhm: r.rOhm }
      : { topology: 'L' as const, inductanceH: r.l1, resistanceOhm: r.rOhm },
    dcLink: { capacitanceF: r.dcF, voltageRefV: r.vdc },
    sampling: { switchingFrequencyHz: r.fsw, updatesPerCarrier: r.updates as 1 | 2, computationDelaySamples: r.delay },
    currentLoop: { crossoverHz: r.fsw / 20, harmonics: r.harmonics, resonantBandwidthHz: 0.5, kp: r.kp, resonantGains: r.withGains ? r.harmonics.map((h) => 100 / h) : null },
    voltageLoop: { crossoverHz: r.frequencyHz / 5, phaseMarginDeg: 60, kp: null, ki: null },
    pll: { sogiGain: Math.SQRT2, settlingTimeS: 0.05, dampingRatio: 0.7071, kp: null, ki: null },
    reactiveFilter: { order: r.order, cutoffHz: 10 },
    fixedPoint: { wordBits: r.wordBits },
  }) as DesignInput);

// Every numeric leaf of a design, as a key path.
function numericLeafPaths(value: Json, prefix: string[] = []): string[][] {
  if (typeof value === 'number') return [prefix];
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([k, v]) => numericLeafPaths(v, [...prefix, k]));
}

function setAt(target: Json, path: string[], value: unknown): void {
  let node = target;
  for (const key of path.slice(0, -1)) node = node[key];
  node[path[path.length - 1]] = value;
}

describe('design schema properties (fast-check)', () => {
  it('random valid designs are accepted and a JSON round trip gives back the identical design', () => {
    fc.assert(
      fc.property(validDesign, (design) => {
        const r = parseDesign(JSON.parse(JSON.stringify(design)));
        expect(r.ok, JSON.stringify(r.ok ? null : r.issues)).toBe(true);
        if (r.ok) expect(r.design).toStrictEqual(design);
      }),
      { numRuns: 300 },
    );
  });

  it('a numeric leaf turned into text, null-like garbage or an absurd magnitude is rejected at its own path', () => {
    fc.assert(
      fc.property(validDesign, fc.nat(), fc.constantFrom<unknown>('12', '', [], {}, 1e300, -1e300), (design, pick, bad) => {
        const d = JSON.parse(JSON.stringify(design));
        const leaves = numericLeafPaths(d);
        const path = leaves[pick % leaves.length];
        setAt(d, path, bad);
        // A number inside an array (harmonics, resonant gains) is reported at its index.
        const paths = issuePaths(d);
        expect(paths, `corrupted ${path.join('.')} with ${JSON.stringify(bad)}`).toContain(path.join('.'));
      }),
      { numRuns: 300 },
    );
  });
});
