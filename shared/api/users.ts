// Account administration payloads (CONTRACT section 6: /api/admin/users).
import { z } from 'zod';
import { roleSchema } from './common';

/** Smallest accepted password length (common practice, no source). */
export const PASSWORD_MIN_LENGTH = 10;

/** One account as admins see it. */
export const userSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  disabled: z.boolean(),
  createdAt: z.string(),
});
/** An account. */
export type User = z.infer<typeof userSchema>;

/** Body of `POST /api/admin/users`. */
export const createUserRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email('must be an e-mail address').max(254),
  name: z.string().trim().min(1, 'must not be empty').max(120),
  role: roleSchema,
  password: z.string().min(PASSWORD_MIN_LENGTH, `must be at least ${PASSWORD_MIN_LENGTH} characters`).max(200),
});
/** A new account. */
export type CreateUserRequest = z.infer<typeof createUserRequestSchema>;

/** Body of `PATCH /api/admin/users/:id`: any of role, disabled, name. */
export const updateUserRequestSchema = z
  .object({
    role: roleSchema.optional(),
    disabled: z.boolean().optional(),
    name: z.string().trim().min(1, 'must not be empty').max(120).optional(),
  })
  .strict()
  .refine((v) => v.role !== undefined || v.disabled !== undefined || v.name !== undefined, { message: 'must change role, disabled or name' });
/** A change to an account. */
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;
