// Sign-in and the current account (CONTRACT section 6: /api/auth/*).
import { apiRequest } from './client';
import type { LoginResponse, SessionUser } from './types';

/**
 * Signs in with e-mail and password.
 * @param email - account e-mail.
 * @param password - account password.
 * @returns the session token and the account.
 */
export function login(email: string, password: string): Promise<LoginResponse> {
  return apiRequest<LoginResponse>('POST', '/api/auth/login', { email, password });
}

/**
 * The account the current token belongs to.
 * @returns the signed-in user.
 */
export async function fetchMe(): Promise<SessionUser> {
  const body = await apiRequest<SessionUser | { user: SessionUser }>('GET', '/api/auth/me');
  return 'user' in body ? body.user : body;
}
