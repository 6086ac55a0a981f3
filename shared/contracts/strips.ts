import { z } from 'zod';
import { contract, json, STAFF } from './contract';
import { equipmentKind, equipmentRef, faultListItem, limitRuleDto, stepCountsShape, stripStatus, testKind, venueStatus } from './common';
import { idParams } from '../schemas/params';
import { readingDtoSchema } from '../schemas/readings';

/** One strip as the testing screen needs it (and keeps on the tablet for offline work). */
export const stripDetailSchema = z.strictObject({
  id: z.string(),
  label: z.string(),
  status: stripStatus,
  zone: z.string().nullable(),
  conductivePiste: z.boolean(),
  /** The venue's spare pool (never on the board or a certificate): spares are tested here, no incident opened. */
  sparePool: z.boolean(),
  withdrawnReason: z.string().nullable(),
  venueId: z.string(),
  venueName: z.string(),
  venueStatus,
  /** What the browser judges a typed reading with before the server answers. */
  profile: z
    .strictObject({
      id: z.string(),
      name: z.string(),
      version: z.number().int(),
      rules: z.array(limitRuleDto),
      loopRequired: z.array(equipmentKind),
      temperatureReferenceC: z.number().nullable(),
    })
    .nullable(),
  counts: z.strictObject(stepCountsShape),
  venueProgress: z.strictObject({
    stepsDone: z.number().int(),
    stepsTotal: z.number().int(),
    stripsClear: z.number().int(),
    stripCount: z.number().int(),
  }),
  previousStripId: z.string().nullable(),
  nextStripId: z.string().nullable(),
  positions: z.array(
    z.strictObject({
      id: z.string(),
      name: z.string(),
      equipmentKind,
      equipment: equipmentRef.nullable(),
      steps: z.array(
        z.strictObject({
          id: z.string(),
          testKind,
          conductors: z.string(),
          required: z.boolean(),
          instruction: z.string(),
          latest: readingDtoSchema.nullable(),
        }),
      ),
    }),
  ),
  /** A repaired fault carries the time of its repair: readings taken since then are its retest. */
  openFaults: z.array(z.strictObject({ ...faultListItem.shape, repairedAt: z.string().nullable() })),
});
export type StripDetail = z.infer<typeof stripDetailSchema>;

export const stripsContracts = {
  get: contract({ method: 'GET', path: '/strips/:id', access: STAFF, params: idParams, answer: json(stripDetailSchema) }),
};
