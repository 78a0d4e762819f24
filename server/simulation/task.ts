// The heavy work of a simulation request, as a plain function of plain data: it runs inside a worker
// thread of the simulation pool (pool.ts), never on the HTTP event loop. Failures come back as
// values, so their message and option path survive the trip to the main thread.
import type { MessagePort } from 'node:worker_threads';
import { analyzeDesign, type AnalysisResult, type DesignInput } from '../../shared/control';
import { simulateScenario, SimulationError, type SimulationOptions, type SimulationResult } from '../../shared/simulation';

/** A run: a validated design, its analysis (null: analyse it first, without plot data), the options. */
export interface SimulationTask {
  kind: 'simulate';
  design: DesignInput;
  analysis: AnalysisResult | null;
  options: SimulationOptions;
}

/** Why a run failed: `options` (a rule an option breaks; 400 naming it), `diverged` or `analysis` (422). */
export interface SimulationFailure {
  kind: 'options' | 'diverged' | 'analysis';
  message: string;
  /** Option path, e.g. `durationS`. */
  path: string | null;
}

/** What a run answers. */
export type SimulationOutcome = { ok: true; value: SimulationResult } | { ok: false; failure: SimulationFailure };

/** What the worker receives: the task and the port on which it says "started" (the budget runs from then on). */
export type SimulationMessage = SimulationTask & { started?: MessagePort };

/**
 * Runs one simulation (the worker's handler; also callable in-process).
 * @param message - the task and, from the pool, the port that hears "started".
 * @returns the outcome.
 */
export async function runSimulationTask(message: SimulationMessage): Promise<SimulationOutcome> {
  message.started?.postMessage('started');
  message.started?.close();
  let analysis = message.analysis;
  if (analysis === null) {
    try {
      analysis = analyzeDesign(message.design, { sweepPoints: 0, responseSamples: 0 });
    } catch (err) {
      return { ok: false, failure: { kind: 'analysis', message: `the design could not be analysed: ${(err as Error).message}`, path: null } };
    }
  }
  try {
    return { ok: true, value: simulateScenario(message.design, analysis, message.options) };
  } catch (err) {
    if (!(err instanceof SimulationError)) throw err;
    return { ok: false, failure: { kind: err.code === 'diverged' ? 'diverged' : 'options', message: err.message, path: err.path } };
  }
}
