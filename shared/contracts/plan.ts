import { z } from 'zod';
import { contract, json, STAFF } from './contract';
import { equipmentKind, equipmentStatus, person, testKind, venueStatus } from './common';
import { idParams } from '../schemas/params';
import { roleField } from '../schemas/common';
import {
  addPositionSchema,
  addStepSchema,
  assetTagsSchema,
  attachEquipmentSchema,
  bulkStripsSchema,
  createEventSchema,
  createVenueSchema,
  updateStripSchema,
  updateVenueSchema,
  venueTechniciansSchema,
  withdrawStripSchema,
} from '../schemas/plan';

const PLANNERS = ['director'] as const;

export const planStepSchema = z.strictObject({
  id: z.string(),
  testKind,
  conductors: z.string(),
  sortOrder: z.number().int(),
  required: z.boolean(),
  addedByDirector: z.boolean(),
  removedAt: z.string().nullable(),
});

export const planPositionSchema = z.strictObject({
  id: z.string(),
  name: z.string(),
  equipmentKind,
  sortOrder: z.number().int(),
  /** A reading or a fault was recorded against it: it stays in the plan (its steps can be dropped). */
  tested: z.boolean(),
  equipment: z
    .strictObject({
      id: z.string(),
      assetTag: z.string(),
      kind: equipmentKind,
      lengthM: z.number().nullable(),
      status: equipmentStatus,
      description: z.string(),
    })
    .nullable(),
  steps: z.array(planStepSchema),
});

export const planStripSchema = z.strictObject({
  id: z.string(),
  label: z.string(),
  zone: z.string().nullable(),
  sortOrder: z.number().int(),
  conductivePiste: z.boolean(),
  withdrawnReason: z.string().nullable(),
  withdrawnAt: z.string().nullable(),
  positions: z.array(planPositionSchema),
});

/** A venue's plan. Sent with ETag = the venue's version; every plan edit sends it back in If-Match. */
export const venuePlanSchema = z.strictObject({
  venue: z.strictObject({
    id: z.string(),
    name: z.string(),
    status: venueStatus,
    version: z.number().int(),
    profileId: z.string(),
    clonedFromId: z.string().nullable(),
    eventId: z.string(),
    /** IANA name: the venue's times are shown in it. */
    timeZone: z.string(),
  }),
  event: z.strictObject({ id: z.string(), name: z.string(), startsOn: z.string(), endsOn: z.string(), directorId: z.string().nullable() }),
  profile: z.strictObject({
    id: z.string(),
    lineageId: z.string(),
    name: z.string(),
    version: z.number().int(),
    latestId: z.string(),
    latestVersion: z.number().int(),
    loopRequired: z.array(equipmentKind),
  }),
  technicians: z.array(person),
  strips: z.array(planStripSchema),
});
export type VenuePlan = z.infer<typeof venuePlanSchema>;

const eventRow = {
  id: z.string(),
  orgId: z.string(),
  name: z.string(),
  startsOn: z.string(),
  endsOn: z.string(),
  directorId: z.string().nullable(),
  organiserId: z.string().nullable(),
  createdAt: z.string(),
};

export const eventSummarySchema = z.strictObject({
  ...eventRow,
  venues: z.array(z.strictObject({ id: z.string(), name: z.string(), status: venueStatus })),
});
export type EventSummary = z.infer<typeof eventSummarySchema>;

export const eventDetailSchema = z.strictObject({
  ...eventRow,
  directorName: z.string().nullable(),
  organiserName: z.string().nullable(),
  venues: z.array(
    z.strictObject({
      id: z.string(),
      name: z.string(),
      status: venueStatus,
      profileId: z.string(),
      clonedFromId: z.string().nullable(),
      stripCount: z.number().int(),
    }),
  ),
});
export type EventDetail = z.infer<typeof eventDetailSchema>;

const planningPerson = z.strictObject({ id: z.string(), name: z.string(), email: z.string(), role: roleField });
export const planningPeopleSchema = z.strictObject({ technicians: z.array(planningPerson), organisers: z.array(planningPerson) });
export type PlanningPeople = z.infer<typeof planningPeopleSchema>;

const plan = json(venuePlanSchema);
const planCreated = json(venuePlanSchema, 201);

/** Plan edits need If-Match with the venue's version (412 when it moved on meanwhile, 428 without). */
export const planContracts = {
  people: contract({ method: 'GET', path: '/planning/people', access: PLANNERS, answer: json(planningPeopleSchema) }),
  listEvents: contract({ method: 'GET', path: '/events', access: STAFF, answer: json(z.array(eventSummarySchema)) }),
  createEvent: contract({
    method: 'POST',
    path: '/events',
    access: PLANNERS,
    body: createEventSchema,
    answer: json(eventDetailSchema, 201),
  }),
  getEvent: contract({ method: 'GET', path: '/events/:id', access: STAFF, params: idParams, answer: json(eventDetailSchema) }),
  createVenue: contract({
    method: 'POST',
    path: '/events/:id/venues',
    access: PLANNERS,
    params: idParams,
    body: createVenueSchema,
    answer: planCreated,
  }),

  getPlan: contract({ method: 'GET', path: '/venues/:id', access: STAFF, params: idParams, answer: plan }),
  updateVenue: contract({
    method: 'PATCH',
    path: '/venues/:id',
    access: PLANNERS,
    params: idParams,
    body: updateVenueSchema,
    answer: plan,
  }),
  addStrips: contract({
    method: 'POST',
    path: '/venues/:id/strips/bulk',
    access: PLANNERS,
    params: idParams,
    body: bulkStripsSchema,
    answer: planCreated,
  }),
  /** Asset tags for many positions of the venue in one transaction (a strip, a row). */
  setAssetTags: contract({
    method: 'PUT',
    path: '/venues/:id/equipment',
    access: PLANNERS,
    params: idParams,
    body: assetTagsSchema,
    answer: plan,
  }),
  setTechnicians: contract({
    method: 'PUT',
    path: '/venues/:id/technicians',
    access: PLANNERS,
    params: idParams,
    body: venueTechniciansSchema,
    answer: plan,
  }),

  updateStrip: contract({
    method: 'PATCH',
    path: '/strips/:id',
    access: PLANNERS,
    params: idParams,
    body: updateStripSchema,
    answer: plan,
  }),
  withdrawStrip: contract({
    method: 'POST',
    path: '/strips/:id/withdraw',
    access: PLANNERS,
    params: idParams,
    body: withdrawStripSchema,
    answer: plan,
  }),
  reinstateStrip: contract({ method: 'POST', path: '/strips/:id/reinstate', access: PLANNERS, params: idParams, answer: plan }),
  addPosition: contract({
    method: 'POST',
    path: '/strips/:id/positions',
    access: PLANNERS,
    params: idParams,
    body: addPositionSchema,
    answer: planCreated,
  }),

  removePosition: contract({ method: 'DELETE', path: '/positions/:id', access: PLANNERS, params: idParams, answer: plan }),
  attachEquipment: contract({
    method: 'PUT',
    path: '/positions/:id/equipment',
    access: PLANNERS,
    params: idParams,
    body: attachEquipmentSchema,
    answer: plan,
  }),
  addStep: contract({
    method: 'POST',
    path: '/positions/:id/steps',
    access: PLANNERS,
    params: idParams,
    body: addStepSchema,
    answer: planCreated,
  }),
  dropStep: contract({ method: 'DELETE', path: '/steps/:id', access: PLANNERS, params: idParams, answer: plan }),
};
