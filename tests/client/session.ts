// Signs a test in without the form: a stored token and a mocked /api/auth/me.
import { http, HttpResponse } from 'msw';
import type { Role } from '../../src/api/types';
import { server } from './setup';

/** Demo-like accounts of the tests (invented). */
export const TEST_USERS: Record<Role, { id: number; email: string; name: string; role: Role }> = {
  engineer: { id: 1, email: 'engineer@varsmith.test', name: 'Ena Engineer', role: 'engineer' },
  reviewer: { id: 2, email: 'reviewer@varsmith.test', name: 'Rui Reviewer', role: 'reviewer' },
  tester: { id: 3, email: 'tester@varsmith.test', name: 'Tove Tester', role: 'tester' },
  admin: { id: 4, email: 'admin@varsmith.test', name: 'Adi Admin', role: 'admin' },
};

/**
 * Stores a session token and answers /api/auth/me for it.
 * @param role - who is signed in.
 */
export function signInAs(role: Role): void {
  window.sessionStorage.setItem('varsmith.session', `token-${role}`);
  server.use(http.get('*/api/auth/me', ({ request }) => (request.headers.get('Authorization') === `Bearer token-${role}`
    ? HttpResponse.json(TEST_USERS[role])
    : HttpResponse.json({ error: { code: 'unauthorized', message: 'Sign in' } }, { status: 401 }))));
}
