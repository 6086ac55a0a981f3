import { z } from 'zod';
import { contract, json } from './contract';
import { idParams } from '../schemas/params';
import { auditQuerySchema } from '../schemas/audit';

/** Who changed what and when. */
export const auditEntrySchema = z.strictObject({
  id: z.number().int(),
  at: z.string(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string(),
  actorId: z.string().nullable(),
  actorName: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditContracts = {
  list: contract({
    method: 'GET',
    path: '/audit',
    access: ['admin', 'director'],
    query: auditQuerySchema,
    answer: json(z.array(auditEntrySchema)),
  }),
  ofVenue: contract({
    method: 'GET',
    path: '/venues/:id/audit',
    access: ['admin', 'director', 'organiser'],
    params: idParams,
    answer: json(z.array(auditEntrySchema)),
  }),
};
