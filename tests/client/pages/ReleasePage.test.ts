// The page of one released set against msw: where it came from (linked for those who may read
// revisions), the full SHA-256, the curl and pull lines, the report rendered as HTML with every tag
// of the text escaped, and withdraw with a reason for engineers and admins.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import type { Release } from '../../../shared/api/releases';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs, TEST_USERS } from '../session';
import { server } from '../setup';

const person = { id: 1, name: 'Ena Engineer', email: 'engineer@varsmith.test' };
const sha = 'c0ffee'.padEnd(64, '7');
const released: Release = {
  id: 3, designId: 7, designName: 'Bay 4 rig', revisionId: 10, revisionNumber: 1, version: '1.0.0', fileName: 'bay-4-rig-1.0.0.zip',
  sizeBytes: 20480, sha256: sha, releasedBy: person, createdAt: '2026-11-30T12:00:00.000Z', withdrawnAt: null, withdrawnReason: null, withdrawnBy: null,
};
// A report whose user-typed parts try to smuggle HTML in.
const report = [
  '# Bay 4 rig <img src=x onerror="alert(1)"> — coefficient set 1.0.0',
  '',
  '> SAFETY CAUTION: verify on a current-limited bench.',
  '',
  '| | |',
  '|---|---|',
  '| design | Bay 4 rig <script>alert(2)</script> |',
  '| version | 1.0.0 |',
  '',
  '[a link](javascript:alert(3))',
  '',
].join('\n');

function answer(release: Release = released): void {
  server.use(
    http.get('*/api/releases/3', () => HttpResponse.json(release)),
    http.get('*/api/releases/3/report', () => new HttpResponse(report, { headers: { 'Content-Type': 'text/markdown; charset=utf-8' } })),
  );
}

describe('ReleasePage', { timeout: 30000 }, () => {
  it('gives a tester the full SHA-256, a curl line with the token header and the pull line with where the CLI comes from', async () => {
    signInAs('tester');
    answer();
    const { root } = await mountApp('/releases/3');
    await waitFor(() => root.querySelector('[data-test="release-sha256"]') !== null);
    expect(root.querySelector('[data-test="release-title"]')!.textContent).toContain('Bay 4 rig');
    expect(root.querySelector('[data-test="release-sha256"]')!.textContent).toBe(sha);
    expect(root.querySelector('[data-test="copy-sha256"]')).not.toBeNull();
    // Testers cannot open revisions: the number shows, without a link.
    expect(root.querySelector('[data-test="release-revision-link"]')).toBeNull();
    expect(root.querySelector('[data-test="release-revision-number"]')!.textContent).toContain('r1');
    const curl = root.querySelector('[data-test="curl-line-3"]')!.textContent!;
    expect(curl).toBe(`curl -fSL -H "Authorization: Bearer <token>" -o bay-4-rig-1.0.0.zip ${window.location.origin}/api/releases/3/bundle\necho '${sha}  bay-4-rig-1.0.0.zip' | sha256sum -c -`);
    expect(root.querySelector('[data-test="pull-line-3"]')!.textContent).toContain('npx varsmith pull');
    expect(root.querySelector('[data-test="release-fetch"]')!.textContent).toContain('npm ci');
    expect(root.querySelector('[data-test="release-withdraw"]')).toBeNull();
  });

  it('renders the report as HTML and lets no tag or script link of the text through', async () => {
    signInAs('tester');
    answer();
    const { root } = await mountApp('/releases/3');
    await waitFor(() => root.querySelector('[data-test="release-report-body"]') !== null);
    const body = root.querySelector('[data-test="release-report-body"]')!;
    expect(body.querySelector('h1')!.textContent).toContain('<img src=x onerror="alert(1)">');
    expect(body.querySelectorAll('table td').length).toBeGreaterThan(2);
    expect(body.querySelector('blockquote')!.textContent).toContain('SAFETY CAUTION');
    expect(body.querySelector('img')).toBeNull();
    expect(body.querySelector('script')).toBeNull();
    expect(body.querySelector('a[href^="javascript:"]')).toBeNull();
    expect(body.textContent).toContain('<script>alert(2)</script>');
  });

  it('links an engineer to the revision and withdraws with the reason typed', async () => {
    signInAs('engineer');
    answer();
    let sent: unknown = null;
    server.use(http.post('*/api/releases/3/withdraw', async ({ request }) => {
      sent = await request.json();
      return HttpResponse.json({ ...released, withdrawnAt: '2026-12-01T09:00:00.000Z', withdrawnReason: (sent as { reason: string }).reason, withdrawnBy: person });
    }));
    const { root } = await mountApp('/releases/3');
    await waitFor(() => root.querySelector('[data-test="release-withdraw"]') !== null);
    expect(root.querySelector('[data-test="release-revision-link"]')!.getAttribute('href')).toBe('/revisions/10');
    root.querySelector<HTMLElement>('[data-test="release-withdraw"]')!.click();
    await waitFor(() => document.querySelector('[data-test="withdraw-dialog"]') !== null);
    const dialog = document.querySelector('[data-test="withdraw-dialog"]')!;
    dialog.querySelector('form')!.dispatchEvent(new Event('submit'));
    await settle();
    expect(sent).toBeNull();
    expect(dialog.textContent).toContain('Say why');
    const reason = dialog.querySelector<HTMLTextAreaElement>('[data-test="withdraw-reason"] textarea, textarea[data-test="withdraw-reason"]')!;
    reason.value = 'The 16-bit port drifts; use 1.1.0.';
    reason.dispatchEvent(new Event('input'));
    await settle();
    dialog.querySelector('form')!.dispatchEvent(new Event('submit'));
    await waitFor(() => root.querySelector('[data-test="release-withdrawn"]') !== null);
    expect(sent).toEqual({ reason: 'The 16-bit port drifts; use 1.1.0.' });
    expect(root.querySelector('[data-test="release-withdrawn"]')!.textContent).toContain('The 16-bit port drifts; use 1.1.0.');
    expect(root.querySelector('[data-test="release-withdraw"]')).toBeNull();
  });

  it('shows a withdrawn set as withdrawn, with who and why, to everyone', async () => {
    signInAs('reviewer');
    answer({ ...released, withdrawnAt: '2026-12-01T09:00:00.000Z', withdrawnReason: 'Wrong grid frequency.', withdrawnBy: { id: TEST_USERS.admin.id, name: TEST_USERS.admin.name, email: TEST_USERS.admin.email } });
    const { root } = await mountApp('/releases/3');
    await waitFor(() => root.querySelector('[data-test="release-withdrawn"]') !== null);
    const banner = root.querySelector('[data-test="release-withdrawn"]')!.textContent!;
    expect(banner).toContain('Wrong grid frequency.');
    expect(banner).toContain(TEST_USERS.admin.name);
    expect(root.querySelector('[data-test="release-withdraw"]')).toBeNull();
  });

  it('says so when the set does not exist', async () => {
    signInAs('tester');
    server.use(http.get('*/api/releases/99', () => HttpResponse.json({ error: { code: 'not-found', message: 'release 99 does not exist' } }, { status: 404 })));
    const { root } = await mountApp('/releases/99');
    await waitFor(() => root.querySelector('[data-test="release-error"]') !== null);
    expect(root.querySelector('[data-test="release-error"]')!.textContent).toContain('release 99 does not exist');
  });
});
