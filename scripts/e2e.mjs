// `npm run test:e2e`: the whole team flow in Debian's Chromium against the real server and the
// built client. Each role signs in through the form and tours its pages; an engineer creates a
// design, sees the plots drawn, submits; a reviewer approves; the engineer releases; a tester
// downloads the bundle (bytes checked against the release's SHA-256) and pulls it with a bench
// token through the copied command; the reviewer compares r1 and r2 in the form's words with the
// plots overlaid and sends r2 back; the author reads the comment; every link in the captured
// e-mails opens its page; at 1024 px no main page scrolls sideways and the safety footer covers
// nothing. Any console error or 5xx fails the step it happens in. Screenshots of every page go to
// .e2e-artifacts/. Prints `N passed, M failed`; exits non-zero on failure.
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import {
  ARTIFACTS, ROOT, buildClientIfNeeded, canvasInk, createDesign, field, instrumentCanvas, launchBrowser,
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
  let compareUrl = null;
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

    await step('engineer runs the time-domain run in the browser worker: progress, metrics, plots drawn', async () => {
      const page = pages.engineer;
      expect(designId !== null, 'no design open');
      await page.locator('[data-test="tab-run"]').click();
      await page.locator('[data-test="simulation-run"]').click();
      await page.locator('[data-test="simulation-metrics"]').waitFor({ timeout: 120_000 });
      const pf = Number(await page.locator('[data-test="metric-pf"]').textContent());
      expect(pf >= 0.98, `the steady run's grid power factor is ${pf}`);
      await page.locator('[data-test="simulation-plots"] canvas').first().waitFor({ timeout: 15_000 });
      await shot(page, 'engineer-time-domain-run');
      process.stdout.write(`        ${(await page.locator('[data-test="simulation-summary"]').textContent()).trim()}\n`);
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
      const changed = reviewer.locator('[data-test="side-inputs"] tr[data-changed="yes"]', { hasText: 'Target crossover' }).first();
      await changed.waitFor({ timeout: 15_000 });
      expect((await changed.textContent()).includes('800 Hz'), 'the changed crossover does not read 800 Hz');
      const changesText = await reviewer.locator('[data-test="compare-changes"]').textContent();
      const keyPath = changesText.match(/\b[a-z]+[A-Z][A-Za-z]*\.[a-z][A-Za-z]*\b/);
      expect(!keyPath, `the comparison shows a raw key path: ${keyPath?.[0]}`);
      expect(!/[{}"]/.test(changesText), 'the comparison shows JSON');
      compareUrl = reviewer.url();
      await shot(reviewer, 'reviewer-compare-side-by-side');
      await reviewer.locator('[data-test="tab-plots"]').click();
      await reviewer.locator('[data-test="compare-plots"] canvas').first().waitFor({ timeout: 30_000 });
      let ink = await canvasInk(reviewer);
      for (let i = 0; i < 50 && ink.inkFraction < 0.002; i += 1) { await reviewer.waitForTimeout(200); ink = await canvasInk(reviewer); }
      expect(ink.inkFraction >= 0.002, `the overlaid plots are blank (ink ${ink.inkFraction})`);
      const legend = await reviewer.evaluate(() => document.querySelector('[data-test="compare-plots"]')?.textContent ?? '');
      expect(legend.includes('solid') && legend.includes('dashed'), 'the overlay does not say which revision is which');
      await shot(reviewer, 'reviewer-compare-plots-overlaid');
      await reviewer.locator('[data-test="tab-header"]').click();
      await reviewer.locator('[data-test="header-diff"], [data-test="header-diff-empty"]').first().waitFor();
      expect(await reviewer.locator('[data-test="header-diff"] [data-kind="added"]').count() > 0, 'the header diff shows no added line for a changed gain');
      await shot(reviewer, 'reviewer-compare-header-diff');
      await field(reviewer, 'review-comment', 'textarea').fill('Keep 1 kHz; the margin was fine.');
      const verdict = reviewer.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/revisions\/\d+\/reviews$/.test(r.url()), { timeout: 30_000 });
      await reviewer.locator('[data-test="review-send-back"]').click();
      const sent = await verdict;
      expect(sent.status() === 201 || sent.status() === 200, `send back answered ${sent.status()}`);
    });

    await step('the author reads the send-back comment on the workspace and in the history', async () => {
      const page = pages.engineer;
      await page.goto(`${origin}/designs/${designId}`);
      const banner = page.locator('[data-test="review-comment-banner"]');
      await banner.waitFor({ timeout: 15_000 });
      expect((await banner.textContent()).includes('Keep 1 kHz; the margin was fine.'), 'the workspace does not show the comment');
      await shot(page, 'engineer-workspace-sent-back');
      await page.goto(`${origin}/designs/${designId}/revisions`);
      const reviews = page.locator('[data-test="history-reviews-2"]');
      await reviews.waitFor({ timeout: 15_000 });
      expect((await reviews.textContent()).includes('Keep 1 kHz'), 'the history does not show the comment');
      const releaseLink = page.locator('[data-test="history-release-link-1"]');
      expect((await releaseLink.textContent()).includes(release.version), 'the history does not link r1 to its release');
      await shot(page, 'engineer-history-with-reviews');
    });

    await step('the release page: r1 and 1.0.0 linked both ways, full SHA-256, curl and pull lines, the report', async () => {
      const page = pages.engineer;
      await page.goto(`${origin}/releases/${release.id}`);
      await page.locator('[data-test="release-title"]').waitFor({ timeout: 15_000 });
      expect((await page.locator('[data-test="release-sha256"]').textContent()).trim() === release.sha256, 'the page does not show the full SHA-256');
      const curl = (await page.locator(`[data-test="curl-line-${release.id}"]`).textContent()).trim();
      expect(curl.includes('-H "Authorization: Bearer <token>"') && curl.includes(`/api/releases/${release.id}/bundle`) && curl.includes(release.sha256), `unexpected curl line: ${curl}`);
      await page.locator('[data-test="release-report-body"] table').first().waitFor({ timeout: 15_000 });
      expect(await page.locator('[data-test="release-report-body"] script').count() === 0, 'the report carries a script element');
      await shot(page, 'engineer-release-page');
      await page.locator('[data-test="release-revision-link"]').click();
      await page.waitForURL(/\/revisions\/\d+$/);
      await page.locator('[data-test="revision-release-link"]').waitFor({ timeout: 15_000 });
      expect((await page.locator('[data-test="revision-release-link"]').textContent()).includes(release.version), 'the revision does not link back to its release');
      await shot(page, 'engineer-revision-page');
    });

    await step('the reviewer opens the revision page and its Time-domain run: the stored run, its stamp, plots drawn', async () => {
      const reviewer = pages.reviewer;
      const revisionUrl = pages.engineer.url();
      expect(/\/revisions\/\d+$/.test(new URL(revisionUrl).pathname), `not on a revision page: ${revisionUrl}`);
      await reviewer.goto(revisionUrl);
      await reviewer.locator('[data-test="tab-run"]').click();
      const card = reviewer.locator('[data-test="revision-simulation"]');
      await card.locator('[data-test="simulation-metrics"]').waitFor({ timeout: 120_000 });
      expect((await card.locator('[data-test="revision-simulation-stamp"]').textContent()).includes('Varsmith'), 'no computed-by stamp on the stored run');
      await card.locator('canvas').first().waitFor({ timeout: 15_000 });
      await shot(reviewer, 'reviewer-revision-run');
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

    await step('every link in the captured e-mails opens its page for the recipient', async () => {
      const adminToken = await pages.admin.evaluate(() => window.sessionStorage.getItem('varsmith.session'));
      const mail = await (await fetch(`${origin}/api/admin/mail?limit=500`, { headers: { Authorization: `Bearer ${adminToken}` } })).json();
      const links = new Set();
      for (const m of mail) for (const hit of m.text.matchAll(/https?:\/\/\S+?\/(revisions|releases)\/\d+(?=\s|$)/g)) links.add(hit[0]);
      expect(links.size >= 3, `expected links to revisions and releases in the mail, found ${[...links].join(', ')}`);
      let n = 0;
      for (const link of links) {
        const isRelease = /\/releases\//.test(link);
        const page = isRelease ? pages.tester : pages.reviewer;
        await page.goto(link);
        await page.locator(isRelease ? '[data-test="release-title"]' : '[data-test="revision-title"]').waitFor({ timeout: 15_000 });
        expect(!(await page.content()).includes('Nothing here'), `${link} lands on "Nothing here"`);
        n += 1;
        await shot(page, `mail-link-${n}-${isRelease ? 'release' : 'revision'}`);
      }
      process.stdout.write(`        ${links.size} e-mail links opened their pages\n`);
    });

    await step('a new LCL design sized from the rating names its rules and opens with no warning', async () => {
      const page = pages.engineer;
      await page.goto(`${origin}/designs`);
      await page.locator('[data-test="new-design"]').click();
      await field(page, 'new-design-name').fill(`${designName} LCL`);
      await page.locator('[data-test="new-design-topology"] button', { hasText: 'LCL filter' }).click();
      const sizing = page.locator('[data-test="new-design-sizing"]');
      await sizing.waitFor();
      const rules = await sizing.textContent();
      for (const words of ['5 % of grid voltage', 'at most 5 % of the rating', 'Liserre', 'half the sampling rate']) expect(rules.includes(words), `the sizing does not name "${words}"`);
      await shot(page, 'engineer-new-design-lcl');
      await page.locator('[data-test="create-design"]').click();
      await page.waitForURL(/\/designs\/\d+$/, { timeout: 15_000 });
      await page.locator('[data-test="findings"]').waitFor({ timeout: 30_000 });
      const chips = await page.locator('.q-chip').allTextContents();
      expect(chips.some((c) => /0 errors/.test(c)) && chips.some((c) => /0 warnings/.test(c)), `the new design starts with findings: ${chips.join(', ')}`);
      await shot(page, 'engineer-new-lcl-workspace');
    });

    await step('at 1024 px no main page scrolls sideways, the footer covers nothing, the menus stay on screen', async () => {
      const routes = {
        engineer: ['/designs', `/designs/${designId}`, `/designs/${designId}/revisions`, '/releases', `/releases/${release.id}`, `/revisions/${firstRevisionId}`],
        reviewer: ['/reviews', '/designs', `/designs/${designId}/revisions`, new URL(compareUrl).pathname, `/revisions/${firstRevisionId}`, '/releases'],
        tester: ['/releases', `/releases/${release.id}`, '/tokens'],
        admin: ['/designs', '/releases', '/tokens', '/admin/users', '/admin/audit', '/admin/mail'],
      };
      const problems = [];
      for (const [role, list] of Object.entries(routes)) {
        const page = pages[role];
        await page.setViewportSize({ width: 1024, height: 768 });
        for (const route of list) {
          await page.goto(`${origin}${route}`);
          await page.waitForLoadState('networkidle');
          await page.waitForTimeout(300);
          const layout = await page.evaluate(() => {
            const width = window.innerWidth;
            const scrolls = document.documentElement.scrollWidth > width;
            // Anything drawn past the right edge that no scrolling box of its own contains.
            const clipped = [];
            for (const el of document.querySelectorAll('body *')) {
              const r = el.getBoundingClientRect();
              if (r.width === 0 || r.height === 0 || r.right <= width + 1) continue;
              let boxed = false;
              for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) {
                const ox = getComputedStyle(p).overflowX;
                if ((ox === 'auto' || ox === 'scroll' || ox === 'hidden') && p.getBoundingClientRect().right <= width + 1) { boxed = true; break; }
              }
              if (!boxed) clipped.push(`${el.tagName.toLowerCase()}.${[...el.classList].join('.')} right=${Math.round(r.right)}`);
            }
            const account = document.querySelector('[data-test="account-menu"]')?.getBoundingClientRect();
            const footer = document.querySelector('.q-footer')?.getBoundingClientRect() ?? null;
            window.scrollTo(0, document.documentElement.scrollHeight);
            const container = document.querySelector('.q-page-container');
            const lastContent = [...(container?.querySelectorAll('*') ?? [])].filter((e) => e.getBoundingClientRect().height > 0 && e.children.length === 0).map((e) => e.getBoundingClientRect().bottom);
            const footerAfter = document.querySelector('.q-footer')?.getBoundingClientRect() ?? null;
            return {
              scrolls, clipped: clipped.slice(0, 3),
              accountVisible: account ? account.right <= width + 1 && account.left >= 0 : false,
              footerCovers: footerAfter ? Math.max(...lastContent, 0) > footerAfter.top + 1 : false,
              hasFooter: footer !== null,
            };
          });
          if (layout.scrolls) problems.push(`${role} ${route}: the page scrolls sideways`);
          if (layout.clipped.length) problems.push(`${role} ${route}: drawn past the right edge: ${layout.clipped.join('; ')}`);
          if (!layout.accountVisible) problems.push(`${role} ${route}: the account menu is off screen`);
          if (layout.footerCovers) problems.push(`${role} ${route}: the safety footer covers content at the end of the page`);
          await page.evaluate(() => window.scrollTo(0, 0));
          await page.screenshot({ path: path.join(ARTIFACTS, `1024-${role}${route.replace(/\//g, '-')}.png`) });
        }
        const pull = role === 'tester' ? await page.evaluate(async (id) => {
          const b = document.querySelector(`[data-test="toggle-pull-${id}"]`);
          return b ? b.getBoundingClientRect().right <= window.innerWidth : null;
        }, release.id) : true;
        if (pull === false) problems.push('tester: the pull button is clipped at 1024 px');
        await page.setViewportSize({ width: 1440, height: 900 });
      }
      expect(problems.length === 0, problems.join('\n      '));
    });

    await step('the engineer withdraws the release with a reason; the tester sees it withdrawn with the reason', async () => {
      const page = pages.engineer;
      await page.goto(`${origin}/releases/${release.id}`);
      await page.locator('[data-test="release-withdraw"]').click();
      await field(page, 'withdraw-reason', 'textarea').fill('Superseded on the bench by the 800 Hz trial; do not load.');
      const answer = page.waitForResponse((r) => r.request().method() === 'POST' && /\/api\/releases\/\d+\/withdraw$/.test(r.url()), { timeout: 30_000 });
      await page.locator('[data-test="withdraw-confirm"]').click();
      expect((await answer).status() === 200, 'withdraw refused');
      await page.locator('[data-test="release-withdrawn"]').waitFor();
      const tester = pages.tester;
      await tester.goto(`${origin}/releases/${release.id}`);
      const banner = tester.locator('[data-test="release-withdrawn"]');
      await banner.waitFor({ timeout: 15_000 });
      expect((await banner.textContent()).includes('Superseded on the bench'), 'the tester does not see the reason');
      await shot(tester, 'tester-release-withdrawn');
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
