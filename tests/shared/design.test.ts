// The design schema: every class of bad input is rejected with a message naming the key path.
import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import type { z } from 'zod';
import { parseDesign, designSchema } from '../../shared/api/design';
import type { DesignInput } from '../../shared/control/types';

const examplesDir = new URL('../../examples/', import.meta.url);
const demo = JSON.parse(readFileSync(new URL('sc3-bench-l-120v.json', examplesDir), 'utf8'));

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- mutations poke at arbitrary keys of a JSON clone
type Mutation = (d: any) => void;
const clone = () => JSON.parse(JSON.stringify(demo));

// Type-level: what the schema infers is a DesignInput.
const _typeCheck: DesignInput = {} as z.infer<typeof designSchema>;
void _typeCheck;

describe('parseDesign', () => {
  it.each(readdirSync(examplesDir).filter((f) => f.endsWith('.json')))('accepts the demo design %s', (file) => {
    const r = parseDesign(JSON.parse(readFileSync(new URL(file, examplesDir), 'utf8')));
    expect(r.ok, JSON.stringify(r)).toBe(true);
  });

  const cases: [string, Mutation, string, RegExp][] = [
    ['missing section', (d) => delete d.dcLink, 'dcLink', /required/],
    ['missing key', (d) => delete d.filter.inductanceH, 'filter.inductanceH', /required/],
    ['string for a number', (d) => (d.grid.voltageRmsV = '120'), 'grid.voltageRmsV', /number/],
    ['non-positive inductance', (d) => (d.filter.inductanceH = 0), 'filter.inductanceH', /lie in/],
    ['negative inductance', (d) => (d.filter.inductanceH = -1e-3), 'filter.inductanceH', /lie in/],
    ['absurd magnitude', (d) => (d.dcLink.capacitanceF = 1e9), 'dcLink.capacitanceF', /lie in/],
    ['NaN', (d) => (d.grid.frequencyHz = NaN), 'grid.frequencyHz', /number|finite/],
    ['Infinity', (d) => (d.rating.apparentPowerVA = Infinity), 'rating.apparentPowerVA', /number|finite/],
    ['harmonic not an integer', (d) => (d.currentLoop.harmonics = [1, 2.5]), 'currentLoop.harmonics.1', /integer/],
    ['harmonic not positive', (d) => (d.currentLoop.harmonics = [0, 3]), 'currentLoop.harmonics.0', /lie in/],
    ['harmonic above Nyquist', (d) => { d.sampling.switchingFrequencyHz = 800; d.currentLoop.crossoverHz = 100; d.voltageLoop.crossoverHz = 5; d.reactiveFilter.cutoffHz = 5; }, 'currentLoop.harmonics.3', /Nyquist/],
    ['word length', (d) => (d.fixedPoint.wordBits = 24), 'fixedPoint.wordBits', /16 or 32/],
    ['low-pass order', (d) => (d.reactiveFilter.order = 3), 'reactiveFilter.order', /1 or 2/],
    ['topology', (d) => (d.filter.topology = 'LC'), 'filter.topology', /topology/],
    ['resonant gains length', (d) => (d.currentLoop.resonantGains = [1, 2]), 'currentLoop.resonantGains', /one gain per harmonic/],
    ['unknown key', (d) => (d.sampling.extra = 1), 'sampling', /unknown key/],
    ['wrong format', (d) => (d.format = 'other/2'), 'format', /varsmith-design\/1/],
    ['crossover above Nyquist', (d) => (d.currentLoop.crossoverHz = 15000), 'currentLoop.crossoverHz', /Nyquist/],
    ['gain not null or positive', (d) => (d.voltageLoop.kp = -1), 'voltageLoop.kp', /lie in|null/],
  ];
  it.each(cases)('rejects %s and names the key', (_name, mutate, path, rule) => {
    const d = clone();
    mutate(d);
    const r = parseDesign(d);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const hit = r.issues.find((i) => i.path === path);
    expect(hit, `issues: ${JSON.stringify(r.issues)}`).toBeDefined();
    expect(hit?.message).toMatch(rule);
  });
  it('rejects non-objects at the root', () => {
    const r = parseDesign('not a design');
    expect(r.ok).toBe(false);
  });
});
