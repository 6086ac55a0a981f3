import { z } from 'zod';
import { contract, file, json, KEEPERS, STAFF } from './contract';
import { equipmentKind } from './common';
import { idParams } from '../schemas/params';
import { assetTagField, equipmentQuerySchema } from '../schemas/equipment';

/** Where a scanned or typed asset tag leads: the item, and the strips it sits on that the asker may see. */
export const tagLookupSchema = z.strictObject({
  equipmentId: z.string(),
  assetTag: z.string(),
  kind: equipmentKind,
  placements: z.array(
    z.strictObject({
      stripId: z.string(),
      stripLabel: z.string(),
      position: z.string(),
      venueId: z.string(),
      venueName: z.string(),
      eventName: z.string(),
    }),
  ),
});
export type TagLookup = z.infer<typeof tagLookupSchema>;

/** Printing labels: the event's directors, the admins, and the technicians assigned to the venue. */
export const LABEL_PRINTERS = ['director', 'admin', 'technician'] as const;

export const labelsContracts = {
  /** A4 sheet of QR labels: every strip of the venue, each followed by the tagged items on it. */
  venueSheet: contract({
    method: 'GET',
    path: '/venues/:id/labels.pdf',
    access: LABEL_PRINTERS,
    params: idParams,
    answer: file('application/pdf'),
  }),
  /** The register's items as labels, filtered as the register's list is. */
  registerSheet: contract({
    method: 'GET',
    path: '/equipment/labels.pdf',
    access: KEEPERS,
    query: equipmentQuerySchema,
    answer: file('application/pdf'),
  }),
  /** A scanned or typed tag of our organisation; another organisation's tag is not found. */
  lookupTag: contract({
    method: 'GET',
    path: '/tags/:tag',
    access: STAFF,
    params: z.object({ tag: assetTagField }),
    answer: json(tagLookupSchema),
  }),
};
