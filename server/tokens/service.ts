// Read-only access tokens: 256 random bits, shown once, stored as SHA-256, revocable.
import { createHash, randomBytes } from 'node:crypto';
import { forbidden, notFound } from '../errors';
import { record } from '../audit/service';
import type { AppContext, TokenActor, UserActor } from '../middleware/context';
import { findToken, findTokenByHash, insertToken, listTokens, updateToken, type TokenRow } from './repository';

/** Every access-token secret starts with this, so the authenticator can tell it from a JWT. */
export const TOKEN_PREFIX = 'vsk_';

const hash = (secret: string): string => createHash('sha256').update(secret, 'utf8').digest('hex');

/**
 * Issues a token.
 * @param app - services.
 * @param actor - the tester or admin.
 * @param name - label.
 * @returns the row and the secret (shown once).
 */
export async function issueToken(app: AppContext, actor: UserActor, name: string): Promise<{ row: TokenRow; secret: string }> {
  const secret = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
  const row = await app.db.write(async (t) => {
    const created = await insertToken({ name, ownerId: actor.id, prefix: secret.slice(0, 10), secretHash: hash(secret) }, t);
    await record(t, actor, 'token.create', 'token', created.id, { name });
    return created;
  });
  return { row, secret };
}

/**
 * Lists tokens: testers see their own, admins every token.
 * @param actor - who asks.
 * @returns the rows.
 */
export function visibleTokens(actor: UserActor): Promise<TokenRow[]> {
  return listTokens(actor.role === 'admin' ? null : actor.id);
}

/**
 * Revokes a token (owner or admin); revoking twice is harmless.
 * @param app - services.
 * @param actor - who revokes.
 * @param id - token id.
 * @returns the row.
 */
export async function revokeToken(app: AppContext, actor: UserActor, id: number): Promise<TokenRow> {
  return app.db.write(async (t) => {
    const row = await findToken(id, t);
    if (!row) throw notFound(`token ${id}`);
    if (actor.role !== 'admin' && row.ownerId !== actor.id) throw forbidden('only the owner or an admin may revoke this token');
    if (row.revokedAt === null) {
      await updateToken(id, { revokedAt: new Date() }, t);
      await record(t, actor, 'token.revoke', 'token', id, { name: row.name });
    }
    return (await findToken(id, t)) as TokenRow;
  });
}

/**
 * Resolves a presented secret; records the use.
 * @param app - services.
 * @param secret - the bearer secret.
 * @returns the token actor or null when unknown or revoked.
 */
export async function resolveAccessToken(app: AppContext, secret: string): Promise<TokenActor | null> {
  const row = await findTokenByHash(hash(secret));
  if (!row || row.revokedAt !== null) return null;
  const actor: TokenActor = { kind: 'token', tokenId: row.id, ownerId: row.ownerId, name: row.name };
  await app.db.write(async (t) => {
    await updateToken(row.id, { lastUsedAt: new Date() }, t);
    await record(t, actor, 'token.use', 'token', row.id, {});
  });
  return actor;
}
