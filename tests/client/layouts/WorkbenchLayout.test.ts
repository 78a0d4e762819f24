// The signed-in shell: brand, role-filtered navigation, sign-out, refused pages, 404.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { mountApp, waitFor } from '../mountApp';
import { signInAs } from '../session';

describe('WorkbenchLayout', () => {
  it('shows the admin everything an admin may use and signs out', async () => {
    signInAs('admin');
    server.use(http.get('*/api/designs', () => HttpResponse.json([])));
    const { root, router } = await mountApp('/designs');
    await waitFor(() => root.querySelector('header') !== null);
    const header = root.querySelector('header')!.textContent ?? '';
    for (const label of ['Varsmith', 'Designs', 'Released sets', 'Bench tokens', 'Accounts', 'Audit trail', 'Mail outbox']) expect(header).toContain(label);
    expect(header).not.toContain('Review queue');
    (root.querySelector('[aria-label="Account menu"]') as HTMLElement).click();
    await waitFor(() => document.querySelector('[data-test="sign-out"]') !== null);
    (document.querySelector('[data-test="sign-out"]') as HTMLElement).click();
    await waitFor(() => router.currentRoute.value.name === 'sign-in');
    expect(window.sessionStorage.getItem('varsmith.session')).toBeNull();
  });

  it('sends an engineer away from an admin page with a note', async () => {
    signInAs('engineer');
    server.use(http.get('*/api/designs', () => HttpResponse.json([])));
    const { root, router } = await mountApp('/admin/users');
    await waitFor(() => router.currentRoute.value.name === 'designs');
    await waitFor(() => (root.textContent ?? '').includes('cannot open that page'));
  });

  it('drops a token the server no longer accepts', async () => {
    window.sessionStorage.setItem('varsmith.session', 'stale');
    server.use(http.get('*/api/auth/me', () => HttpResponse.json({ error: { code: 'unauthorized', message: 'expired' } }, { status: 401 })));
    const { router } = await mountApp('/releases');
    await waitFor(() => router.currentRoute.value.name === 'sign-in');
    expect(window.sessionStorage.getItem('varsmith.session')).toBeNull();
  });

  it('answers unknown addresses with the 404 page', async () => {
    const { root, router } = await mountApp('/no/such/page');
    expect(router.currentRoute.value.name).toBe('not-found');
    await waitFor(() => (root.textContent ?? '').includes('Nothing here'));
  });
});

describe('start page', () => {
  it.each([
    ['tester', 'releases'],
    ['reviewer', 'review-queue'],
    ['engineer', 'designs'],
    ['admin', 'designs'],
  ] as const)('sends a %s from / to %s without a refusal note', async (role, name) => {
    signInAs(role);
    server.use(http.get('*/api/designs', () => HttpResponse.json([])), http.get('*/api/releases', () => HttpResponse.json([])), http.get('*/api/revisions*', () => HttpResponse.json([])));
    const { root, router } = await mountApp('/');
    await waitFor(() => router.currentRoute.value.name === name);
    expect(router.currentRoute.value.query.refused).toBeUndefined();
    expect(root.textContent ?? '').not.toContain('cannot open that page');
  });
});
