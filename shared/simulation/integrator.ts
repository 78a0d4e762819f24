/**
 * Fixed-step trapezoidal integration of the circuit between switching instants.
 *
 * Why the trapezoidal rule: the circuit is stiff in the sense that matters here — its modes span
 * from the DC link (hertz) to the LCL resonance and small load time constants (kilohertz, and
 * faster for a small R-C load or rectifier input), while the step is tied to the control sample.
 * The trapezoidal rule is A-stable (Dahlquist, "A special stability problem for linear multistep
 * methods", BIT 3, 1963, from memory: the A-stable linear multistep method of order 2 with the
 * smallest error constant), so no mode can make it diverge whatever the step; it is the rule of
 * electromagnetic-transient programs (Dommel, "Digital computer solution of electromagnetic
 * transients in single- and multiphase networks", IEEE Trans. PAS-88(4), 1969, from memory); and
 * for linear circuits it preserves linear invariants (Kirchhoff's current law at an inductive
 * node) and the energy of lossless LC parts. Each step is one small linear solve:
 * (I - h/2 A) x[n+1] = (I + h/2 A) x[n] + h/2 B (v_s[n] + v_s[n+1]).
 *
 * Step bound: a mode of angular frequency w comes out at (2/h) atan(w h / 2), a relative phase
 * error of (w h)^2 / 12. The step h is chosen so that h * rho <= {@link TRAPEZOID_STEP_RAD}, rho the
 * spectral radius of A (at m = +-1) and the highest source harmonic: at most 0.52 % phase error on
 * the fastest mode. Intervals are split into equal substeps; at most {@link SUBSTEPS_MAX} per
 * interval (a warning says when the cap binds and the bound is not met).
 */
import { eigenvalues } from '../control';
import { createLuFactors, luFactor, luSolve, type LuFactors } from './linearAlgebra';
import { modeKey, modeMatrices, type ModeMatrices, type NetworkLayout, type NetworkMode, type PlantConfig } from './network';

/** Largest h * rho, rad: relative phase error of the fastest mode at most 0.25^2/12 = 0.52 %. */
export const TRAPEZOID_STEP_RAD = 0.25;

/** Cap on the substeps of one interval (one control sample, or one switching segment). */
export const SUBSTEPS_MAX = 64;

interface Prepared {
  factors: LuFactors;
  /** I + h/2 A, row-major. */
  plus: Float64Array;
  /** h/2 B. */
  gamma: Float64Array;
}

/** A mode's matrices and what the integrator keeps for it. */
export interface IntegratorMode {
  matrices: ModeMatrices;
  /** Spectral radius of A over m in [-1, 1] (largest at the ends), rad/s. */
  spectralRadiusRadPerS: number;
}

/**
 * Trapezoidal stepper of one plant. The caller selects the mode ({@link setMode}) whenever it
 * changes, then prepares a (bridge ratio, step) and steps. Preparing factors I - h/2 A(m) afresh
 * into preallocated storage (about n^3 / 3 operations for n states, well under a microsecond for the
 * plants here): cheaper than caching factorizations, which costs allocation and collection.
 */
export class TrapezoidalIntegrator {
  private readonly modes = new Map<string, IntegratorMode>();
  private readonly n: number;
  private readonly minus: Float64Array;
  private readonly rhs: Float64Array;
  private readonly scratch: Prepared;
  private entry: IntegratorMode | null = null;
  private current: Prepared | null = null;
  /** True once an interval needed more than {@link SUBSTEPS_MAX} substeps. */
  capped = false;

  /**
   * @param config - the plant.
   * @param layout - its layout.
   * @param sourceMaxRadPerS - highest angular frequency in the source voltage, rad/s.
   * @param substepsMin - fewest substeps per interval (1; more for convergence studies).
   */
  constructor(
    private readonly config: PlantConfig,
    private readonly layout: NetworkLayout,
    private readonly sourceMaxRadPerS: number,
    private readonly substepsMin = 1,
  ) {
    const n = layout.n;
    this.n = n;
    this.minus = new Float64Array(n * n);
    this.rhs = new Float64Array(n);
    this.scratch = { factors: createLuFactors(n), plus: new Float64Array(n * n), gamma: new Float64Array(n) };
  }

  /**
   * Makes a mode current (its matrices are computed the first time).
   * @param mode - the mode now in force.
   * @returns its entry.
   */
  setMode(mode: NetworkMode): IntegratorMode {
    const key = modeKey(mode);
    let entry = this.modes.get(key);
    if (!entry) {
      const matrices = modeMatrices(this.config, this.layout, mode);
      const n = this.n;
      let rho = 0;
      for (const sign of [-1, 1]) {
        const a: number[][] = [];
        for (let i = 0; i < n; i++) {
          const row: number[] = [];
          for (let j = 0; j < n; j++) row.push(matrices.a0[i * n + j] + sign * matrices.a1[i * n + j]);
          a.push(row);
        }
        for (const [re, im] of eigenvalues(a)) rho = Math.max(rho, Math.hypot(re, im));
      }
      entry = { matrices, spectralRadiusRadPerS: rho };
      this.modes.set(key, entry);
    }
    this.entry = entry;
    this.current = null;
    return entry;
  }

  /**
   * Substeps for an interval in the current mode so that h * rho <= TRAPEZOID_STEP_RAD (at least `substepsMin`, at most SUBSTEPS_MAX).
   * @param intervalS - interval length, s.
   * @returns the substep count.
   */
  substeps(intervalS: number): number {
    const entry = this.requireMode();
    const rho = Math.max(entry.spectralRadiusRadPerS, this.sourceMaxRadPerS);
    const wanted = Math.max(this.substepsMin, Math.ceil((intervalS * rho) / TRAPEZOID_STEP_RAD));
    if (wanted > SUBSTEPS_MAX) this.capped = true;
    return Math.min(wanted, SUBSTEPS_MAX);
  }

  private requireMode(): IntegratorMode {
    if (!this.entry) throw new Error('TrapezoidalIntegrator: setMode first');
    return this.entry;
  }

  /**
   * Makes (m, h) the current step of the current mode: factors I - h/2 A(m).
   * @param bridgeRatio - m.
   * @param stepS - h, s.
   */
  prepare(bridgeRatio: number, stepS: number): void {
    const entry = this.requireMode();
    const n = this.n;
    const target = this.scratch;
    const { a0, a1, b } = entry.matrices;
    const half = stepS / 2;
    const plus = target.plus;
    const minus = this.minus;
    for (let i = 0; i < n * n; i++) {
      const a = a0[i] + bridgeRatio * a1[i];
      plus[i] = half * a;
      minus[i] = -half * a;
    }
    for (let i = 0; i < n; i++) { plus[i * n + i] += 1; minus[i * n + i] += 1; target.gamma[i] = half * b[i]; }
    luFactor(minus, target.factors);
    this.current = target;
  }

  /**
   * One trapezoidal step of the prepared (mode, m, h), in place.
   * @param x - state at t, replaced by the state at t + h.
   * @param sourceStartV - v_s(t), V.
   * @param sourceEndV - v_s(t + h), V.
   */
  step(x: Float64Array, sourceStartV: number, sourceEndV: number): void {
    const p = this.current;
    if (!p) throw new Error('TrapezoidalIntegrator.step before prepare');
    const n = this.n;
    const rhs = this.rhs;
    const u = sourceStartV + sourceEndV;
    for (let i = 0; i < n; i++) {
      let s = p.gamma[i] * u;
      const row = i * n;
      for (let j = 0; j < n; j++) s += p.plus[row + j] * x[j];
      rhs[i] = s;
    }
    luSolve(p.factors, rhs, x);
  }
}
