// Competition days: incidents on a signed-off venue, the spare pool, swaps and amendments.
import { z } from 'zod';
import { idField } from './common';
import { assetTagField } from './equipment';

export const INCIDENT_STATUSES = ['open', 'resolved'] as const;
export type IncidentStatus = (typeof INCIDENT_STATUSES)[number];
export const INCIDENT_STATUS_LABELS: Record<IncidentStatus, string> = { open: 'Open', resolved: 'Back in service' };

/** Incidents per item before the register flags it for inspection (common practice: a second one). */
export const REPEATED_INCIDENTS = 2;

export const createIncidentSchema = z
  .object({
    stripId: idField,
    positionId: idField.nullable().optional(),
    symptom: z
      .string({ error: 'Say what went wrong, e.g. "touches not registering on the left".' })
      .trim()
      .min(3, 'Say what went wrong, e.g. "touches not registering on the left".')
      .max(500, 'Keep the symptom under 500 characters.'),
    /** Made on the tablet when the incident is typed: sending it again answers the same incident. */
    clientId: z.uuid({ error: 'clientId must be a UUID made on the tablet.' }).optional(),
    /** When the technician tapped the symptom on the tablet; believed within the window readings use. */
    openedAt: z.iso
      .datetime({ offset: true, error: 'openedAt must be a date and time in ISO 8601, e.g. 2026-11-14T07:05:00Z' })
      .nullable()
      .optional(),
  })
  .strict();
export type CreateIncidentInput = z.infer<typeof createIncidentSchema>;

export const swapSchema = z
  .object({
    positionId: idField,
    replacementAssetTag: assetTagField,
  })
  .strict();
export type SwapInput = z.infer<typeof swapSchema>;

export const sparesSchema = z
  .object({
    assetTags: z
      .array(assetTagField)
      .max(200, 'Keep the spare pool under 200 items.')
      .refine((tags) => new Set(tags).size === tags.length, 'Each asset tag can be in the pool once.'),
  })
  .strict();
export type SparesInput = z.infer<typeof sparesSchema>;

export const amendmentSchema = z
  .object({
    password: z.string({ error: 'Enter your password to confirm.' }).min(1, 'Enter your password to confirm.').max(1024),
    incidentIds: z
      .array(idField)
      .min(1, 'Name at least one resolved incident to amend.')
      .max(200)
      .refine((ids) => new Set(ids).size === ids.length, 'Each incident can be named once.'),
  })
  .strict();
export type AmendmentInput = z.infer<typeof amendmentSchema>;
