// End-to-end harness: build the client when stale, start the real server on a free port with a
// fresh database, drive Debian's Chromium through playwright-core (never a downloaded browser),
// watch every page for console errors and 5xx answers, and measure keystroke -> redrawn plots.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

/** Repository root. */
export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
/** Where screenshots go (git-ignored). */
export const ARTIFACTS = path.join(ROOT, '.e2e-artifacts');
/** Debian's Chromium. */
export const CHROMIUM = '/usr/bin/chromium';
/** Demo accounts the server seeds into an empty database (server/db/seed.ts). */
export const ACCOUNTS = {
  engineer: 'engineer@varsmith.test',
  reviewer: 'reviewer@varsmith.test',
  tester: 'tester@varsmith.test',
  admin: 'admin@varsmith.test',
};
/** The seeded demo password (server/db/seed.ts, DEMO_PASSWORD). */
export const DEMO_PASSWORD = 'varsmith-demo';

function newestMtimeMs(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestMtimeMs(full));
    else newest = Math.max(newest, statSync(full).mtimeMs);
  }
  return newest;
}

/**
 * Builds the client with `npx vite build` when dist/ is missing or older than its sources.
 * @param log - progress output.
 * @returns whether a build ran.
 */
export function buildClientIfNeeded(log = (line) => process.stderr.write(`${line}\n`)) {
  const index = path.join(ROOT, 'dist', 'index.html');
  const sources = ['src', 'shared', 'index.html', 'vite.config.ts'].map((p) => path.join(ROOT, p)).filter((p) => existsSync(p));
  const newestSource = Math.max(...sources.map((p) => (statSync(p).isDirectory() ? newestMtimeMs(p) : statSync(p).mtimeMs)));
  if (existsSync(index) && statSync(index).mtimeMs >= newestSource) return false;
  log('e2e: building the client (npx vite build) ...');
  const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'] });
  if (built.status !== 0) throw new Error(`vite build failed with exit code ${built.status}`);
  return true;
}

/**
 * A free TCP port on 127.0.0.1.
 * @returns the port.
 */
export function freePort() {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address();
      probe.close(() => resolve(port));
    });
  });
}

/**
 * Starts `npx tsx server/index.ts` on a free port with a fresh temporary DATABASE_PATH and waits
 * for /api/health.
 * @param log - progress output.
 * @returns `{ origin, stop, output }`.
 */
export async function startServer(log = (line) => process.stderr.write(`${line}\n`)) {
  const port = await freePort();
  const dataDir = mkdtempSync(path.join(tmpdir(), 'varsmith-e2e-'));
  const origin = `http://127.0.0.1:${port}`;
  const env = {
    ...process.env,
    PORT: String(port),
    HOST: '127.0.0.1',
    DATABASE_PATH: path.join(dataDir, 'varsmith.sqlite'),
    PUBLIC_URL: origin,
    LOG_LEVEL: 'error',
  };
  delete env.DATABASE_URL;
  delete env.SMTP_URL;
  const child = spawn('npx', ['tsx', 'server/index.ts'], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  const output = [];
  child.stdout.on('data', (chunk) => output.push(String(chunk)));
  child.stderr.on('data', (chunk) => output.push(String(chunk)));
  let exited = null;
  child.once('exit', (code) => { exited = code; });
  const started = Date.now();
  for (;;) {
    if (exited !== null) throw new Error(`the server exited with code ${exited}:\n${output.join('')}`);
    try {
      const res = await fetch(`${origin}/api/health`);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() - started > 60_000) throw new Error(`the server did not answer /api/health within 60 s:\n${output.join('')}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  log(`e2e: server up at ${origin} (database ${env.DATABASE_PATH})`);
  const stop = async () => {
    if (exited === null) {
      try { process.kill(-child.pid, 'SIGTERM'); } catch { /* already gone */ }
      await new Promise((r) => { const t = setTimeout(r, 5000); child.once('exit', () => { clearTimeout(t); r(); }); });
      if (exited === null) { try { process.kill(-child.pid, 'SIGKILL'); } catch { /* gone */ } }
    }
    rmSync(dataDir, { recursive: true, force: true });
  };
  return { origin, stop, output };
}

/**
 * Launches Debian's Chromium headless.
 * @returns the browser.
 */
export async function launchBrowser() {
  if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: install it with apt-get install -y chromium (no browser is downloaded)`);
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/**
 * Counts 2D-canvas draw calls in the page (installed before any script runs) so a redraw of the
 * plots can be timed: every `clearRect`/`fillRect`/`stroke`/`fill`/`drawImage` stamps performance.now().
 * @param context - browser context.
 */
export async function instrumentCanvas(context) {
  await context.addInitScript(() => {
    const stamps = [];
    window.__vsDrawStamps = stamps;
    const proto = window.CanvasRenderingContext2D && window.CanvasRenderingContext2D.prototype;
    if (!proto) return;
    for (const name of ['clearRect', 'fillRect', 'stroke', 'fill', 'drawImage', 'fillText']) {
      const original = proto[name];
      proto[name] = function patched(...args) {
        stamps.push(performance.now());
        if (stamps.length > 200000) { stamps.splice(0, 100000); window.__vsKeyIndex = Math.max(0, (window.__vsKeyIndex || 0) - 100000); }
        return original.apply(this, args);
      };
    }
  });
}

/**
 * Watches a page: console errors, uncaught exceptions, 5xx answers and requests to any other host go to `sink`.
 * @param page - the page.
 * @param sink - `(message) => void`.
 */
export function watchPage(page, sink) {
  // The built app fetches nothing from another host: every request goes to the loopback server (or is data:/blob:).
  page.on('request', (req) => {
    const url = new URL(req.url());
    if ((url.protocol === 'http:' || url.protocol === 'https:' || url.protocol === 'ws:' || url.protocol === 'wss:') && url.hostname !== '127.0.0.1' && url.hostname !== 'localhost') {
      sink(`request to another host from ${page.url()}: ${req.url()}`);
    }
  });
  page.on('console', (msg) => { if (msg.type() === 'error') sink(`console error on ${page.url()}: ${msg.text()}`); });
  page.on('pageerror', (err) => sink(`uncaught exception on ${page.url()}: ${err.message}`));
  page.on('response', (res) => { if (res.status() >= 500) sink(`${res.status()} from ${res.request().method()} ${res.url()}`); });
}

/**
 * A Quasar field's real input (the data-test attribute sits on the field wrapper or the input).
 * @param page - the page.
 * @param test - data-test value.
 * @param tag - `input` or `textarea`.
 * @returns the locator.
 */
export function field(page, test, tag = 'input') {
  return page.locator(`[data-test="${test}"] ${tag}, ${tag}[data-test="${test}"]`).first();
}

/**
 * Signs in through the form as a role and waits to leave the sign-in page.
 * @param page - a fresh page.
 * @param origin - server origin.
 * @param role - engineer, reviewer, tester or admin.
 */
export async function signIn(page, origin, role) {
  await page.goto(`${origin}/sign-in`);
  await field(page, 'email').fill(ACCOUNTS[role]);
  await field(page, 'password').fill(DEMO_PASSWORD);
  await page.locator('[data-test="submit"]').click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 15_000 });
}

/**
 * Share of canvas pixels that are not blank (alpha > 0 and not pure white), over every canvas.
 * @param page - the page.
 * @returns `{ canvases, inkFraction }`.
 */
export async function canvasInk(page) {
  return page.evaluate(() => {
    let ink = 0;
    let total = 0;
    const canvases = [...document.querySelectorAll('canvas')].filter((c) => c.width > 0 && c.height > 0);
    for (const c of canvases) {
      const ctx = c.getContext('2d');
      if (!ctx) continue;
      const data = ctx.getImageData(0, 0, c.width, c.height).data;
      for (let i = 0; i < data.length; i += 4) {
        total += 1;
        if (data[i + 3] > 0 && !(data[i] > 250 && data[i + 1] > 250 && data[i + 2] > 250)) ink += 1;
      }
    }
    return { canvases: canvases.length, inkFraction: total ? ink / total : 0 };
  });
}

/**
 * Times keystroke -> redrawn plots: for each keystroke, from the keydown event's timestamp to the
 * last canvas draw call of the first redraw burst after it (a burst ends at a 30 ms gap).
 * Alternates Backspace and "0" at the end of a field so the value flips between two valid designs.
 * @param page - a page on the workspace with plots shown.
 * @param selector - the input to type into.
 * @param rounds - keystrokes to time.
 * @returns the samples in ms, their median, p95, min and max, and the median analysis time the page reports.
 */
export async function measureKeystrokeToPlots(page, selector, rounds = 12) {
  const input = page.locator(selector).first();
  await input.click();
  await page.keyboard.press('End');
  const samples = [];
  const analysisSamples = [];
  for (let i = 0; i < rounds; i += 1) {
    await page.evaluate(() => {
      window.__vsKeyAt = null;
      // Draw stamps before this index are older than the keystroke: the poll below never rescans them.
      window.__vsKeyIndex = window.__vsDrawStamps.length;
      window.addEventListener('keydown', (e) => { window.__vsKeyAt = e.timeStamp; }, { once: true, capture: true });
    });
    await page.keyboard.press(i % 2 === 0 ? 'Backspace' : '0');
    const latency = await page.evaluate(() => new Promise((resolve) => {
      const started = performance.now();
      const check = () => {
        const keyAt = window.__vsKeyAt;
        const stamps = window.__vsDrawStamps;
        const after = [];
        if (keyAt !== null) for (let j = Math.min(window.__vsKeyIndex, stamps.length); j < stamps.length; j += 1) if (stamps[j] > keyAt) after.push(stamps[j]);
        if (after.length > 0) {
          let end = after[0];
          for (const t of after) { if (t - end > 30) break; end = t; }
          if (performance.now() - end > 120) { resolve(end - keyAt); return; }
        }
        if (performance.now() - started > 5000) { resolve(null); return; }
        setTimeout(check, 20);
      };
      check();
    }));
    if (latency !== null) samples.push(latency);
    const status = await page.locator('[aria-live="polite"]').first().textContent().catch(() => '');
    const analysed = /analysed in ([\d.]+) ms/.exec(status ?? '');
    if (analysed) analysisSamples.push(Number(analysed[1]));
    await page.waitForTimeout(250);
  }
  const sorted = [...samples].sort((x, y) => x - y);
  const round = (v) => (v === null || v === undefined ? null : Math.round(v * 10) / 10);
  const pick = (q) => (sorted.length ? round(sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]) : null);
  return {
    samplesMs: samples.map((s) => Math.round(s * 10) / 10),
    missed: rounds - samples.length,
    medianMs: pick(0.5),
    p95Ms: pick(0.95),
    minMs: round(sorted[0]),
    maxMs: round(sorted[sorted.length - 1]),
    // What the workspace reports for the analysis run itself ("analysed in X ms"), for the split.
    analysisMedianMs: analysisSamples.length ? [...analysisSamples].sort((x, y) => x - y)[Math.ceil(analysisSamples.length / 2) - 1] : null,
  };
}

/**
 * Creates a design through the "New design" dialog as the engineer and waits for its workspace.
 * @param page - a signed-in engineer page.
 * @param origin - server origin.
 * @param name - design name.
 * @returns the design id.
 */
export async function createDesign(page, origin, name) {
  await page.goto(`${origin}/designs`);
  await page.locator('[data-test="new-design"]').click();
  await field(page, 'new-design-name').fill(name);
  await page.locator('[data-test="create-design"]').click();
  await page.waitForURL(/\/designs\/\d+$/, { timeout: 15_000 });
  return Number(new URL(page.url()).pathname.split('/').pop());
}

/**
 * Opens the Loop shapes tab of the workspace and waits until its canvases carry ink.
 * @param page - a page on the workspace.
 * @returns the ink measurement.
 */
export async function showPlots(page) {
  await page.getByRole('tab', { name: /Loop shapes/ }).click();
  await page.locator('canvas').first().waitFor({ state: 'attached', timeout: 20_000 });
  let ink = await canvasInk(page);
  const started = Date.now();
  while (ink.inkFraction < 0.002 && Date.now() - started < 20_000) {
    await page.waitForTimeout(200);
    ink = await canvasInk(page);
  }
  return ink;
}

/**
 * Creates a design and shows its plots.
 * @param page - a signed-in engineer page.
 * @param origin - server origin.
 * @param name - design name.
 * @returns the design id and the ink measurement.
 */
export async function createDesignAndShowPlots(page, origin, name) {
  const id = await createDesign(page, origin, name);
  return { id, ink: await showPlots(page) };
}
