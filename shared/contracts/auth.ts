import { z } from 'zod';
import { MIN_PASSWORD_LENGTH } from './constants';
import { roleSchema } from './roles';

export { MIN_PASSWORD_LENGTH } from './constants';

/** Body of `POST /api/auth/login`. */
export const loginRequestSchema = z.object({
  email: z.email().max(254),
  password: z.string().min(1, 'password is required').max(200),
});

/** Body of `POST /api/auth/login`. */
export type LoginRequest = z.infer<typeof loginRequestSchema>;

/** The signed-in user as the API returns it. */
export const sessionUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
  shopId: z.string(),
  shopName: z.string(),
});

/** The signed-in user as the API returns it. */
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** Answer of `POST /api/auth/login` and `GET /api/auth/me`. */
export const sessionResponseSchema = z.object({ user: sessionUserSchema });

/** Answer of `POST /api/auth/login` and `GET /api/auth/me`. */
export type SessionResponse = z.infer<typeof sessionResponseSchema>;

/** A new password chosen by a person (invitation acceptance). */
export const newPasswordSchema = z
  .string()
  .min(MIN_PASSWORD_LENGTH, `password must have at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(200, 'password must have at most 200 characters');
