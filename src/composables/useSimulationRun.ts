// A whole-system run from the workspace: in a Web Worker when the browser has one (directly on the
// main thread otherwise, e.g. in component tests), with progress and cancel. Cancelling terminates
// the worker; the next run starts a fresh one.
import { inject, onBeforeUnmount, ref, shallowRef, type InjectionKey, type Ref } from 'vue';
import { analyzeDesign, type DesignInput } from '../../shared/control';
import { simulateScenario, type SimulationOptions, type SimulationResult } from '../../shared/simulation';
import type { SimulationReply, SimulationRequest } from '../workers/simulationProtocol';

/** A started run: its final reply, and how to stop it. */
export interface SimulationHandle {
  done: Promise<SimulationReply>;
  cancel(): void;
}

/** Starts runs somewhere; `onProgress` hears the fraction done. */
export type SimulationRunner = (request: SimulationRequest, onProgress: (fraction: number) => void) => SimulationHandle;

/** Lets an app (or a test) provide where simulations run; default: a Web Worker, else the main thread. */
export const SIMULATION_RUNNER_KEY: InjectionKey<SimulationRunner> = Symbol('varsmith.simulationRunner');

function workerRunner(): SimulationRunner | null {
  if (typeof Worker === 'undefined') return null;
  let worker: Worker | null = null;
  return (request, onProgress) => {
    let settle: (reply: SimulationReply) => void = () => {};
    const done = new Promise<SimulationReply>((resolve) => { settle = resolve; });
    try {
      worker ??= new Worker(new URL('../workers/simulation.worker.ts', import.meta.url), { type: 'module' });
    } catch (cause) {
      settle({ id: request.id, kind: 'failed', message: `the simulation worker could not start: ${String(cause)}`, elapsedMs: 0 });
      return { done, cancel: () => {} };
    }
    const current = worker;
    current.onmessage = (event: MessageEvent<SimulationReply>) => {
      if (event.data.id !== request.id) return;
      if (event.data.kind === 'progress') onProgress(event.data.fraction);
      else settle(event.data);
    };
    current.onerror = (event) => settle({ id: request.id, kind: 'failed', message: event.message || 'the simulation worker failed', elapsedMs: 0 });
    current.postMessage(request);
    return {
      done,
      cancel: () => {
        current.terminate();
        if (worker === current) worker = null;
        settle({ id: request.id, kind: 'failed', message: 'cancelled', elapsedMs: 0 });
      },
    };
  };
}

/**
 * The same computation on the main thread (no cancel once started: the core is synchronous). The
 * core is imported statically: only the lazily loaded run panel uses this composable.
 */
const directRunner: SimulationRunner = (request, onProgress) => ({
  done: (async (): Promise<SimulationReply> => {
    await Promise.resolve();
    const started = performance.now();
    try {
      const analysis = analyzeDesign(request.design, { sweepPoints: 0, responseSamples: 0 });
      const result = simulateScenario(request.design, analysis, request.options, { progress: onProgress });
      return { id: request.id, kind: 'done', result, elapsedMs: performance.now() - started };
    } catch (cause) {
      return { id: request.id, kind: 'failed', message: cause instanceof Error ? cause.message : String(cause), elapsedMs: performance.now() - started };
    }
  })(),
  cancel: () => {},
});

/** Reactive state of the workspace's simulation. */
export interface SimulationRun {
  running: Ref<boolean>;
  /** Fraction done of the run in flight, 0 to 1. */
  progress: Ref<number>;
  result: Ref<SimulationResult | null>;
  error: Ref<string | null>;
  /** Wall time of the last finished run, ms. */
  elapsedMs: Ref<number | null>;
  /** The design the shown result was computed for (JSON), to tell when the form has moved on. */
  resultDesignKey: Ref<string | null>;
  run(design: DesignInput, options: SimulationOptions): Promise<void>;
  cancel(): void;
}

/**
 * Runs simulations on request.
 * @param options - runner override (tests).
 * @param options.runner - where runs happen.
 * @returns the state and the run/cancel actions.
 */
export function useSimulationRun(options: { runner?: SimulationRunner } = {}): SimulationRun {
  const running = ref(false);
  const progress = ref(0);
  const result = shallowRef<SimulationResult | null>(null);
  const error = ref<string | null>(null);
  const elapsedMs = ref<number | null>(null);
  const resultDesignKey = ref<string | null>(null);
  const provided = options.runner ?? inject(SIMULATION_RUNNER_KEY, null);
  const runner = provided ?? workerRunner() ?? directRunner;
  let handle: SimulationHandle | null = null;
  let lastId = 0;

  async function run(design: DesignInput, runOptions: SimulationOptions): Promise<void> {
    handle?.cancel();
    lastId += 1;
    const id = lastId;
    const key = JSON.stringify(design);
    running.value = true;
    progress.value = 0;
    error.value = null;
    const started = runner({ id, design: JSON.parse(key) as DesignInput, options: JSON.parse(JSON.stringify(runOptions)) as SimulationOptions }, (f) => {
      if (id === lastId) progress.value = f;
    });
    handle = started;
    const reply = await started.done;
    if (id !== lastId) return;
    handle = null;
    running.value = false;
    if (reply.kind === 'done') {
      result.value = reply.result;
      resultDesignKey.value = key;
      elapsedMs.value = reply.elapsedMs;
      progress.value = 1;
    } else if (reply.kind === 'failed') {
      error.value = reply.message === 'cancelled' ? null : reply.message;
      progress.value = 0;
    }
  }

  function cancel(): void {
    if (!handle) return;
    lastId += 1;
    handle.cancel();
    handle = null;
    running.value = false;
    progress.value = 0;
  }

  onBeforeUnmount(() => cancel());
  return { running, progress, result, error, elapsedMs, resultDesignKey, run, cancel };
}
