import { z } from 'zod';
import { passwordSchema, requiredText, userSchema } from './user';

export { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from './constants';

export const signInSchema = z
  .object({
    email: z.string(requiredText('E-mail')).trim().min(1, 'E-mail is required').max(254, 'E-mail must be at most 254 characters'),
    password: z.string(requiredText('Password')).min(1, 'Password is required').max(200, 'Password must be at most 200 characters'),
  })
  .strict()
  .meta({ id: 'SignIn' });
export type SignIn = z.infer<typeof signInSchema>;

export const sessionSchema = z
  .object({
    user: userSchema,
    token: z.string().describe('JWT for `Authorization: Bearer <token>`; the same session is also set as an httpOnly cookie'),
    expiresAt: z.string().describe('ISO 8601 time the session ends'),
  })
  .meta({ id: 'Session' });
export type Session = z.infer<typeof sessionSchema>;

export const meSchema = z.object({ user: userSchema }).meta({ id: 'Me' });

export const changePasswordSchema = z
  .object({
    currentPassword: z.string(requiredText('Current password')).min(1, 'Current password is required').max(200),
    newPassword: passwordSchema,
  })
  .strict()
  .meta({ id: 'ChangePassword' });
export type ChangePassword = z.infer<typeof changePasswordSchema>;

export const healthSchema = z
  .object({
    status: z.enum(['ok', 'degraded']),
    version: z.string(),
    database: z.object({ up: z.boolean(), latencyMs: z.number().nullable() }),
    time: z.string(),
  })
  .meta({ id: 'Health' });
export type Health = z.infer<typeof healthSchema>;
