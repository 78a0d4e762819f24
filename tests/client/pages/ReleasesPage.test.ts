// Released sets: list, pull line, download; the release dialog needs the safety acknowledgement
// and a semantic version (semver.org 2.0.0) before it sends anything.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import type { Release } from '../../../shared/api/releases';
import { buildDesignDetail, buildReleaseSummary, buildRevisionSummary } from '../fixtures';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs } from '../session';
import { server } from '../setup';

const person = { id: 1, name: 'Ena Engineer', email: 'engineer@varsmith.test' };
const released: Release = {
  id: 3, designId: 7, designName: 'Bay 4 rig', revisionId: 10, revisionNumber: 1, version: '1.0.0', fileName: 'bay-4-rig-1.0.0.zip',
  sizeBytes: 20480, sha256: 'c0ffee'.padEnd(64, '0'), releasedBy: person, createdAt: '2026-11-30T12:00:00.000Z', withdrawnAt: null, withdrawnReason: null, withdrawnBy: null,
};

function input(root: ParentNode, test: string): HTMLInputElement {
  return root.querySelector<HTMLInputElement>(`[data-test="${test}"] input, input[data-test="${test}"]`)!;
}

function isDisabled(el: Element | null): boolean {
  return !!el && ((el as HTMLButtonElement).disabled || el.getAttribute('aria-disabled') === 'true' || el.classList.contains('disabled'));
}

describe('ReleasesPage', () => {
  it('lists releases for a tester with the exact pull line, and no release button', async () => {
    signInAs('tester');
    server.use(http.get('*/api/releases', () => HttpResponse.json([released])));
    const { root } = await mountApp('/releases');
    await waitFor(() => (root.querySelector('[data-test="releases-table"]')?.textContent ?? '').includes('Bay 4 rig'));
    expect(root.querySelector('[data-test="open-release"]')).toBeNull();
    root.querySelector<HTMLElement>('[data-test="toggle-pull-3"]')!.click();
    await waitFor(() => root.querySelector('[data-test="pull-line-3"]') !== null);
    expect(root.querySelector('[data-test="pull-line-3"]')!.textContent).toBe(
      `npx varsmith pull --server ${window.location.origin} --token <token> --design 'Bay 4 rig' --set-version 1.0.0 -o bay-4-rig-1.0.0.zip`,
    );
  });

  it('keeps Release disabled until the safety caution is acknowledged, then releases with the typed version', async () => {
    signInAs('engineer');
    let body: unknown = null;
    server.use(
      http.get('*/api/releases', () => HttpResponse.json(body ? [{ ...released, id: 4, version: '1.1.0', revisionId: 12, revisionNumber: 2 }, released] : [released])),
      http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ latestRevision: buildRevisionSummary({ id: 12, number: 2, status: 'approved', errorCount: 0 }), latestRelease: buildReleaseSummary({ version: '1.0.0' }) })])),
      http.post('*/api/revisions/12/release', async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ ...released, id: 4, version: '1.1.0', revisionId: 12, revisionNumber: 2 }, { status: 201 });
      }),
    );
    const { root } = await mountApp('/releases');
    await waitFor(() => root.querySelector('[data-test="open-release"]') !== null);
    root.querySelector<HTMLElement>('[data-test="open-release"]')!.click();
    await waitFor(() => document.querySelector('[data-test="release-dialog"]') !== null);
    const dialog = document.querySelector('[data-test="release-dialog"]')!;
    expect(dialog.querySelector('[aria-label="Safety caution"]')!.textContent).toContain('current-limited bench');
    // The suggested version follows the last release (1.0.0 -> 1.1.0).
    expect(input(dialog, 'release-version').value).toBe('1.1.0');
    expect(isDisabled(dialog.querySelector('[data-test="release-submit"]'))).toBe(true);
    expect(dialog.querySelector('[data-test="release-disabled-reason"]')!.textContent).toContain('Acknowledge the safety caution');
    (dialog.querySelector('[data-test="release-submit"]') as HTMLElement).click();
    await settle();
    expect(body).toBeNull();
    (dialog.querySelector('[data-test="release-ack"]') as HTMLElement).click();
    await settle();
    expect(isDisabled(dialog.querySelector('[data-test="release-submit"]'))).toBe(false);
    (dialog.querySelector('[data-test="release-submit"]') as HTMLElement).click();
    await waitFor(() => body !== null);
    expect(body).toEqual({ version: '1.1.0' });
  });

  it('refuses a version that is not semantic, with the rule named', async () => {
    signInAs('admin');
    server.use(
      http.get('*/api/releases', () => HttpResponse.json([])),
      http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ latestRevision: buildRevisionSummary({ id: 12, number: 2, status: 'approved' }) })])),
    );
    const { root } = await mountApp('/releases');
    await waitFor(() => root.querySelector('[data-test="open-release"]') !== null);
    root.querySelector<HTMLElement>('[data-test="open-release"]')!.click();
    await waitFor(() => document.querySelector('[data-test="release-dialog"]') !== null);
    const dialog = document.querySelector('[data-test="release-dialog"]')!;
    expect(input(dialog, 'release-version').value).toBe('1.0.0');
    const version = input(dialog, 'release-version');
    version.value = 'v1.2';
    version.dispatchEvent(new Event('input'));
    (dialog.querySelector('[data-test="release-ack"]') as HTMLElement).click();
    await settle();
    expect(isDisabled(dialog.querySelector('[data-test="release-submit"]'))).toBe(true);
    expect(dialog.textContent).toContain('must be a semantic version such as 1.2.0');
  });

  it('blocks a revision with error checks, saying why', async () => {
    signInAs('engineer');
    server.use(
      http.get('*/api/releases', () => HttpResponse.json([])),
      http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ latestRevision: buildRevisionSummary({ id: 12, number: 2, status: 'approved', errorCount: 2 }) })])),
    );
    const { root } = await mountApp('/releases');
    await waitFor(() => root.querySelector('[data-test="open-release"]') !== null);
    root.querySelector<HTMLElement>('[data-test="open-release"]')!.click();
    await waitFor(() => document.querySelector('[data-test="release-error-checks"]') !== null);
    const dialog = document.querySelector('[data-test="release-dialog"]')!;
    (dialog.querySelector('[data-test="release-ack"]') as HTMLElement).click();
    await settle();
    expect(isDisabled(dialog.querySelector('[data-test="release-submit"]'))).toBe(true);
    expect(dialog.querySelector('[data-test="release-error-checks"]')!.textContent).toContain('2 error checks');
  });

  it('asks the server for one page, newest first, and sends the filter as q', async () => {
    signInAs('tester');
    const asked: URLSearchParams[] = [];
    server.use(http.get('*/api/releases', ({ request }) => {
      const query = new URL(request.url).searchParams;
      asked.push(query);
      return HttpResponse.json(query.get('q') ? [] : [released], { headers: { 'X-Total-Count': query.get('q') ? '0' : '61' } });
    }));
    const { root } = await mountApp('/releases');
    await waitFor(() => (root.querySelector('[data-test="releases-table"]')?.textContent ?? '').includes('1–25 of 61'));
    expect(Object.fromEntries(asked[0].entries())).toEqual({ limit: '25', offset: '0' });
    const filter = input(root, 'release-search');
    filter.value = '2.0';
    filter.dispatchEvent(new Event('input'));
    await waitFor(() => asked.some((q) => q.get('q') === '2.0'));
    await waitFor(() => (root.querySelector('[data-test="releases-table"]')?.textContent ?? '').includes('No release matches'));
  });
});
