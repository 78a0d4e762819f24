// Review queue, bench tokens and admin pages against msw.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import type { RevisionDetail } from '../../../src/api/types';
import { newDesignTemplate } from '../../../src/stores/designs';
import { buildAnalysis } from '../analysisFixture';
import { buildDesignDetail, buildRevisionSummary } from '../fixtures';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs, TEST_USERS } from '../session';
import { server } from '../setup';

const ownerRef = (role: keyof typeof TEST_USERS) => ({ id: TEST_USERS[role].id, name: TEST_USERS[role].name, email: TEST_USERS[role].email });

function input(root: ParentNode, test: string): HTMLInputElement {
  return root.querySelector<HTMLInputElement>(`[data-test="${test}"] input, input[data-test="${test}"]`)!;
}

describe('ReviewQueuePage', () => {
  it('shows the reason and no usable verdict on the reviewer’s own revision', async () => {
    signInAs('reviewer');
    const own = buildRevisionSummary({ id: 21, designId: 7, number: 2, author: ownerRef('reviewer') });
    const detail: RevisionDetail = { ...own, designName: 'Bay 4 rig', design: newDesignTemplate('Bay 4 rig'), analysis: buildAnalysis(), reviews: [], release: null };
    server.use(
      http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ id: 7, latestRevision: own })])),
      http.get('*/api/revisions/21', () => HttpResponse.json(detail)),
      http.get('*/api/designs/7/revisions', () => HttpResponse.json([own, buildRevisionSummary({ id: 20, designId: 7, number: 1, status: 'superseded' })])),
    );
    const { root } = await mountApp('/reviews');
    await waitFor(() => root.querySelector('[data-test="review-entry-21"]') !== null);
    root.querySelector<HTMLElement>('[data-test="review-entry-21"]')!.click();
    await waitFor(() => root.querySelector('[data-test="review-blocked-reason"]') !== null);
    expect(root.querySelector('[data-test="review-blocked-reason"]')!.textContent).toContain('You wrote this revision');
    expect(root.querySelector('[data-test="review-compare"]')!.getAttribute('href')).toBe('/revisions/20/compare/21');
    expect(root.querySelector('[data-test="review-detail"]')!.textContent).toContain('985.1 Hz');
  });

  it('shows the empty state when nothing waits', async () => {
    signInAs('reviewer');
    server.use(http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ latestRevision: buildRevisionSummary({ status: 'approved' }) })])));
    const { root } = await mountApp('/reviews');
    await waitFor(() => root.querySelector('[data-test="review-queue-empty"]') !== null);
  });
});

describe('TokensPage', () => {
  it('shows a created secret once with a copy button, and forgets it when dismissed', async () => {
    signInAs('tester');
    let posted: unknown = null;
    const listed = { id: 4, name: 'HIL rack 2', owner: ownerRef('tester'), prefix: 'vst_9f2c', createdAt: '2026-12-01T00:00:00Z', lastUsedAt: null, revokedAt: null };
    server.use(
      http.get('*/api/tokens', () => HttpResponse.json(posted ? [listed] : [])),
      http.post('*/api/tokens', async ({ request }) => {
        posted = await request.json();
        return HttpResponse.json({ ...listed, secret: 'vst_9f2c_s3cr3t-value' }, { status: 201 });
      }),
    );
    const { root } = await mountApp('/tokens');
    await waitFor(() => (root.querySelector('[data-test="tokens-table"]')?.textContent ?? '').includes('No token yet'));
    const name = input(root, 'token-name');
    name.value = 'HIL rack 2';
    name.dispatchEvent(new Event('input'));
    await settle();
    root.querySelector<HTMLElement>('[data-test="token-create"]')!.click();
    await waitFor(() => root.querySelector('[data-test="token-secret-value"]') !== null);
    expect(posted).toEqual({ name: 'HIL rack 2' });
    expect(root.querySelector('[data-test="token-secret-value"]')!.textContent).toBe('vst_9f2c_s3cr3t-value');
    expect(root.querySelector('[data-test="token-copy"]')).not.toBeNull();
    expect(root.querySelector('[data-test="tokens-table"]')!.textContent).toContain('vst_9f2c');
    root.querySelector<HTMLElement>('[data-test="token-secret-dismiss"]')!.click();
    await settle();
    expect(root.querySelector('[data-test="token-secret-value"]')).toBeNull();
    expect(root.textContent).not.toContain('s3cr3t');
  });

  it('refuses an empty name before calling the server', async () => {
    signInAs('tester');
    let posted = false;
    server.use(
      http.get('*/api/tokens', () => HttpResponse.json([])),
      http.post('*/api/tokens', () => { posted = true; return HttpResponse.json({}, { status: 201 }); }),
    );
    const { root } = await mountApp('/tokens');
    await waitFor(() => root.querySelector('[data-test="token-create"]') !== null);
    root.querySelector<HTMLElement>('[data-test="token-create"]')!.click();
    await settle();
    expect(posted).toBe(false);
    expect(root.textContent).toContain('Name the token after the bench or job');
  });
});

describe('AdminUsersPage', () => {
  it('changes a role through PATCH and locks the admin’s own row', async () => {
    signInAs('admin');
    let patch: unknown = null;
    const users = [
      { id: 4, email: TEST_USERS.admin.email, name: TEST_USERS.admin.name, role: 'admin', disabled: false, createdAt: '2026-11-01T00:00:00Z' },
      { id: 3, email: TEST_USERS.tester.email, name: TEST_USERS.tester.name, role: 'tester', disabled: false, createdAt: '2026-11-01T00:00:00Z' },
    ];
    server.use(
      http.get('*/api/admin/users', () => HttpResponse.json(users)),
      http.patch('*/api/admin/users/3', async ({ request }) => {
        patch = await request.json();
        return HttpResponse.json({ ...users[1], disabled: true });
      }),
    );
    const { root } = await mountApp('/admin/users');
    await waitFor(() => root.querySelector('[data-test="admin-active-3"]') !== null);
    const own = root.querySelector('[data-test="admin-active-4"]')!;
    expect(own.getAttribute('aria-disabled')).toBe('true');
    root.querySelector<HTMLElement>('[data-test="admin-active-3"]')!.click();
    await waitFor(() => patch !== null);
    expect(patch).toEqual({ disabled: true });
    await waitFor(() => (root.querySelector('[data-test="admin-users-table"]')?.textContent ?? '').includes('disabled'));
  });
});

describe('AdminUserCreateDialog', () => {
  it('clears a field\'s error as soon as the field is put right (no stale "must not be empty")', async () => {
    signInAs('admin');
    let posted = false;
    server.use(
      http.get('*/api/admin/users', () => HttpResponse.json([])),
      http.post('*/api/admin/users', () => { posted = true; return HttpResponse.json({}, { status: 201 }); }),
    );
    const { root } = await mountApp('/admin/users');
    await waitFor(() => root.querySelector('[data-test="admin-new-user"]') !== null);
    root.querySelector<HTMLElement>('[data-test="admin-new-user"]')!.click();
    await waitFor(() => document.querySelector('[data-test="admin-user-dialog"]') !== null);
    const dialog = document.querySelector('[data-test="admin-user-dialog"]')!;
    dialog.querySelector('form')!.dispatchEvent(new Event('submit'));
    await settle();
    const messageOf = (test: string) => input(dialog, test).closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
    expect(messageOf('admin-user-name')).not.toBe('');
    expect(messageOf('admin-user-email')).not.toBe('');
    const name = input(dialog, 'admin-user-name');
    name.value = 'Noor Bench';
    name.dispatchEvent(new Event('input'));
    await settle();
    expect(messageOf('admin-user-name')).toBe('');
    expect(messageOf('admin-user-email')).not.toBe('');
    expect(posted).toBe(false);
  });
});

describe('AdminAuditPage', () => {
  it('loads the log and shows actor, action and target', async () => {
    signInAs('admin');
    server.use(
      http.get('*/api/admin/users', () => HttpResponse.json([])),
      http.get('*/api/admin/audit', () => HttpResponse.json([
        { id: 1, actor: { kind: 'user', id: 1, label: 'Ena Engineer' }, action: 'release.create', targetType: 'release', targetId: 3, targetLabel: 'Bay 4 rig 1.0.0', details: { version: '1.0.0' }, createdAt: '2026-12-01T00:00:00Z' },
        { id: 2, actor: { kind: 'token', id: 4, label: 'HIL rack 2' }, action: 'release.download', targetType: 'release', targetId: 3, targetLabel: 'Bay 4 rig 1.0.0', details: {}, createdAt: '2026-12-01T01:00:00Z' },
      ])),
    );
    const { root } = await mountApp('/admin/audit');
    await waitFor(() => (root.querySelector('[data-test="audit-table"]')?.textContent ?? '').includes('release.create'));
    const text = root.querySelector('[data-test="audit-table"]')!.textContent!;
    // The target by name, linked to its page; never a database id.
    expect(text).toContain('release Bay 4 rig 1.0.0');
    expect(text).not.toContain('#3');
    expect(root.querySelector('[data-test="audit-target-1"]')!.getAttribute('href')).toBe('/releases/3');
    expect(text).toContain('HIL rack 2 (token)');
    expect(text).toContain('version=1.0.0');
  });
});

describe('AdminMailPage', () => {
  it('lists captured mail newest first and opens a message', async () => {
    signInAs('admin');
    server.use(http.get('*/api/admin/mail', () => HttpResponse.json([
      { id: 1, from: 'varsmith@localhost', to: ['reviewer@varsmith.test'], subject: 'Bay 4 rig r1 waits for review', text: 'Please review r1.', receivedAt: '2026-11-30T00:00:00Z' },
      { id: 2, from: 'varsmith@localhost', to: ['tester@varsmith.test'], subject: 'Bay 4 rig 1.0.0 released', text: 'Pull it with the bench token.', receivedAt: '2026-12-01T00:00:00Z' },
    ])));
    const { root } = await mountApp('/admin/mail');
    await waitFor(() => root.querySelector('[data-test="mail-2"]') !== null);
    const items = [...root.querySelectorAll('[data-test="mail-list"] [data-test^="mail-"]')].map((e) => e.getAttribute('data-test'));
    expect(items).toEqual(['mail-2', 'mail-1']);
    root.querySelector<HTMLElement>('[data-test="mail-2"]')!.click();
    await waitFor(() => root.querySelector('[data-test="mail-message"]') !== null);
    expect(root.querySelector('[data-test="mail-message"]')!.textContent).toContain('Pull it with the bench token.');
  });
});
