import { z } from 'zod';
import { contract, json, STAFF } from './contract';
import { faultListItem, stripProgressShape, stripStatusCounts, venueStatus } from './common';
import { idParams } from '../schemas/params';

/** The status board: every strip of a venue at a glance, progress and the faults not closed. */
export const boardSchema = z.strictObject({
  venue: z.strictObject({ id: z.string(), name: z.string(), status: venueStatus, eventId: z.string(), eventName: z.string() }),
  counts: stripStatusCounts,
  progress: z.strictObject({ stepsDone: z.number().int(), stepsTotal: z.number().int(), percent: z.number().int() }),
  /** Out-of-service strips first (longest out first), then by the venue's order. */
  strips: z.array(
    z.strictObject({
      ...stripProgressShape,
      /** Since when the strip is out of service (null when it is not). */
      outOfServiceSince: z.string().nullable(),
      /** Whole minutes since its earliest open incident opened (or since it went out of service); null when in service. */
      minutesSinceIncident: z.number().int().nullable(),
      openIncidents: z.number().int(),
    }),
  ),
  openFaults: z.array(faultListItem),
  generatedAt: z.string(),
});
export type Board = z.infer<typeof boardSchema>;

export const boardContracts = {
  get: contract({ method: 'GET', path: '/venues/:id/board', access: STAFF, params: idParams, answer: json(boardSchema) }),
};
