import { z } from 'zod';
import { contract, json, STAFF } from './contract';
import { stripProgressShape, stripStatusCounts, venueStatus } from './common';
import { idParams } from '../schemas/params';

/** A venue the caller may see, with where its strips stand. */
export const venueSummarySchema = z.strictObject({
  id: z.string(),
  name: z.string(),
  /** IANA name: the venue's times are shown in it. */
  timeZone: z.string(),
  eventId: z.string(),
  eventName: z.string(),
  startsOn: z.string(),
  endsOn: z.string(),
  status: venueStatus,
  stripCount: z.number().int(),
  byStatus: stripStatusCounts,
  stepsTotal: z.number().int(),
  stepsDone: z.number().int(),
});
export type VenueSummary = z.infer<typeof venueSummarySchema>;

export const venuesContracts = {
  list: contract({ method: 'GET', path: '/venues', access: STAFF, answer: json(z.array(venueSummarySchema)) }),
  strips: contract({
    method: 'GET',
    path: '/venues/:id/strips',
    access: STAFF,
    params: idParams,
    answer: json(z.array(z.strictObject({ ...stripProgressShape, conductivePiste: z.boolean() }))),
  }),
};
