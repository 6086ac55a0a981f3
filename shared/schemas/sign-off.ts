import { z } from 'zod';
import { idField } from './common';
import { CERTIFICATE_NUMBER_EXAMPLE, CERTIFICATE_NUMBER_PATTERN, normaliseCertificateNumber } from '../domain/certificate-number';

export const signOffExceptionSchema = z.object({
  stripId: idField,
  reason: z
    .string({ error: 'Say why the strip is left out.' })
    .trim()
    .min(3, 'Say why the strip is left out.')
    .max(300, 'Keep the reason under 300 characters.'),
});

export const signOffSchema = z
  .object({
    password: z.string({ error: 'Enter your password to confirm.' }).min(1, 'Enter your password to confirm.').max(1024),
    statement: z.string().trim().max(2000, 'Keep the statement under 2000 characters.').optional(),
    exceptions: z
      .array(signOffExceptionSchema)
      .max(500)
      .optional()
      .refine((list) => !list || new Set(list.map((e) => e.stripId)).size === list.length, 'Each strip can be left out once.'),
  })
  .strict();
export type SignOffInput = z.infer<typeof signOffSchema>;

export const revokeCertificateSchema = z
  .object({
    reason: z
      .string({ error: 'Say why the certificate is revoked.' })
      .trim()
      .min(3, 'Say why the certificate is revoked.')
      .max(500, 'Keep the reason under 500 characters.'),
  })
  .strict();
export type RevokeCertificateInput = z.infer<typeof revokeCertificateSchema>;

export const certificateNumberField = z
  .string()
  .max(40)
  .transform(normaliseCertificateNumber)
  .pipe(z.string().regex(CERTIFICATE_NUMBER_PATTERN, `That is not a certificate number (${CERTIFICATE_NUMBER_EXAMPLE}).`));

export const certificateNumberParams = z.object({ number: certificateNumberField });
