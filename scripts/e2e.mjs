// `npm run test:e2e`: the whole team flow in Debian's Chromium against the real server and the
// built client. Each role signs in through the form and tours its pages; an engineer creates a
// design, sees the plots drawn, submits; a reviewer approves; the engineer releases; a tester
// downloads the bundle (bytes checked against the release's SHA-256) and pulls it with a bench
// token through the copied command. Any console error or 5xx fails the step it happens in.
// Screenshots go to .e2e-artifacts/. Prints `N passed, M failed`; exits non-zero on failure.
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import {
  ARTIFACTS, ROOT, buildClientIfNeeded, createDesign, field, instrumentCanvas, launchBrowser,
  measureKeystrokeToPlots, showPlots, signIn, startServer, watchPage,
} from '../tests/e2e/harness.mjs';

const results = [];
/** Signed-in page per role. */
const pages = {};
let problems = [];
const sink = (message) => problems.push(message);

async function step(name, fn) {
  problems = [];
  const started = Date.now();
  try {
    await fn();
    if (problems.length) throw new Error(problems.join('\n      '));
    results.push({ name, ok: true });
    process.stdout.write(`  ok    ${name} (${Date.now() - started} ms)\n`);
  } catch (err) {
    results.push({ name, ok: false });
    process.stdout.write(`  FAIL  ${name}\n      ${(err && err.message) || err}\n`);
    for (const [role, page] of Object.entries(pages)) {
      await page.screenshot({ path: path.join(ARTIFACTS, `FAILED-step${results.length}-${role}.png`), fullPage: true }).catch(() => {});
    }
  }
}

function expect(condition, message) {
  if (!condition) throw new Error(message);
}

/**
 * Splits a POSIX shell line into words (single quotes and the `'\''` idiom), for the pull line.
 * @param line - the command line.
 * @returns the words.
 */
function shellWords(line) {
  const words = [];
  let word = '';
  let inWord = false;
  for (let i = 0; i < line.length; i += 1) {
    const ch = line[i];
    if (ch === "'") {
      const end = line.indexOf("'", i + 1);
      word += line.slice(i + 1, end);
      i = end;
      inWord = true;
    } else if (ch === '\\' && i + 1 < line.length) {
      word += line[i + 1];
      i += 1;
      inWord = true;
    } else if (/\s/.test(ch)) {
      if (inWord) words.push(word);
      word = '';
      inWord = false;
    } else {
      word += ch;
      inWord = true;
    }
  }
  if (inWord) words.push(word);
  return words;
}

const TOURS = {
  engineer: ['/designs', '/releases'],
  reviewer: ['/reviews', '/designs', '/releases'],
  tester: ['/releases', '/tokens'],
  admin: ['/designs', '/releases', '/tokens', '/admin/users', '/admin/audit', '/admin/mail'],
};

async function shot(page, name) {
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
}

async function main() {
  mkdirSync(ARTIFACTS, { recursive: true });
  buildClientIfNeeded();
  const server = await startServer();
  const browser = await launchBrowser();
  const { origin } = server;
  const designName = `Pier 9 shunt unit ${Date.now().toString(36)}`;
  let designId = null;
  let release = null;
  let latency = null;
  let tokenSecret = null;
  let pullLine = null;
  let firstRevisionId = null;
  try {
    await step('the built client references no other host (dist/ HTML and CSS)', async () => {
      const dist = path.resolve('dist');
      const files = [path.join(dist, 'index.html'), ...readdirSync(path.join(dist, 'assets')).filter((f) => f.endsWith('.css')).map((f) => path.join(dist, 'assets', f))];
      const external = /(?:src|href)\s*=\s*["']?(?:https?:)?\/\/|url\(\s*["']?(?:https?:)?\/\/|@import\s+["'](?:https?:)?\/\//i;
      for (const file of files) {
        const text = readFileSync(file, 'utf8');
        const hit = text.match(external);
        expect(!hit, `${path.relative(dist, file)} loads from another host: ${hit?.[0]}`);
      }
      const fonts = readdirSync(path.join(dist, 'assets')).filter((f) => /\.(woff2?|ttf)$/.test(f));
      expect(fonts.length > 0, 'no font files shipped in dist/assets (Roboto and Material Icons must be local)');
    });

    for (const role of Object.keys(TOURS)) {
      await step(`${role} signs in through the form and tours ${TOURS[role].join(', ')}`, async () => {
        const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, acceptDownloads: true });
        await instrumentCanvas(context);
        const page = await context.newPage();
        watchPage(page, sink);
        pages[role] = page;
        await signIn(page, origin, role);
        await shot(page, `${role}-start`);
        for (const route of TOURS[role]) {
          await page.goto(`${origin}${route}`);
          await page.waitForLoadState('networkidle');
          expect(new URL(page.url()).pathname === route, `${role} was sent from ${route} to ${page.url()}`);
          await shot(page, `${role}${route.replace(/\//g, '-')}`);
        }
      });
    }

    await step('engineer creates a design and sees the plots drawn (canvas pixels)', async () => {
      const page = pages.engineer;
      designId = await createDesign(page, origin, designName);
      const ink = await showPlots(page);
      await shot(page, 'engineer-workspace-plots');
      expect(ink.canvases > 0, 'no canvas on the Loop shapes tab');
      expect(ink.inkFraction >= 0.002, `the plots are blank (ink ${ink.inkFraction})`);
      process.stdout.write(`        ${ink.canvases} canvases, ${(ink.inkFraction * 100).toFixed(1)} % of pixels drawn\n`);
    });

    await step('keystroke -> redrawn plots in Chromium (measured, target <= 50 ms)', async () => {
      expect(designId !== null, 'no design open');
      latency = await measureKeystrokeToPlots(pages.engineer, '[data-path="currentLoop.crossoverHz"] input, input[data-path="currentLoop.crossoverHz"]');
      expect(latency.medianMs !== null, 'the plots never redrew after a keystroke');
    });

    await step('engineer sends the design for review', async () => {
      const page = pages.engineer;
      expect(designId !== null, 'no design open');
      await page.waitForTimeout(400);
      await page.locator('[data-test="open-submit"]').click();
      await field(page, 'submit-summary', 'textarea').fill('First set for the pier 9 compensator: default PR gains, 1 kHz crossover.');
      const answer = page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/designs\/\d+\/revisions$/.test(r.url()), { timeout: 30_000 });
      await page.locator('[data-test="submit-confirm"]').click();
      const res = await answer;
      expect(res.status() === 201, `submission answered ${res.status()}: ${await res.text()}`);
      firstRevisionId = (await res.json()).id;
      await page.waitForTimeout(300);
      await shot(page, 'engineer-submitted');
    });

    await step('the engineer cannot approve their own revision (403): the reviewer approves from the queue', async () => {
      expect(firstRevisionId !== null, 'nothing submitted');
      const engineerToken = await pages.engineer.evaluate(() => window.sessionStorage.getItem('varsmith.session'));
      const refused = await fetch(`${origin}/api/revisions/${firstRevisionId}/reviews`, {
        method: 'POST', headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${engineerToken}` }, body: JSON.stringify({ decision: 'approve', comment: '' }),
      });
      expect(refused.status === 403, `the engineer's own approval answered ${refused.status}`);
      const page = pages.reviewer;
      await page.goto(`${origin}/reviews`);
      const entry = page.locator('[data-test^="review-entry-"]', { hasText: designName });
      await entry.waitFor({ timeout: 15_000 });
      await entry.click();
      await page.locator('[data-test="review-detail"]').waitFor({ timeout: 15_000 });
      await shot(page, 'reviewer-queue-detail');
      const answer = page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/revisions\/\d+\/reviews$/.test(r.url()), { timeout: 30_000 });
      await page.locator('[data-test="review-approve"]').click();
      const res = await answer;
      expect(res.status() === 201 || res.status() === 200, `approval answered ${res.status()}: ${await res.text()}`);
      await page.locator('[data-test="review-queue"]', { hasNotText: designName }).waitFor({ timeout: 10_000 });
    });

    await step('engineer releases the approved revision after acknowledging the safety caution', async () => {
      const page = pages.engineer;
      await page.goto(`${origin}/releases`);
      await page.locator('[data-test="open-release"]').click();
      const dialog = page.locator('[data-test="release-dialog"]');
      await dialog.waitFor();
      await dialog.locator('[role="note"][aria-label="Safety caution"]').waitFor();
      await field(page, 'release-version').fill('1.0.0');
      const submit = page.locator('[data-test="release-submit"]');
      expect(await submit.isDisabled(), 'Release is enabled before the acknowledgement');
      await page.locator('[data-test="release-ack"]').click();
      await shot(page, 'engineer-release-dialog');
      const answer = page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/revisions\/\d+\/release$/.test(r.url()), { timeout: 60_000 });
      await submit.click();
      const res = await answer;
      expect(res.status() === 201, `release answered ${res.status()}: ${await res.text()}`);
      release = await res.json();
      await page.locator(`[data-test="release-row-${release.id}"]`).waitFor();
      await shot(page, 'engineer-released');
    });

    await step('tester downloads the bundle: size and SHA-256 match the release', async () => {
      expect(release !== null, 'nothing released');
      const page = pages.tester;
      await page.goto(`${origin}/releases`);
      await page.locator(`[data-test="release-row-${release.id}"]`).waitFor({ timeout: 15_000 });
      const downloadEvent = page.waitForEvent('download', { timeout: 30_000 });
      await page.locator(`[data-test="download-${release.id}"]`).click();
      const download = await downloadEvent;
      const dir = mkdtempSync(path.join(tmpdir(), 'varsmith-e2e-dl-'));
      try {
        const file = path.join(dir, download.suggestedFilename());
        await download.saveAs(file);
        const bytes = readFileSync(file);
        expect(bytes.subarray(0, 2).toString('latin1') === 'PK', 'the download is not a zip');
        expect(bytes.length === release.sizeBytes, `downloaded ${bytes.length} bytes, release says ${release.sizeBytes}`);
        const sha = createHash('sha256').update(bytes).digest('hex');
        expect(sha === release.sha256, `SHA-256 ${sha} differs from the release's ${release.sha256}`);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
      await page.locator(`[data-test="toggle-pull-${release.id}"]`).click();
      pullLine = (await page.locator(`[data-test="pull-line-${release.id}"]`).textContent()).trim();
      expect(pullLine.startsWith(`npx varsmith pull --server ${origin} --token <token> --design `), `unexpected pull line: ${pullLine}`);
      expect(pullLine.includes(`--set-version ${release.version} -o `), `pull line lacks the version: ${pullLine}`);
      await shot(page, 'tester-releases-pull');
    });

    await step('tester creates a bench token (shown once) and the copied pull line fetches the set', async () => {
      expect(pullLine !== null, 'no pull line');
      const page = pages.tester;
      await page.goto(`${origin}/tokens`);
      await field(page, 'token-name').fill('Pier 9 HIL rack');
      await page.locator('[data-test="token-create"]').click();
      const secretEl = page.locator('[data-test="token-secret-value"]');
      await secretEl.waitFor({ timeout: 10_000 });
      tokenSecret = (await secretEl.textContent()).trim();
      expect(tokenSecret.length >= 20, 'the token secret is too short');
      await shot(page, 'tester-token-created');
      await page.locator('[data-test="token-secret-dismiss"]').click();
      await page.reload();
      await page.waitForLoadState('networkidle');
      expect(!(await page.content()).includes(tokenSecret), 'the secret is still shown after reload');
      const words = shellWords(pullLine.replace('<token>', tokenSecret));
      expect(words[0] === 'npx' && words[1] === 'varsmith', `pull line does not start with npx varsmith: ${pullLine}`);
      const dir = mkdtempSync(path.join(tmpdir(), 'varsmith-e2e-pull-'));
      try {
        const args = words.slice(2).map((w, i, all) => (all[i - 1] === '-o' ? path.join(dir, w) : w));
        const run = spawnSync(process.execPath, [path.join(ROOT, 'bin', 'varsmith.mjs'), ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
        expect(run.status === 0, `the pull command exited ${run.status}: ${run.stderr || run.stdout}`);
        const out = args[args.indexOf('-o') + 1];
        const sha = createHash('sha256').update(readFileSync(out)).digest('hex');
        expect(sha === release.sha256, `pulled SHA-256 ${sha} differs from ${release.sha256}`);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });

    await step('engineer submits r2; the reviewer compares r1 with r2 (inputs, header diff) and sends it back', async () => {
      expect(designId !== null, 'no design');
      const page = pages.engineer;
      await page.goto(`${origin}/designs/${designId}`);
      const crossover = page.locator('[data-path="currentLoop.crossoverHz"] input, input[data-path="currentLoop.crossoverHz"]').first();
      await crossover.waitFor({ timeout: 15_000 });
      await crossover.fill('800');
      await page.waitForTimeout(400);
      await page.locator('[data-test="open-submit"]').click();
      await field(page, 'submit-summary', 'textarea').fill('Current-loop crossover down to 800 Hz for more phase margin.');
      const answer = page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/designs\/\d+\/revisions$/.test(r.url()), { timeout: 30_000 });
      await page.locator('[data-test="submit-confirm"]').click();
      const res = await answer;
      expect(res.status() === 201, `second submission answered ${res.status()}: ${await res.text()}`);
      const reviewer = pages.reviewer;
      await reviewer.goto(`${origin}/reviews`);
      const entry = reviewer.locator('[data-test^="review-entry-"]', { hasText: designName });
      await entry.waitFor({ timeout: 15_000 });
      await entry.click();
      await reviewer.locator('[data-test="review-compare"]').click();
      await reviewer.waitForURL(/\/revisions\/\d+\/compare\/\d+$/);
      const changed = reviewer.locator('[data-test="side-inputs"] tr[data-changed="yes"]', { hasText: 'currentLoop.crossoverHz' });
      await changed.waitFor({ timeout: 15_000 });
      expect((await changed.textContent()).includes('800'), 'the changed crossover does not show 800');
      await shot(reviewer, 'reviewer-compare-side-by-side');
      await reviewer.locator('[data-test="compare-tab-header"]').click();
      await reviewer.locator('[data-test="header-diff"], [data-test="header-diff-empty"]').first().waitFor();
      expect(await reviewer.locator('[data-test="header-diff"] [data-kind="added"]').count() > 0, 'the header diff shows no added line for a changed gain');
      await shot(reviewer, 'reviewer-compare-header-diff');
      await field(reviewer, 'review-comment', 'textarea').fill('Keep 1 kHz; the margin was fine.');
      const verdict = reviewer.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/revisions\/\d+\/reviews$/.test(r.url()), { timeout: 30_000 });
      await reviewer.locator('[data-test="review-send-back"]').click();
      const sent = await verdict;
      expect(sent.status() === 201 || sent.status() === 200, `send back answered ${sent.status()}`);
    });

    await step('admin sees the release in the audit trail and the mails in the outbox', async () => {
      const page = pages.admin;
      await page.goto(`${origin}/admin/audit`);
      await page.locator('[data-test="audit-table"]', { hasText: 'release.create' }).waitFor({ timeout: 10_000 });
      await shot(page, 'admin-audit-after-release');
      await page.goto(`${origin}/admin/mail`);
      await page.locator('[data-test="mail-list"] .q-item').first().waitFor({ timeout: 10_000 });
      const count = await page.locator('[data-test="mail-list"] [data-test^="mail-"]').count();
      expect(count >= 3, `expected the submission, verdict and release mails, found ${count}`);
      await page.locator('[data-test="mail-list"] [data-test^="mail-"]').first().click();
      await page.locator('[data-test="mail-message"]').waitFor();
      await shot(page, 'admin-mail-message');
    });
  } finally {
    await browser.close().catch(() => {});
    await server.stop();
  }
  if (!latency || latency.medianMs === null) {
    process.stdout.write('keystroke -> redrawn plots: not measured (the plots did not redraw)\n');
  } else {
    process.stdout.write(`keystroke -> redrawn plots: median ${latency.medianMs?.toFixed(1)} ms, p95 ${latency.p95Ms?.toFixed(1)} ms, min ${latency.minMs?.toFixed(1)} ms, max ${latency.maxMs?.toFixed(1)} ms over the first ${latency.samplesMs.length} keystrokes after opening, while the tests load the machine (the workspace reports the analysis itself at a median ${latency.analysisMedianMs ?? '?'} ms; the steady-state figure against the 50 ms target comes from npm run bench)\n`);
  }
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed;
  process.stdout.write(`${passed} passed, ${failed} failed\n`);
  process.exitCode = failed > 0 ? 1 : 0;
}

main().catch((err) => {
  process.stdout.write(`e2e harness error: ${(err && err.stack) || err}\n`);
  const passed = results.filter((r) => r.ok).length;
  process.stdout.write(`${passed} passed, ${results.length - passed + 1} failed\n`);
  process.exitCode = 1;
});
