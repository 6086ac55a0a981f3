import { z } from 'zod';

// Reusable field schemas that normalise what people type.
export const emailField = z
  .string({ error: 'An e-mail address is required.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'That is not an e-mail address.' }));

export const nameField = z
  .string({ error: 'A name is required.' })
  .trim()
  .min(1, 'A name is required.')
  .max(120, 'Keep the name under 120 characters.');

export const idField = z.uuid({ error: 'That is not a valid id.' });

export const ROLES = ['admin', 'organiser', 'director', 'technician'] as const;
export const roleField = z.enum(ROLES, { error: 'The role must be admin, organiser, director or technician.' });
export type Role = z.infer<typeof roleField>;

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  organiser: 'Organiser',
  director: 'Technical director',
  technician: 'Technician',
};
