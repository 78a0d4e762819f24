// Shared pieces of every API payload: roles, ids, the error shape (CONTRACT section 6).
import { z } from 'zod';

/** The four roles of CONTRACT section 6. */
export const roleSchema = z.enum(['engineer', 'reviewer', 'tester', 'admin']);
/** A user role. */
export type Role = z.infer<typeof roleSchema>;
/** Every role, in the order the navigation lists them. */
export const ROLES: readonly Role[] = roleSchema.options;

/** A numeric id in a route parameter (`/api/designs/:id`): a positive integer written in decimal. */
export const idParamSchema = z.coerce.number().int('must be an integer').positive('must be positive');

/** Route parameters holding one `:id`. */
export const idParamsSchema = z.object({ id: idParamSchema });
/** Parsed `{ id }` route parameters. */
export type IdParams = z.infer<typeof idParamsSchema>;

/** One field-level problem: the path into the input (`design.filter.inductanceH`) and the rule broken. */
export const fieldErrorSchema = z.object({ path: z.string(), message: z.string() });
/** A field-level problem. */
export type FieldError = z.infer<typeof fieldErrorSchema>;

/** Every error answer: `{ error: { code, message, fields? } }`. */
export const errorBodySchema = z.object({
  error: z.object({ code: z.string(), message: z.string(), fields: z.array(fieldErrorSchema).optional() }),
});
/** An error answer body. */
export type ErrorBody = z.infer<typeof errorBodySchema>;

/** A person as other payloads mention them. */
export const personSchema = z.object({ id: z.number().int(), name: z.string(), email: z.string() });
/** A person reference. */
export type Person = z.infer<typeof personSchema>;

/** Semantic version `MAJOR.MINOR.PATCH` with optional pre-release (semver.org 2.0.0, section 2 and 9). */
export const semverSchema = z
  .string()
  .max(64, 'must be at most 64 characters')
  .regex(/^(0|[1-9]\d*)\.(0|[1-9]\d*)\.(0|[1-9]\d*)(-[0-9A-Za-z-]+(\.[0-9A-Za-z-]+)*)?$/, 'must be a semantic version such as 1.2.0');
