// Options of a whole-system simulation run (CONTRACT section 10), shared by the CLI, the API and the
// client. Defaults are the documented ones of shared/simulation (`defaultSimulationOptions`).
import { z } from 'zod';
import type { SimulationOptions, SimulationResult } from '../simulation/types';

/** The scenarios of CONTRACT section 10 (same list as `SCENARIO_IDS` of shared/simulation). */
export const scenarioSchema = z.enum(['steady', 'reactive-step', 'frequency-step', 'voltage-sag'], { error: 'must be one of steady, reactive-step, frequency-step, voltage-sag' });

/** Bridge models (same list as `BRIDGE_MODELS`). */
export const bridgeModelSchema = z.enum(['averaged', 'switched'], { error: 'must be "averaged" or "switched"' });

/** Harmonic-limit tables. */
export const harmonicTableSchema = z.enum(['ieee-519', 'iec-61000-3-2-class-a'], { error: 'must be "ieee-519" or "iec-61000-3-2-class-a"' });

const finite = (rule: string) => z.number({ error: 'must be a number' }).refine((v) => Number.isFinite(v), { message: 'must be a finite number' }).refine((v) => v > 0, { message: rule });

/** Options of a run; each absent key takes its documented default. Cross-checks against the design (duration in grid cycles, caps) happen in the simulation. */
export const simulationOptionsSchema = z.strictObject({
  scenario: scenarioSchema,
  model: bridgeModelSchema.default('averaged'),
  // Up to 10 s (the simulation's cap); null = the scenario's default length.
  durationS: finite('must be positive').refine((v) => v <= 10, { message: 'must be at most 10 s' }).nullable().default(null),
  // null = stiff grid; absent = the design's envelope.shortCircuitRatioMin.
  shortCircuitRatio: z.union([z.null(), z.number().refine((v) => Number.isFinite(v) && v >= 1 && v <= 1e4, { message: 'must lie in [1, 10000]' })], { error: 'must be null (stiff grid) or a number in [1, 10000]' }).optional(),
  harmonicTable: harmonicTableSchema.default('ieee-519'),
  coefficients: z.enum(['double', 'quantized'], { error: 'must be "double" or "quantized"' }).default('double'),
  rectifierPowerW: finite('must be positive').nullable().default(null),
  backgroundHarmonics: z.array(z.strictObject({
    harmonic: z.number().int('must be an integer').min(2, 'must be at least 2').max(50, 'must be at most 50'),
    fraction: z.number().min(0, 'must be >= 0').max(0.2, 'must be at most 0.2'),
    phaseDeg: z.number().min(-360, 'must be >= -360').max(360, 'must be <= 360'),
  }), { error: 'must be a list of { harmonic, fraction, phaseDeg }' }).max(10, 'must hold at most 10 harmonics').default([]),
  tracePoints: z.number().int('must be an integer').min(10, 'must be at least 10').max(20000, 'must be at most 20000').default(2000),
});

/** Parsed options (defaults filled in). */
export type SimulationOptionsInput = z.infer<typeof simulationOptionsSchema>;

/** Body of `POST /api/simulate`: a design (checked by parseDesign) and the run's options. */
export const simulateRequestSchema = simulationOptionsSchema.extend({ design: z.record(z.string(), z.unknown()) });

/** Body of `POST /api/simulate`, parsed. */
export type SimulateRequest = z.infer<typeof simulateRequestSchema>;

/**
 * Query of `GET /api/revisions/:id/simulation`: which stored run. A revision's run uses the
 * coefficients the set ships (`quantized`) unless asked otherwise.
 */
export const revisionSimulationQuerySchema = z.strictObject({
  scenario: scenarioSchema.default('steady'),
  model: bridgeModelSchema.default('averaged'),
  harmonicTable: harmonicTableSchema.default('ieee-519'),
  coefficients: z.enum(['double', 'quantized'], { error: 'must be "double" or "quantized"' }).default('quantized'),
});

/** A parsed revision-run query. */
export type RevisionSimulationQuery = z.infer<typeof revisionSimulationQuerySchema>;

/** A stored run of a revision, as `GET /api/revisions/:id/simulation` answers it. */
export interface RevisionRun {
  revisionId: number;
  scenario: string;
  model: string;
  harmonicTable: string;
  coefficients: string;
  /** Varsmith version that computed the run. */
  toolVersion: string;
  /** When it was computed and stored, ISO 8601. */
  computedAt: string;
  result: SimulationResult;
}

/**
 * The simulation's options from parsed input (firmware rounding of codes and counts always: a run
 * answers what the set does).
 *
 * @param input - parsed options.
 * @returns the options of `simulateScenario`.
 * @example
 * toSimulationOptions(simulationOptionsSchema.parse({ scenario: 'steady' })).model; // => 'averaged'
 */
export function toSimulationOptions(input: SimulationOptionsInput): SimulationOptions {
  const { shortCircuitRatio, ...rest } = input;
  return { ...rest, quantization: 'firmware', ...(shortCircuitRatio === undefined ? {} : { shortCircuitRatio }) };
}
