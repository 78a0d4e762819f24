// What a handler can reach: configuration, database, mailer, and the signed-in actor.
import type { Config } from '../config';
import type { Database } from '../db/connection';
import type { Mailer } from '../mail/service';
import type { SimulationPool } from '../simulation/pool';
import type { Role } from '../../shared/api/common';

/** Shared services of one app instance. */
export interface AppContext {
  config: Config;
  db: Database;
  mailer: Mailer;
  /** Whole-system simulations, off the event loop. */
  simulation: SimulationPool;
}

/** A signed-in person. */
export interface UserActor {
  kind: 'user';
  id: number;
  email: string;
  name: string;
  role: Role;
}

/** A read-only access token (release routes only). */
export interface TokenActor {
  kind: 'token';
  tokenId: number;
  ownerId: number;
  name: string;
}

/** Whoever makes the request. */
export type Actor = UserActor | TokenActor;

/**
 * Short text naming an actor for the audit log and messages.
 * @param actor - the actor.
 * @returns e.g. `ada@varsmith.test` or `token #3 (bench-2)`.
 */
export function actorLabel(actor: Actor | null): string {
  if (actor === null) return 'system';
  return actor.kind === 'user' ? actor.email : `token #${actor.tokenId} (${actor.name})`;
}
