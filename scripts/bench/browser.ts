// Keystroke -> redrawn plots in Debian's Chromium (target <= 50 ms): the built client against the
// real server with a fresh database; an engineer opens a new design on the Loop shapes tab and
// types into the current-loop crossover field (Backspace and "0" alternately, so the value flips
// between two valid designs); each sample runs from the keydown event to the end of the first
// burst of canvas draw calls after it. Figures only, no assertion.
import {
  buildClientIfNeeded, createDesignAndShowPlots, instrumentCanvas, launchBrowser, measureKeystrokeToPlots, signIn, startServer,
} from '../../tests/e2e/harness.mjs';

/**
 * Runs the measurement.
 * @returns timing figures in ms.
 */
export async function run(): Promise<Record<string, unknown>> {
  const built = buildClientIfNeeded();
  const server = await startServer();
  const browser = await launchBrowser();
  try {
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    await instrumentCanvas(context);
    const page = await context.newPage();
    await signIn(page, server.origin, 'engineer');
    const { ink } = await createDesignAndShowPlots(page, server.origin, `Bench timing ${Date.now().toString(36)}`);
    // Warm-up keystrokes (worker start, chart caches) are not counted.
    await measureKeystrokeToPlots(page, '[data-path="currentLoop.crossoverHz"] input, input[data-path="currentLoop.crossoverHz"]', 2);
    const timing = await measureKeystrokeToPlots(page, '[data-path="currentLoop.crossoverHz"] input, input[data-path="currentLoop.crossoverHz"]', 20);
    return { keystrokeToPlots: { ...timing, targetMs: 50, canvases: ink.canvases }, clientRebuilt: built, browser: browser.version() };
  } finally {
    await browser.close();
    await server.stop();
  }
}
