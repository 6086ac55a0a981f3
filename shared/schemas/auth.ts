import { z } from 'zod';
import { emailField, nameField, roleField } from './common';

export const signInSchema = z.strictObject({
  email: emailField,
  password: z.string({ error: 'A password is required.' }).min(1, 'A password is required.').max(1024),
});
export type SignInInput = z.infer<typeof signInSchema>;

// OWASP ASVS 6.2.1 (at least 8 characters) and 6.2.9 (allow at least 64).
export const newPasswordField = z
  .string({ error: 'A password is required.' })
  .min(8, 'Use at least 8 characters.')
  .max(128, 'Use at most 128 characters.');

export const setPasswordSchema = z.strictObject({ password: newPasswordField });
export type SetPasswordInput = z.infer<typeof setPasswordSchema>;

export const requestResetSchema = z.strictObject({ email: emailField });

export const inviteUserSchema = z.strictObject({ email: emailField, name: nameField, role: roleField });
export type InviteUserInput = z.infer<typeof inviteUserSchema>;

export const updateUserSchema = z
  .strictObject({
    role: roleField.optional(),
    disabled: z.boolean({ error: 'disabled must be true or false.' }).optional(),
    name: nameField.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change: give role, disabled or name.' });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const preferencesSchema = z.strictObject({
  unitSystem: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }),
});

export const publicUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleField,
  unitSystem: z.enum(['metric', 'imperial']),
});
export type PublicUser = z.infer<typeof publicUserSchema>;
