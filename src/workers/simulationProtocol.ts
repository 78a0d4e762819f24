// Messages between the workspace and the simulation worker.
import type { DesignInput } from '../../shared/control';
import type { SimulationOptions, SimulationResult } from '../../shared/simulation';

/** A run for the simulation worker. */
export interface SimulationRequest {
  id: number;
  design: DesignInput;
  options: SimulationOptions;
}

/** What the worker says about a run: progress now and then, then a result or a failure. */
export type SimulationReply =
  | { id: number; kind: 'progress'; fraction: number }
  | { id: number; kind: 'done'; result: SimulationResult; elapsedMs: number }
  | { id: number; kind: 'failed'; message: string; elapsedMs: number };
