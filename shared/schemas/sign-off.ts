import { z } from 'zod';
import { idField } from './common';

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

// Crockford base32 (no I, L, O, U): SW-<year>-XXXX-XXXX-<V|S>.
export const CERTIFICATE_NUMBER_PATTERN = /^SW-\d{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[VS]$/;

/** What people type or a QR reader hands over, made canonical: case, spaces, look-alike letters. */
export function normaliseCertificateNumber(input: string): string {
  const upper = input.trim().toUpperCase().replace(/\s+/g, '');
  const m = /^SW-(\d{4})-([0-9A-Z]{4})-([0-9A-Z]{4})-([VS])$/.exec(upper);
  if (!m) return upper;
  const fix = (s: string) => s.replace(/O/g, '0').replace(/[IL]/g, '1');
  return `SW-${m[1]}-${fix(m[2])}-${fix(m[3])}-${m[4]}`;
}

export const certificateNumberField = z
  .string()
  .max(40)
  .transform(normaliseCertificateNumber)
  .pipe(z.string().regex(CERTIFICATE_NUMBER_PATTERN, 'That is not a certificate number (SW-2026-XXXX-XXXX-V).'));

export const certificateNumberParams = z.object({ number: certificateNumberField });
