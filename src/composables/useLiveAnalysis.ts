// Live analysis while the user types: run in a Web Worker when the browser has one (directly
// otherwise, e.g. in component tests). No debounce: the first edit starts a run at once; edits made
// while a run is in flight are coalesced into one follow-up run with the newest design, and the
// answer for a design that has since changed is dropped.
import { inject, onBeforeUnmount, ref, shallowRef, watch, type InjectionKey, type Ref } from 'vue';
import type { AnalysisOptions, AnalysisResult, DesignInput } from '../../shared/control';
import type { AnalysisReply, AnalysisRequest } from '../workers/analysisProtocol';

/** Plot resolution the workspace asks for. */
export const LIVE_ANALYSIS_OPTIONS: AnalysisOptions = { sweepPoints: 400, responseSamples: 400 };

/**
 * How long the shown result may lag the form before the page says so (progress bar, dimmed
 * panel). A run takes a few ms, so a quick one never flickers the page.
 */
export const LIVE_ANALYSIS_SETTLING_MS = 150;

/** Runs one request somewhere and answers it. */
export type AnalysisRunner = (request: AnalysisRequest) => Promise<AnalysisReply>;

/** Lets an app (or a test) provide where analyses run; default: a Web Worker, else the main thread. */
export const ANALYSIS_RUNNER_KEY: InjectionKey<AnalysisRunner> = Symbol('varsmith.analysisRunner');

function workerRunner(): { run: AnalysisRunner; dispose: () => void } | null {
  if (typeof Worker === 'undefined') return null;
  let worker: Worker;
  try {
    worker = new Worker(new URL('../workers/analysis.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return null;
  }
  const pending = new Map<number, (reply: AnalysisReply) => void>();
  worker.onmessage = (event: MessageEvent<AnalysisReply>) => {
    pending.get(event.data.id)?.(event.data);
    pending.delete(event.data.id);
  };
  worker.onerror = (event) => {
    for (const [id, resolve] of pending) resolve({ id, ok: false, message: event.message || 'The analysis worker failed.', elapsedMs: 0 });
    pending.clear();
  };
  return {
    run: (request) => new Promise((resolve) => { pending.set(request.id, resolve); worker.postMessage(request); }),
    dispose: () => worker.terminate(),
  };
}

/** Same computation on the main thread (the core is pure; loaded lazily to keep it out of the first chunk). */
const directRunner: AnalysisRunner = async (request) => {
  const { analyzeDesign } = await import('../../shared/control');
  const started = performance.now();
  try {
    return { id: request.id, ok: true, result: analyzeDesign(request.design, request.options), elapsedMs: performance.now() - started };
  } catch (cause) {
    return { id: request.id, ok: false, message: cause instanceof Error ? cause.message : String(cause), elapsedMs: performance.now() - started };
  }
};

/** Reactive live-analysis state. */
export interface LiveAnalysis {
  result: Ref<AnalysisResult | null>;
  error: Ref<string | null>;
  /** A run is in flight. */
  running: Ref<boolean>;
  /** The shown result has lagged the form for more than `LIVE_ANALYSIS_SETTLING_MS` (say so on the page). */
  settling: Ref<boolean>;
  /** Compute time of the last answer in ms. */
  elapsedMs: Ref<number | null>;
  /** Whether `result` belongs to the design currently in the form. */
  current: Ref<boolean>;
}

/**
 * Analyses `design` whenever it changes (null = the form has errors: keep the last result, marked stale).
 * @param design - the valid design of the form, or null.
 * @param options - runner and settling-delay overrides (tests).
 * @returns the live state.
 */
export function useLiveAnalysis(design: Ref<DesignInput | null>, options: { runner?: AnalysisRunner; settlingMs?: number } = {}): LiveAnalysis {
  // shallow: the result is replaced whole, never mutated; deep proxies over thousands of plot points cost a frame.
  const result = shallowRef<AnalysisResult | null>(null);
  const error = ref<string | null>(null);
  const running = ref(false);
  const settling = ref(false);
  const elapsedMs = ref<number | null>(null);
  const current = ref(false);
  const provided = options.runner ?? inject(ANALYSIS_RUNNER_KEY, null);
  const worker = provided ? null : workerRunner();
  const run = provided ?? worker?.run ?? directRunner;
  const settlingMs = options.settlingMs ?? LIVE_ANALYSIS_SETTLING_MS;
  let settlingTimer: ReturnType<typeof setTimeout> | null = null;
  let lastId = 0;
  let inFlight = false;
  /** The newest design not yet sent (edits made while a run was in flight). */
  let queued: DesignInput | null = null;
  let disposed = false;

  function markCurrent(value: boolean): void {
    current.value = value;
    if (value || !result.value) {
      if (settlingTimer) clearTimeout(settlingTimer);
      settlingTimer = null;
      settling.value = false;
    } else if (!settlingTimer && !settling.value) {
      settlingTimer = setTimeout(() => { settlingTimer = null; settling.value = !current.value; }, settlingMs);
    }
  }

  async function start(value: DesignInput): Promise<void> {
    lastId += 1;
    const id = lastId;
    inFlight = true;
    running.value = true;
    const reply = await run({ id, design: JSON.parse(JSON.stringify(value)) as DesignInput, options: LIVE_ANALYSIS_OPTIONS });
    inFlight = false;
    if (disposed) return;
    if (queued) {
      const next = queued;
      queued = null;
      void start(next);
      return;
    }
    if (id !== lastId) return;
    running.value = false;
    elapsedMs.value = reply.elapsedMs;
    if (reply.ok) {
      result.value = reply.result;
      error.value = null;
      markCurrent(true);
    } else {
      error.value = reply.message;
      markCurrent(false);
    }
  }

  watch(design, (value) => {
    markCurrent(false);
    if (!value) {
      // The form is invalid: forget any queued design and let the in-flight answer fall on the floor.
      queued = null;
      lastId += 1;
      running.value = false;
      return;
    }
    if (inFlight) queued = value;
    else void start(value);
  }, { immediate: true, deep: true });

  onBeforeUnmount(() => {
    disposed = true;
    if (settlingTimer) clearTimeout(settlingTimer);
    worker?.dispose();
  });

  return { result, error, running, settling, elapsedMs, current };
}
