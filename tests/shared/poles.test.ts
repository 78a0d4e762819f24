import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyzeLoops, buildLoops, characteristicPolynomial, closedLoopMatrix, ControlError, eigenvalues, expm, loopPoleZero, polyAdd, polyMul, roots, ssToTf, type LoopInputs } from '../../shared/control/index';
import { expectClose, sortComplex } from '../helpers/expectClose';

interface FixtureCase {
  name: string; inputs: LoopInputs; loops: Record<'current' | 'voltage' | 'pll', { closedLoopPoles: [number, number][]; maxPoleRadius: number }>;
  expandedPolynomial?: { order: number; maxRootRadius: number };
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/loops.json', import.meta.url), 'utf8')) as { generator: string; cases: FixtureCase[] };

function expectSameRoots(actual: readonly (readonly [number, number])[], expected: readonly (readonly [number, number])[], atol: number, label: string): void {
  // multisets compared after sorting (STYLE habit 9); conjugate pairs sort next to each other
  const a = sortComplex(actual);
  const e = sortComplex(expected);
  expect(a.length, `${label} count`).toBe(e.length);
  const used = new Array<boolean>(a.length).fill(false);
  for (const [re, im] of e) {
    // nearest unused actual root (sorting alone is fragile for near-equal real parts)
    let best = -1;
    let dist = Infinity;
    a.forEach(([r2, i2], k) => { const d = Math.hypot(r2 - re, i2 - im); if (!used[k] && d < dist) { dist = d; best = k; } });
    used[best] = true;
    expectClose(dist, 0, { atol }, `${label} root ${re}+${im}j`);
  }
}

describe(`closed-loop poles vs numpy.linalg.eigvals of an independently assembled state space (${fixture.generator})`, () => {
  for (const c of fixture.cases) {
    it(c.name, () => {
      const result = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: 0 });
      for (const loop of result.loops) {
        const want = c.loops[loop.id];
        expectSameRoots(loop.closedLoopPoles, want.closedLoopPoles, 1e-9, loop.id);
        // acceptance: max pole radius +-2e-5
        expectClose(loop.maxPoleRadius, want.maxPoleRadius, { atol: 1e-10 }, `${loop.id} max radius`);
        expect(loop.stable, loop.id).toBe(want.maxPoleRadius < 1);
      }
    });
  }
  it('the unstable fixture (ideal resonators up to the 13th, two samples of delay) is reported unstable', () => {
    const c = fixture.cases.find((x) => x.name.includes('ideal')) as FixtureCase;
    const current = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: 0 }).loops[0];
    expect(current.maxPoleRadius).toBeGreaterThan(1);
    expect(current.stable).toBe(false);
  });
});

describe('parallel sections vs one expanded polynomial', () => {
  const c = fixture.cases.find((x) => x.expandedPolynomial) as FixtureCase;
  it(`${c.name}: numpy.roots of the order-${c.expandedPolynomial?.order} polynomial reports a spurious unstable root, the sections do not`, () => {
    const expanded = c.expandedPolynomial as { order: number; maxRootRadius: number };
    // numpy 2.4: roots of the expanded characteristic polynomial vs eigvals of the state space with sections
    expect(expanded.maxRootRadius).toBeGreaterThan(1.1);
    expect(c.loops.current.maxPoleRadius).toBeLessThan(1);
    const loop = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: 0 }).loops[0];
    expectClose(loop.maxPoleRadius, c.loops.current.maxPoleRadius, { atol: 1e-10 }, 'max radius');
    expect(loop.stable).toBe(true);
    // the same expansion in this code base's own polynomial tools fails the same way
    let cn = [0];
    let cd = [1];
    for (const s of c.inputs.currentController) { cn = polyAdd(polyMul(cn, s.a), polyMul(s.b, cd)); cd = polyMul(cd, s.a); }
    const plant = ssToTf(buildLoops(c.inputs).current.plant);
    const charPoly = polyAdd(polyMul(polyMul(cd, [1, 0]), plant.den), polyMul(cn, plant.num));
    expect(Math.max(...roots(charPoly).map(([re, im]) => Math.hypot(re, im)))).toBeGreaterThan(1.05);
  });
});

describe('state-space structure', () => {
  const c = fixture.cases[0];
  const loops = buildLoops(c.inputs);
  it('closed-loop size = plant states + delay + controller section states (gain sections add none)', () => {
    // 1 plant state (L filter), 1 delay state, 4 resonators x 2 states, proportional 0
    expect(closedLoopMatrix(loops.current)).toHaveLength(1 + 1 + 8);
    expect(closedLoopMatrix(loops.voltage)).toHaveLength(2);
  });
  it('z^-d adds d open-loop poles at z = 0', () => {
    for (const d of [0, 1, 3]) {
      const pz = loopPoleZero(buildLoops({ ...c.inputs, computationDelaySamples: d }).current);
      expect(pz.poles.filter(([re, im]) => re === 0 && im === 0)).toHaveLength(d);
      expect(pz.poles).toHaveLength(1 + d + 8);
    }
  });
  it('open-loop resonator poles are the section roots, plant pole e^{-R Ts / L} (hand-derived)', () => {
    const pz = loopPoleZero(loops.current);
    const { inductanceH, resistanceOhm } = c.inputs.filter as { inductanceH: number; resistanceOhm: number };
    expect(pz.poles.some(([re, im]) => im === 0 && Math.abs(re - Math.exp((-resistanceOhm * c.inputs.samplePeriodS) / inductanceH)) < 1e-14)).toBe(true);
  });
});

describe('eigenvalues (Francis double-shift QR) on hand-derived cases', () => {
  it('rotation-scaling block r [cos t, -sin t; sin t, cos t] has r e^{+-jt}', () => {
    const r = 0.9995;
    const t = 0.0188;
    expectSameRoots(eigenvalues([[r * Math.cos(t), -r * Math.sin(t)], [r * Math.sin(t), r * Math.cos(t)]]), [[r * Math.cos(t), r * Math.sin(t)], [r * Math.cos(t), -r * Math.sin(t)]], 1e-15, 'rotation');
  });
  it('companion matrix of a polynomial with clustered roots near z = 1 (resonators at 50..350 Hz, 20 kHz)', () => {
    const Ts = 5e-5;
    const wanted: [number, number][] = [];
    let poly = [1];
    for (const fHz of [50, 150, 250, 350]) {
      const th = 2 * Math.PI * fHz * Ts;
      const r = 0.9999;
      wanted.push([r * Math.cos(th), r * Math.sin(th)], [r * Math.cos(th), -r * Math.sin(th)]);
      const q = [1, -2 * r * Math.cos(th), r * r];
      const out = new Array<number>(poly.length + 2).fill(0);
      poly.forEach((p, i) => q.forEach((v, j) => { out[i + j] += p * v; }));
      poly = out;
    }
    // block-diagonal realization: exact to rounding
    const block = Array.from({ length: 8 }, () => new Array<number>(8).fill(0));
    wanted.filter(([, im]) => im > 0).forEach(([re, im], k) => {
      block[2 * k][2 * k] = re; block[2 * k][2 * k + 1] = -im; block[2 * k + 1][2 * k] = im; block[2 * k + 1][2 * k + 1] = re;
    });
    expectSameRoots(eigenvalues(block), wanted, 1e-15, 'block diagonal');
    // the expanded order-8 polynomial is far worse conditioned: its roots are off by ~1e-6 (1.26e-6 measured),
    // nine orders of magnitude worse than the sections, which is why the loops never expand the resonators
    expectSameRoots(roots(poly), wanted, 1e-5, 'expanded polynomial');
    const worst = Math.max(...wanted.map(([re, im]) => Math.min(...roots(poly).map(([r2, i2]) => Math.hypot(r2 - re, i2 - im)))));
    expect(worst).toBeGreaterThan(1e-9);
  });
  it('upper triangular and defective (Jordan) matrices', () => {
    expectSameRoots(eigenvalues([[2, 5, 7], [0, -1, 3], [0, 0, 0.5]]), [[2, 0], [-1, 0], [0.5, 0]], 1e-14, 'triangular');
    // a 2x2 Jordan block: eigenvalue 1 twice, computed to ~sqrt(eps)
    expectSameRoots(eigenvalues([[1, 1], [0, 1]]), [[1, 0], [1, 0]], 1e-7, 'jordan');
  });
  it('characteristic polynomial and matrix exponential closed forms', () => {
    expectClose(characteristicPolynomial([[2, 1], [0, 3]]), [1, -5, 6], { atol: 1e-15 }, 'charpoly');
    const e = expm([[0, 1], [-1, 0]]); // rotation by 1 rad
    expectClose(e.flat(), [Math.cos(1), Math.sin(1), -Math.sin(1), Math.cos(1)], { atol: 1e-14 }, 'expm');
    const big = expm([[-50, 0], [0, 2]]);
    expectClose(big.flat(), [Math.exp(-50), 0, 0, Math.exp(2)], { rtol: 1e-12, atol: 1e-30 }, 'expm scaled');
  });
  it('roots in closed form, and special cases', () => {
    expectSameRoots(roots([1, -3, 2]), [[1, 0], [2, 0]], 1e-15, 'quadratic');
    expectSameRoots(roots([0, 2, 0, 0]), [[0, 0], [0, 0]], 0, 'zeros');
    expectSameRoots(roots([1, 0, 0, -1]), [[1, 0], [-0.5, Math.sqrt(3) / 2], [-0.5, -Math.sqrt(3) / 2]], 1e-15, 'cube roots of 1');
    expect(roots([5])).toEqual([]);
    expect(() => roots([0, 0])).toThrow(ControlError);
    expect(() => eigenvalues([[Number.NaN]])).toThrow(ControlError);
  });
});
