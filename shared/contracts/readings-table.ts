import { z } from 'zod';
import { contract, file, json, STAFF } from './contract';
import { equipmentKind, testKind } from './common';
import { idParams } from '../schemas/params';
import { VERDICTS } from '../schemas/readings';
import { readingsFilterSchema } from '../schemas/readings-table';

/** Every reading of a venue, flat: corrections and the readings they superseded. */
export const readingRowSchema = z.strictObject({
  id: z.string(),
  stripId: z.string(),
  stripLabel: z.string(),
  stripSort: z.number().int(),
  positionId: z.string(),
  positionName: z.string(),
  positionSort: z.number().int(),
  equipmentKind,
  assetTag: z.string().nullable(),
  stepId: z.string(),
  testKind,
  conductors: z.string(),
  stepSort: z.number().int(),
  stepRemovedAt: z.string().nullable(),
  valueText: z.string(),
  valueOhm: z.number().nullable(),
  overRange: z.boolean(),
  leadOffsetOhm: z.number().nullable(),
  leadNullId: z.string().nullable(),
  leadNullMeter: z.string().nullable(),
  verdict: z.enum(VERDICTS),
  limitOhm: z.number().nullable(),
  limitKind: z.enum(['max', 'min']).nullable(),
  source: z.string(),
  ruleId: z.string().nullable(),
  explanation: z.string(),
  profileId: z.string(),
  profileName: z.string().nullable(),
  profileVersion: z.number().int(),
  takenBy: z.string(),
  takenByName: z.string().nullable(),
  takenAt: z.string(),
  /** When the server got it; later than takenAt for a reading typed offline. */
  receivedAt: z.string().nullable(),
  supersedesId: z.string().nullable(),
  supersededBy: z.string().nullable(),
  superseded: z.boolean(),
  correctionReason: z.string().nullable(),
});
export type ReadingRow = z.infer<typeof readingRowSchema>;

export const readingsTableContracts = {
  /** Filtered by verdict, strip, who, test and time (query); the CSV takes the same filters. */
  list: contract({
    method: 'GET',
    path: '/venues/:id/readings',
    access: STAFF,
    params: idParams,
    query: readingsFilterSchema,
    answer: json(z.array(readingRowSchema)),
  }),
  csv: contract({
    method: 'GET',
    path: '/venues/:id/readings.csv',
    access: STAFF,
    params: idParams,
    query: readingsFilterSchema,
    answer: file('text/csv'),
  }),
};
