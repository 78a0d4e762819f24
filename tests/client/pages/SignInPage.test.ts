// Sign-in through the form against an HTTP-mocked API: success routes by role, 401 and 429 show
// their messages, any later 401 returns to sign-in.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { mountApp, settle, waitFor } from '../mountApp';

const users = {
  engineer: { id: 1, email: 'engineer@varsmith.test', name: 'Ena Engineer', role: 'engineer' },
  tester: { id: 3, email: 'tester@varsmith.test', name: 'Tove Tester', role: 'tester' },
} as const;

function type(root: HTMLElement, selector: string, value: string): void {
  const input = root.querySelector<HTMLInputElement>(`${selector} input, input${selector}`);
  if (!input) throw new Error(`no input ${selector}`);
  input.value = value;
  input.dispatchEvent(new Event('input'));
}

async function submitForm(root: HTMLElement): Promise<void> {
  root.querySelector('form')!.dispatchEvent(new Event('submit'));
  await settle(10);
}

describe('SignInPage', () => {
  it('redirects an anonymous visitor to sign-in and keeps the target', async () => {
    const { router } = await mountApp('/designs');
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.next).toBe('/designs');
  });

  it('signs an engineer in, sends the credentials, and lands on the target page', async () => {
    let sent: unknown = null;
    server.use(
      http.post('*/api/auth/login', async ({ request }) => {
        sent = await request.json();
        return HttpResponse.json({ token: 'tok-eng', user: users.engineer });
      }),
      http.get('*/api/designs', () => HttpResponse.json([])),
    );
    const { root, router } = await mountApp('/sign-in?next=/designs');
    type(root, '[data-test="email"]', ' engineer@varsmith.test ');
    type(root, '[data-test="password"]', 'varsmith-demo');
    await submitForm(root);
    expect(sent).toEqual({ email: 'engineer@varsmith.test', password: 'varsmith-demo' });
    await waitFor(() => router.currentRoute.value.name === 'designs' && (root.textContent ?? '').includes('Ena Engineer'));
    expect(window.sessionStorage.getItem('varsmith.session')).toBe('tok-eng');
    expect(root.textContent).toContain('Ena Engineer');
  });

  it('sends a tester to the released sets and hides engineer navigation', async () => {
    server.use(
      http.post('*/api/auth/login', () => HttpResponse.json({ token: 'tok-t', user: users.tester })),
      http.get('*/api/releases', () => HttpResponse.json([])),
    );
    const { root, router } = await mountApp('/sign-in');
    type(root, '[data-test="email"]', users.tester.email);
    type(root, '[data-test="password"]', 'varsmith-demo');
    await submitForm(root);
    await waitFor(() => router.currentRoute.value.name === 'releases' && root.querySelector('header') !== null);
    const nav = root.querySelector('header')!.textContent ?? '';
    expect(nav).toContain('Released sets');
    expect(nav).toContain('Bench tokens');
    expect(nav).not.toContain('Designs');
    expect(nav).not.toContain('Accounts');
    await router.push('/designs');
    await settle();
    await waitFor(() => router.currentRoute.value.name === 'releases');
    expect(router.currentRoute.value.name).toBe('releases');
  });

  it('shows the wrong-credentials message on 401 and stays on sign-in', async () => {
    server.use(http.post('*/api/auth/login', () => HttpResponse.json({ error: { code: 'bad-credentials', message: 'Invalid e-mail or password' } }, { status: 401 })));
    const { root, router } = await mountApp('/sign-in');
    type(root, '[data-test="email"]', 'engineer@varsmith.test');
    type(root, '[data-test="password"]', 'wrong');
    await submitForm(root);
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(root.querySelector('[data-test="sign-in-error"]')?.textContent).toContain('E-mail or password is wrong');
  });

  it('shows the wait message on 429', async () => {
    server.use(http.post('*/api/auth/login', () => HttpResponse.json({ error: { code: 'rate-limited', message: 'Too many requests' } }, { status: 429 })));
    const { root } = await mountApp('/sign-in');
    type(root, '[data-test="email"]', 'engineer@varsmith.test');
    type(root, '[data-test="password"]', 'x');
    await submitForm(root);
    expect(root.querySelector('[data-test="sign-in-error"]')?.textContent).toContain('Too many attempts');
  });

  it('validates the fields before calling the server', async () => {
    let calls = 0;
    server.use(http.post('*/api/auth/login', () => { calls += 1; return HttpResponse.json({}, { status: 500 }); }));
    const { root } = await mountApp('/sign-in');
    type(root, '[data-test="email"]', 'not-an-address');
    await submitForm(root);
    expect(calls).toBe(0);
    expect(root.textContent).toContain('This is not an e-mail address.');
    expect(root.textContent).toContain('Enter your password.');
  });

  it('returns to sign-in with the session-ended note when a later call answers 401', async () => {
    server.use(
      http.post('*/api/auth/login', () => HttpResponse.json({ token: 'tok-eng', user: users.engineer })),
      http.get('*/api/designs', () => HttpResponse.json({ error: { code: 'unauthorized', message: 'Token expired' } }, { status: 401 })),
    );
    const { root, router } = await mountApp('/sign-in');
    type(root, '[data-test="email"]', users.engineer.email);
    type(root, '[data-test="password"]', 'varsmith-demo');
    await submitForm(root);
    await waitFor(() => router.currentRoute.value.name === 'sign-in');
    expect(router.currentRoute.value.query.expired).toBe('1');
    expect(window.sessionStorage.getItem('varsmith.session')).toBeNull();
  });
});
