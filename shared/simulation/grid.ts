/**
 * The grid at the point of connection: a sinusoidal source (with optional background harmonics)
 * whose frequency and amplitude may step, behind the inductance a short-circuit ratio gives.
 */
import type { DesignInput } from '../control';

/** A background harmonic of the source voltage. */
export interface SourceHarmonic {
  /** Order h (2 to 50). */
  harmonic: number;
  /** Amplitude as a fraction of the fundamental. */
  fraction: number;
  /** Phase of sin(h theta + phase), deg. */
  phaseDeg: number;
}

/** From `fromS` on, the source runs at this frequency and amplitude (phase-continuous). */
export interface SourceSegment {
  fromS: number;
  frequencyHz: number;
  /** Fundamental amplitude over the nominal one. */
  amplitudeScale: number;
}

/** The grid source: v_s(t) = sqrt(2) V a(t) [sin theta(t) + sum_h k_h sin(h theta(t) + phi_h)], theta' = 2 pi f(t). */
export interface GridSource {
  voltageRmsV: number;
  harmonics: SourceHarmonic[];
  /** Sorted by `fromS`; the first starts at 0. */
  segments: SourceSegment[];
}

/**
 * Grid inductance at a short-circuit ratio (CONTRACT section 9): Lg = V^2 / (SCR S wBase).
 *
 * @param design - the design (grid voltage, rating, frequency).
 * @param shortCircuitRatio - SCR = S_sc / S_rated; null = stiff grid.
 * @returns Lg in H (0 for a stiff grid).
 * @example
 * gridInductanceForScr(sc3, 5); // => 120^2 / (5 * 3300 * 2 pi 60) = 2.315e-3 H
 */
export function gridInductanceForScr(design: DesignInput, shortCircuitRatio: number | null): number {
  if (shortCircuitRatio === null) return 0;
  const wBase = 2 * Math.PI * design.grid.frequencyHz;
  return (design.grid.voltageRmsV * design.grid.voltageRmsV) / (shortCircuitRatio * design.rating.apparentPowerVA * wBase);
}

/** Evaluates a {@link GridSource} at any time, phase-continuously across frequency steps. */
export class SourceWaveform {
  private readonly startAngles: number[];
  private readonly amplitudeV: number;

  /**
   * @param source - the source (segments sorted, the first at 0 s).
   */
  constructor(readonly source: GridSource) {
    this.amplitudeV = Math.SQRT2 * source.voltageRmsV;
    this.startAngles = [0];
    for (let k = 1; k < source.segments.length; k++) {
      const prev = source.segments[k - 1];
      const span = source.segments[k].fromS - prev.fromS;
      this.startAngles.push(this.startAngles[k - 1] + 2 * Math.PI * prev.frequencyHz * span);
    }
  }

  private segmentIndex(timeS: number): number {
    const segs = this.source.segments;
    let k = segs.length - 1;
    while (k > 0 && timeS < segs[k].fromS) k--;
    return k;
  }

  /**
   * Fundamental angle theta(t), rad (not wrapped).
   * @param timeS - t, s (>= 0).
   * @returns theta, rad.
   */
  angleRad(timeS: number): number {
    const k = this.segmentIndex(timeS);
    const seg = this.source.segments[k];
    return this.startAngles[k] + 2 * Math.PI * seg.frequencyHz * (timeS - seg.fromS);
  }

  /**
   * Frequency in force at t, Hz.
   * @param timeS - t, s.
   * @returns f, Hz.
   */
  frequencyHz(timeS: number): number {
    return this.source.segments[this.segmentIndex(timeS)].frequencyHz;
  }

  /**
   * Source voltage v_s(t), V.
   * @param timeS - t, s.
   * @returns v_s, V.
   */
  voltageV(timeS: number): number {
    const k = this.segmentIndex(timeS);
    const seg = this.source.segments[k];
    const theta = this.startAngles[k] + 2 * Math.PI * seg.frequencyHz * (timeS - seg.fromS);
    let v = Math.sin(theta);
    for (const h of this.source.harmonics) v += h.fraction * Math.sin(h.harmonic * theta + (h.phaseDeg * Math.PI) / 180);
    return this.amplitudeV * seg.amplitudeScale * v;
  }

  /**
   * Highest angular frequency in the source over its segments, rad/s.
   * @returns max over segments of 2 pi f times the highest harmonic order.
   */
  maxAngularFrequencyRadPerS(): number {
    const hMax = Math.max(1, ...this.source.harmonics.map((h) => h.harmonic));
    return Math.max(...this.source.segments.map((s) => 2 * Math.PI * s.frequencyHz * hMax));
  }
}
