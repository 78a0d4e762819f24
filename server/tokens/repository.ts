// Access-token storage; returns plain objects.
import type { Transaction } from 'sequelize';
import { rowsByIds } from '../db/filters';
import { AccessTokenModel } from './model';

/** A token row (never the secret). */
export interface TokenRow {
  id: number;
  name: string;
  ownerId: number;
  prefix: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

const plain = (m: AccessTokenModel): TokenRow => ({ id: m.id, name: m.name, ownerId: m.ownerId, prefix: m.prefix, createdAt: m.createdAt, lastUsedAt: m.lastUsedAt ?? null, revokedAt: m.revokedAt ?? null });

/**
 * Inserts a token.
 * @param data - fields.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertToken(data: { name: string; ownerId: number; prefix: string; secretHash: string }, transaction: Transaction): Promise<TokenRow> {
  return plain(await AccessTokenModel.create(data, { transaction }));
}

/**
 * Finds a token by the hash of its secret.
 * @param secretHash - SHA-256 hex.
 * @returns the row or null.
 */
export async function findTokenByHash(secretHash: string): Promise<TokenRow | null> {
  const m = await AccessTokenModel.findOne({ where: { secretHash } });
  return m ? plain(m) : null;
}

/**
 * Finds a token by id.
 * @param id - token id.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findToken(id: number, transaction?: Transaction): Promise<TokenRow | null> {
  const m = await AccessTokenModel.findByPk(id, { transaction });
  return m ? plain(m) : null;
}

/**
 * Lists tokens, optionally of one owner.
 * @param ownerId - owner filter (null: all).
 * @returns the rows.
 */
export async function listTokens(ownerId: number | null): Promise<TokenRow[]> {
  return (await AccessTokenModel.findAll({ where: ownerId === null ? {} : { ownerId }, order: [['id', 'ASC']] })).map(plain);
}

/**
 * Sets fields of a token.
 * @param id - token id.
 * @param changes - last use or revocation time.
 * @param transaction - the write transaction.
 */
export async function updateToken(id: number, changes: { lastUsedAt?: Date; revokedAt?: Date }, transaction: Transaction): Promise<void> {
  await AccessTokenModel.update(changes, { where: { id }, transaction });
}

/**
 * Token names by id, in one query.
 * @param ids - token ids (one page of rows' worth).
 * @returns the names found, by id.
 */
export async function tokenNames(ids: readonly number[]): Promise<Map<number, string>> {
  return new Map((await rowsByIds(AccessTokenModel, ids, ['id', 'name'])).map((m) => [m.id, m.name]));
}
