// Sign-in payloads (CONTRACT section 6: /api/auth).
import { z } from 'zod';
import { roleSchema } from './common';

/** Body of `POST /api/auth/login`. */
export const loginRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email('must be an e-mail address').max(254),
  password: z.string().min(1, 'must not be empty').max(200),
});
/** A sign-in request. */
export type LoginRequest = z.infer<typeof loginRequestSchema>;

/** The signed-in account as `login` and `me` return it. */
export const sessionUserSchema = z.object({ id: z.number().int(), email: z.string(), name: z.string(), role: roleSchema });
/** The signed-in account. */
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** Answer of `POST /api/auth/login`: a bearer token (JWT, 12 h) and the account. */
export const loginResponseSchema = z.object({ token: z.string(), user: sessionUserSchema });
/** A sign-in answer. */
export type LoginResponse = z.infer<typeof loginResponseSchema>;
