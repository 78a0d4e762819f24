// Bearer authentication: a JWT from sign-in (passport-jwt) or a read-only access token.
import { createSecretKey } from 'node:crypto';
import type { Request, Response } from 'express';
import passport from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import { forbidden, unauthorized } from '../errors';
import { findActiveUser } from '../users/repository';
import { resolveAccessToken, TOKEN_PREFIX } from '../tokens/service';
import type { Actor, AppContext, UserActor } from './context';

/** Turns a request into its actor (null when no credentials); tokens only when `tokensAllowed`. */
export type Authenticator = (req: Request, tokensAllowed: boolean) => Promise<Actor | null>;

/** JWT issuer claim. */
export const JWT_ISSUER = 'varsmith';

/**
 * Builds the authenticator of one app instance.
 * @param app - the app services.
 * @returns the authenticator.
 */
export function createAuthenticator(app: AppContext): Authenticator {
  const instance = new passport.Passport();
  instance.use(
    new JwtStrategy(
      // A key object, made once: given the text, jsonwebtoken would try it as a public key and fail on every request.
      { jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(), secretOrKey: createSecretKey(Buffer.from(app.config.jwtSecret, 'utf8')) as unknown as string, issuer: JWT_ISSUER, algorithms: ['HS256'] },
      (payload: { sub?: unknown }, done: (err: unknown, user?: UserActor | false) => void) => {
        const id = Number(payload.sub);
        if (!Number.isInteger(id)) return done(null, false);
        // The role and the disabled flag are read from the database on every request, so changes apply at once.
        findActiveUser(id).then((user) => done(null, user ? { kind: 'user', id: user.id, email: user.email, name: user.name, role: user.role } : false), done);
      },
    ),
  );
  return async (req, tokensAllowed) => {
    const header = req.headers.authorization;
    if (header === undefined || header === '') return null;
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    if (match === null) throw unauthorized('the Authorization header must be "Bearer <token>"');
    const credential = match[1];
    if (credential.startsWith(TOKEN_PREFIX)) {
      const token = await resolveAccessToken(app, credential);
      if (token === null) throw unauthorized('unknown or revoked access token');
      if (!tokensAllowed) throw forbidden('read-only access tokens may only list and download releases');
      return token;
    }
    return new Promise<Actor | null>((resolve, reject) => {
      instance.authenticate('jwt', { session: false }, (err: unknown, user: UserActor | false) => {
        if (err) return reject(err);
        if (!user) return reject(unauthorized('session expired or invalid; sign in again'));
        resolve(user);
      })(req, {} as Response, reject);
    });
  };
}
