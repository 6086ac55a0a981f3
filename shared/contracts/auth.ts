import { z } from 'zod';
import { contract, json, noContent } from './contract';
import { preferencesSchema, publicUserSchema, requestResetSchema, setPasswordSchema, signInSchema } from '../schemas/auth';

const userAnswer = z.strictObject({ user: publicUserSchema });

export const authContracts = {
  /** Sets the session cookie. */
  signIn: contract({ method: 'POST', path: '/auth/sign-in', access: 'public', body: signInSchema, answer: json(userAnswer) }),
  me: contract({ method: 'GET', path: '/auth/me', access: 'signed-in', answer: json(userAnswer) }),
  signOut: contract({ method: 'POST', path: '/auth/sign-out', access: 'signed-in', answer: noContent }),
  preferences: contract({
    method: 'PUT',
    path: '/auth/preferences',
    access: 'signed-in',
    body: preferencesSchema,
    answer: json(userAnswer),
  }),
  /** The same answer whether the address has an account or not. */
  requestReset: contract({
    method: 'POST',
    path: '/auth/password-reset',
    access: 'public',
    body: requestResetSchema,
    answer: json(z.strictObject({ detail: z.string() }), 202),
  }),
  linkInfo: contract({
    method: 'GET',
    path: '/auth/set-password/:token',
    access: 'public',
    answer: json(z.strictObject({ email: z.string(), name: z.string(), purpose: z.enum(['invite', 'reset']) })),
  }),
  setPassword: contract({
    method: 'POST',
    path: '/auth/set-password/:token',
    access: 'public',
    body: setPasswordSchema,
    answer: json(userAnswer),
  }),
};
