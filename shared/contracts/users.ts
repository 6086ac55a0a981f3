import { z } from 'zod';
import { contract, json, noContent } from './contract';
import { idParams } from '../schemas/params';
import { roleField } from '../schemas/common';
import { inviteUserSchema, updateUserSchema } from '../schemas/auth';

const ADMINS = ['admin'] as const;

/** A person of the organisation as the admin's list shows them. */
export const personSchema = z.strictObject({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleField,
  unitSystem: z.enum(['metric', 'imperial']),
  disabled: z.boolean(),
  /** Invited, no password chosen yet. */
  invited: z.boolean(),
});
export type Person = z.infer<typeof personSchema>;

export const usersContracts = {
  list: contract({ method: 'GET', path: '/users', access: ADMINS, answer: json(z.array(personSchema)) }),
  invite: contract({ method: 'POST', path: '/users', access: ADMINS, body: inviteUserSchema, answer: json(personSchema, 201) }),
  update: contract({
    method: 'PATCH',
    path: '/users/:id',
    access: ADMINS,
    params: idParams,
    body: updateUserSchema,
    answer: json(personSchema),
  }),
  endSessions: contract({ method: 'POST', path: '/users/:id/end-sessions', access: ADMINS, params: idParams, answer: noContent }),
};
