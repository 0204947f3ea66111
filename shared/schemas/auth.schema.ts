import { z } from 'zod';

export const ROLES = ['admin', 'engineer', 'librarian', 'operator'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  librarian: 'Librarian',
  operator: 'Operator',
};

export const emailSchema = z
  .string()
  .trim()
  .min(3, 'Enter an e-mail address')
  .max(254, 'At most 254 characters')
  .email('Enter a valid e-mail address, like name@example.com')
  .transform((s) => s.toLowerCase());

/** Passwords: at least 10 characters (NIST SP 800-63B asks for 8 at minimum; we ask a little more). */
export const newPasswordSchema = z
  .string()
  .min(10, 'At least 10 characters')
  .max(200, 'At most 200 characters');

export const signInInputSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200, 'At most 200 characters'),
});
export type SignInInput = z.infer<typeof signInInputSchema>;

export const userSchema = z.object({
  id: z.string().uuid(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
  active: z.boolean(),
  lastSignInAt: z.string().nullable(),
  createdAt: z.string(),
  version: z.number().int(),
});
export type UserDto = z.infer<typeof userSchema>;

export const meSchema = z.object({ user: userSchema });
export type Me = z.infer<typeof meSchema>;

export const createUserInputSchema = z.object({
  email: emailSchema,
  name: z.string().trim().min(1, 'Enter a name').max(120, 'At most 120 characters'),
  roles: z.array(roleSchema).min(1, 'Choose at least one role'),
  password: newPasswordSchema,
});
export type CreateUserInput = z.infer<typeof createUserInputSchema>;

export const updateUserInputSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name').max(120, 'At most 120 characters').optional(),
  roles: z.array(roleSchema).min(1, 'Choose at least one role').optional(),
  active: z.boolean().optional(),
  /** The version the editor saw; a different current version answers 409. */
  version: z.number().int().min(1),
});
export type UpdateUserInput = z.infer<typeof updateUserInputSchema>;

export const resetPasswordInputSchema = z.object({ password: newPasswordSchema });
export type ResetPasswordInput = z.infer<typeof resetPasswordInputSchema>;

export const uuidParamSchema = z.object({ id: z.string().uuid('Not a valid id') });
