// Read-only access tokens for benches and CI (CONTRACT section 6: /api/tokens).
import type { AccessToken, CreatedAccessToken } from '../../shared/api/releases';
import { apiRequest } from './client';

/**
 * Lists the tokens the signed-in tester (or, for admins, everyone) holds; never the secrets.
 * @returns the tokens.
 */
export async function listTokens(): Promise<AccessToken[]> {
  const body = await apiRequest<AccessToken[] | { tokens: AccessToken[] }>('GET', '/api/tokens');
  return Array.isArray(body) ? body : body.tokens;
}

/**
 * Creates a read-only token; the answer holds the secret, shown this once.
 * @param name - what the token is for (bench, CI job).
 * @returns the token with its secret.
 */
export async function createToken(name: string): Promise<CreatedAccessToken> {
  const body = await apiRequest<CreatedAccessToken | { token: CreatedAccessToken }>('POST', '/api/tokens', { name });
  return 'token' in body && typeof body.token === 'object' ? body.token : (body as CreatedAccessToken);
}

/**
 * Revokes a token; it stops working at once.
 * @param id - token id.
 */
export async function revokeToken(id: string | number): Promise<void> {
  await apiRequest<unknown>('DELETE', `/api/tokens/${encodeURIComponent(String(id))}`);
}
