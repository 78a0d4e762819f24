// Mounts the whole client (Pinia, Quasar, router with memory history) at a path, for page tests.
import { flushPromises } from '@vue/test-utils';
import { createMemoryHistory } from 'vue-router';
import { buildApp, type VarsmithApp } from '../../src/boot/app';
import { ANALYSIS_RUNNER_KEY, type AnalysisRunner } from '../../src/composables/useLiveAnalysis';

/** A mounted app and its root element. */
export interface MountedApp extends VarsmithApp {
  root: HTMLElement;
  unmount: () => void;
}

/**
 * Builds and mounts the app at `path`, waiting for the first navigation and lazy pages.
 * @param path - initial address.
 * @param options - `analysisRunner` replaces where the live analysis runs.
 * @returns the mounted app.
 */
export async function mountApp(path: string, options: { analysisRunner?: AnalysisRunner } = {}): Promise<MountedApp> {
  const parts = buildApp(createMemoryHistory());
  if (options.analysisRunner) parts.app.provide(ANALYSIS_RUNNER_KEY, options.analysisRunner);
  const root = document.createElement('div');
  document.body.appendChild(root);
  await parts.router.push(path);
  await parts.router.isReady();
  parts.app.mount(root);
  await settle();
  return { ...parts, root, unmount: () => parts.app.unmount() };
}

/**
 * Waits for pending promises, lazy components and timers that resolve immediately.
 * @param rounds - how many flushes.
 */
export async function settle(rounds = 6): Promise<void> {
  for (let i = 0; i < rounds; i += 1) {
    await flushPromises();
    await new Promise((resolve) => setTimeout(resolve, 0));
  }
}

/**
 * Polls until `condition` holds (lazy chunks load at their own pace in tests).
 * @param condition - what to wait for.
 * @param timeoutMs - give up after this long.
 */
export async function waitFor(condition: () => boolean, timeoutMs = 10000): Promise<void> {
  const start = Date.now();
  while (!condition()) {
    if (Date.now() - start > timeoutMs) throw new Error('waitFor: condition not met in time');
    await settle(1);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
