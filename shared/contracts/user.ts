import { z } from 'zod';
import { PASSWORD_MIN_LENGTH, roles } from './constants';

/** A message for a missing value apart from one for a value of the wrong type. */
export function requiredText(label: string) {
  return { error: (issue: { input?: unknown }) => (issue.input === undefined ? `${label} is required` : `${label} must be text`) };
}

export { PASSWORD_MIN_LENGTH, roles };
export const roleSchema = z.enum(roles, { error: 'Role must be one of admin, designer, reviewer' }).describe('admin manages accounts; designer builds designs; reviewer reviews shared versions');
export type Role = z.infer<typeof roleSchema>;


export const emailSchema = z
  .string(requiredText('E-mail'))
  .trim()
  .min(1, 'E-mail is required')
  .max(254, 'E-mail must be at most 254 characters')
  .email('E-mail must be an address like name@example.com')
  .transform((value) => value.toLowerCase());

export const displayNameSchema = z
  .string(requiredText('Display name'))
  .trim()
  .min(1, 'Display name is required')
  .max(100, 'Display name must be at most 100 characters');

export const passwordSchema = z
  .string(requiredText('Password'))
  .min(PASSWORD_MIN_LENGTH, `Password must be at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(200, 'Password must be at most 200 characters');

/** A user as the API shows it (never the password hash). */
export const userSchema = z
  .object({
    id: z.string().uuid(),
    email: z.string(),
    displayName: z.string(),
    role: roleSchema,
    disabled: z.boolean(),
    createdAt: z.string().describe('ISO 8601 time'),
    updatedAt: z.string().describe('ISO 8601 time'),
  })
  .meta({ id: 'User' });
export type User = z.infer<typeof userSchema>;

export const createUserSchema = z
  .object({
    email: emailSchema,
    displayName: displayNameSchema,
    role: roleSchema,
    password: passwordSchema,
  })
  .strict()
  .meta({ id: 'CreateUser' });
export type CreateUser = z.input<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    displayName: displayNameSchema.optional(),
    role: roleSchema.optional(),
    disabled: z.boolean({ error: 'Disabled must be true or false' }).optional(),
  })
  .strict()
  .refine((value) => Object.keys(value).length > 0, { message: 'Give at least one of displayName, role, disabled' })
  .meta({ id: 'UpdateUser' });
export type UpdateUser = z.input<typeof updateUserSchema>;

export const userSortKeys = ['email', 'displayName', 'role', 'disabled', 'createdAt'] as const;

export const listUsersQuerySchema = z.object({
  page: z.coerce.number({ error: 'Page must be a number' }).int('Page must be a whole number').min(0, 'Page must be 0 or more').default(0),
  pageSize: z.coerce
    .number({ error: 'Page size must be a number' })
    .int('Page size must be a whole number')
    .min(1, 'Page size must be at least 1')
    .max(200, 'Page size must be at most 200')
    .default(20),
  sort: z.enum(userSortKeys, { error: `Sort must be one of ${userSortKeys.join(', ')}` }).default('email'),
  order: z.enum(['asc', 'desc'], { error: 'Order must be asc or desc' }).default('asc'),
  q: z.string().max(200, 'Search must be at most 200 characters').optional(),
});
export type ListUsersQuery = z.input<typeof listUsersQuerySchema>;

export const userListSchema = z
  .object({
    items: z.array(userSchema),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
  })
  .meta({ id: 'UserList' });
export type UserList = z.infer<typeof userListSchema>;
