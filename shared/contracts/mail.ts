import { z } from 'zod';
import { contract, json } from './contract';

/** A message the local fake SMTP server received (demo, development, tests). */
export const mailSummarySchema = z.strictObject({
  id: z.number().int(),
  fromAddress: z.string(),
  toAddresses: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
});
export type MailSummary = z.infer<typeof mailSummarySchema>;

export const mailContracts = {
  list: contract({ method: 'GET', path: '/mail', access: ['admin'], answer: json(z.array(mailSummarySchema)) }),
  get: contract({
    method: 'GET',
    path: '/mail/:id',
    access: ['admin'],
    answer: json(z.strictObject({ ...mailSummarySchema.shape, text: z.string() })),
  }),
};
