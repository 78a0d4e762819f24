// Simulations run in worker threads (piscina), never on the HTTP event loop, each under a time
// budget: a run over its budget is stopped by terminating its worker (piscina starts a fresh one)
// and the request gets a JSON error instead of a hang. The task is one more kind beside the
// analyses and bundle builds of a general compute pool; it keeps the same budget and busy rules.
import { MessageChannel } from 'node:worker_threads';
import { fileURLToPath } from 'node:url';
import Piscina from 'piscina';
import type { AnalysisResult, DesignInput } from '../../shared/control';
import type { SimulationOptions, SimulationResult } from '../../shared/simulation';
import { AppError } from '../errors';
import type { SimulationMessage, SimulationOutcome } from './task';

/**
 * Run-time budget of one simulation, ms: the longest run the options allow at the demo designs'
 * rates (10 s switched) takes a few seconds on one core; a minute leaves room for slower machines
 * and faster sampling, and still frees a stuck worker.
 */
export const SIMULATION_BUDGET_MS = 60000;
/** Runs waiting for a thread, per thread, before new ones are refused as busy. */
export const SIMULATION_QUEUE_PER_THREAD = 4;
/** Longest wait for a thread before a run is refused as busy, ms. */
export const SIMULATION_QUEUE_WAIT_MS = 30000;

/** Settings of a pool. */
export interface SimulationPoolOptions {
  /** Most worker threads (started on demand, stopped when idle). */
  threads: number;
  /** Run-time budget, ms. */
  budgetMs: number;
}

/** Simulations off the event loop. */
export interface SimulationPool {
  /**
   * Runs a scenario; 400 `invalid-option` naming the option, 422 `simulation-diverged` / `analysis-failed` / `over-budget`, 503 `busy`.
   * @param design - a validated design.
   * @param analysis - its analysis, or null to analyse it in the worker.
   * @param options - the run's options.
   * @returns the result.
   */
  simulate(design: DesignInput, analysis: AnalysisResult | null, options: SimulationOptions): Promise<SimulationResult>;
  /** Stops every worker. */
  close(): Promise<void>;
}

const WORKER_FILE = fileURLToPath(new URL('./worker.mjs', import.meta.url));

type Stop = { kind: 'over-budget' | 'busy' };

/**
 * Starts a pool (threads start on the first run).
 * @param options - threads and budget.
 * @returns the pool.
 */
export function createSimulationPool(options: SimulationPoolOptions): SimulationPool {
  const piscina = new Piscina<SimulationMessage, SimulationOutcome>({
    filename: WORKER_FILE,
    minThreads: 0,
    maxThreads: options.threads,
    idleTimeout: 30000,
    maxQueue: SIMULATION_QUEUE_PER_THREAD * options.threads,
  });

  async function simulate(design: DesignInput, analysis: AnalysisResult | null, runOptions: SimulationOptions): Promise<SimulationResult> {
    const controller = new AbortController();
    const channel = new MessageChannel();
    let runTimer: ReturnType<typeof setTimeout> | undefined;
    const waitTimer = setTimeout(() => controller.abort({ kind: 'busy' } satisfies Stop), SIMULATION_QUEUE_WAIT_MS);
    channel.port1.once('message', () => {
      clearTimeout(waitTimer);
      runTimer = setTimeout(() => controller.abort({ kind: 'over-budget' } satisfies Stop), options.budgetMs);
    });
    try {
      const outcome = await piscina.run(
        { kind: 'simulate', design, analysis, options: runOptions, started: channel.port2 },
        { transferList: [channel.port2], signal: controller.signal },
      );
      if (outcome.ok) return outcome.value;
      const f = outcome.failure;
      if (f.kind === 'options') throw new AppError('invalid-option', f.message, 400, f.path ? { fields: [{ path: f.path, message: f.message }] } : {});
      throw new AppError(f.kind === 'diverged' ? 'simulation-diverged' : 'analysis-failed', f.message, 422);
    } catch (err) {
      if (err instanceof AppError) throw err;
      const stop = controller.signal.aborted ? (controller.signal.reason as Stop) : null;
      if (stop?.kind === 'over-budget') {
        throw new AppError('over-budget', `the simulation ran longer than its ${options.budgetMs} ms budget and was stopped; shorten the run or use the averaged model`, 422, { details: { budgetMs: options.budgetMs } });
      }
      if (stop?.kind === 'busy' || /queue is at limit/i.test((err as Error).message ?? '')) {
        throw new AppError('busy', `the server is busy with other simulations; this one did not start within ${SIMULATION_QUEUE_WAIT_MS} ms, try again shortly`, 503, { details: { retryAfterS: 5 } });
      }
      throw err;
    } finally {
      clearTimeout(waitTimer);
      clearTimeout(runTimer);
      channel.port1.close();
    }
  }

  return { simulate, close: () => piscina.destroy() };
}
