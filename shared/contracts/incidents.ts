// Competition days: incidents on a signed-off venue, the venue's spare pool, swaps, retests,
// amendments (new strip certificates, the venue certificate untouched) and the incident report.
import { z } from 'zod';
import { contract, file, json, STAFF, TESTERS } from './contract';
import { equipmentKind, equipmentStatus, eventRef, testKind, venueStatus } from './common';
import { idParams } from '../schemas/params';
import { amendmentSchema, createIncidentSchema, INCIDENT_STATUSES, sparesSchema, swapSchema } from '../schemas/incidents';

const itemRef = z.strictObject({ id: z.string(), assetTag: z.string(), kind: equipmentKind, description: z.string() });

/** A spare put into a position during an incident, and the item it took out. */
export const incidentSwapSchema = z.strictObject({
  id: z.string(),
  positionId: z.string(),
  positionName: z.string(),
  removed: itemRef.nullable(),
  replacement: itemRef,
  /** The spare's own checklist had passed at this venue: only the position's continuity steps are retested. */
  spareTested: z.boolean(),
  at: z.string(),
  by: z.string(),
  byName: z.string().nullable(),
});

export const incidentSchema = z.strictObject({
  id: z.string(),
  venueId: z.string(),
  stripId: z.string(),
  stripLabel: z.string(),
  positionId: z.string().nullable(),
  positionName: z.string().nullable(),
  /** The item in the position when the incident was opened. */
  equipment: itemRef.nullable(),
  symptom: z.string(),
  status: z.enum(INCIDENT_STATUSES),
  clientId: z.string().nullable(),
  openedAt: z.string(),
  openedBy: z.string(),
  openedByName: z.string().nullable(),
  resolvedAt: z.string().nullable(),
  resolvedBy: z.string().nullable(),
  /** From opening to resolving (or to now while open), whole minutes rounded up. */
  minutesOutOfService: z.number().int(),
  swaps: z.array(incidentSwapSchema),
  /** Set once the director amended the venue for it: the new strip certificate's number. */
  amendment: z.strictObject({ id: z.string(), number: z.string(), at: z.string() }).nullable(),
});
export type Incident = z.infer<typeof incidentSchema>;

/** One step the strip needs before the incident can be resolved, and whether it is done. */
export const retestStepSchema = z.strictObject({
  stepId: z.string(),
  positionId: z.string(),
  positionName: z.string(),
  assetTag: z.string().nullable(),
  testKind,
  conductors: z.string(),
  /**
   * after-incident: the incident's position (the whole strip when none was named) is measured again;
   * after-swap: a tested spare's connection, the position's continuity steps only;
   * standing: any other required step of the strip, whose latest reading must still pass.
   */
  why: z.enum(['after-incident', 'after-swap', 'standing']),
  done: z.boolean(),
  readingId: z.string().nullable(),
  verdict: z.enum(['pass', 'near-limit', 'fail']).nullable(),
  takenAt: z.string().nullable(),
  /** Empty when done; otherwise a sentence saying what is missing. */
  message: z.string(),
});

export const incidentDetailSchema = z.strictObject({
  incident: incidentSchema,
  retest: z.strictObject({
    complete: z.boolean(),
    steps: z.array(retestStepSchema),
    /** The not-done steps (the same list a refused resolve carries as `missing`). */
    missing: z.array(retestStepSchema),
    openFaults: z.number().int(),
  }),
  canResolve: z.boolean(),
});
export type IncidentDetail = z.infer<typeof incidentDetailSchema>;

export const venueIncidentsSchema = z.strictObject({
  venue: z.strictObject({ id: z.string(), name: z.string(), status: venueStatus }),
  event: eventRef,
  incidents: z.array(incidentSchema),
  /** Resolved incidents not yet covered by an amendment: what the director can amend now. */
  toAmend: z.array(z.string()),
  canAmend: z.boolean(),
});
export type VenueIncidents = z.infer<typeof venueIncidentsSchema>;

export const spareSchema = z.strictObject({
  equipment: z.strictObject({ ...itemRef.shape, status: equipmentStatus }),
  /** The pool's position holding the spare: its steps are its kind's checklist (tested like any position). */
  positionId: z.string(),
  stepsTotal: z.number().int(),
  stepsPassed: z.number().int(),
  /** Every step of its checklist passed at this venue. */
  tested: z.boolean(),
  /** Swapped into a strip during an incident (it is no longer available). */
  usedIn: z
    .strictObject({ incidentId: z.string(), stripId: z.string(), stripLabel: z.string(), positionName: z.string(), at: z.string() })
    .nullable(),
});

export const sparePoolSchema = z.strictObject({
  venueId: z.string(),
  /** The pool's own strip (never on the board or a certificate): open it on the testing screen to test spares. */
  stripId: z.string().nullable(),
  spares: z.array(spareSchema),
});
export type SparePool = z.infer<typeof sparePoolSchema>;

export const amendmentResultSchema = z.strictObject({
  amendmentId: z.string(),
  amendedAt: z.string(),
  certificates: z.array(
    z.strictObject({
      number: z.string(),
      kind: z.literal('strip'),
      stripId: z.string(),
      status: z.literal('valid'),
      /** The strip certificate this one supersedes. */
      supersedes: z.string().nullable(),
      pdfSha256: z.string(),
      verifyUrl: z.string(),
    }),
  ),
});
export type AmendmentResult = z.infer<typeof amendmentResultSchema>;

export const incidentsContracts = {
  /** The event's director or a technician assigned to the venue; 200 with the same incident when clientId was seen. */
  open: contract({
    method: 'POST',
    path: '/venues/:id/incidents',
    access: TESTERS,
    params: idParams,
    body: createIncidentSchema,
    answer: json(incidentSchema, 201, 200),
  }),
  ofVenue: contract({ method: 'GET', path: '/venues/:id/incidents', access: STAFF, params: idParams, answer: json(venueIncidentsSchema) }),
  get: contract({ method: 'GET', path: '/incidents/:id', access: STAFF, params: idParams, answer: json(incidentDetailSchema) }),
  /** 409 not-a-spare / spare-used / wrong-kind; the removed item goes to the register as to-inspect. */
  swap: contract({
    method: 'POST',
    path: '/incidents/:id/swap',
    access: TESTERS,
    params: idParams,
    body: swapSchema,
    answer: json(incidentDetailSchema),
  }),
  /** 409 retest-incomplete with `missing` (the retest steps not done) when the strip is not ready. */
  resolve: contract({
    method: 'POST',
    path: '/incidents/:id/resolve',
    access: TESTERS,
    params: idParams,
    answer: json(incidentDetailSchema),
  }),
  spares: contract({ method: 'GET', path: '/venues/:id/spares', access: STAFF, params: idParams, answer: json(sparePoolSchema) }),
  /** The event's director sets the pool: new tags get a position with their kind's checklist. */
  setSpares: contract({
    method: 'PUT',
    path: '/venues/:id/spares',
    access: ['director'],
    params: idParams,
    body: sparesSchema,
    answer: json(sparePoolSchema),
  }),
  /** The event's director; password checked and throttled like sign-off; 409 not-resolved / not-signed-off. */
  amend: contract({
    method: 'POST',
    path: '/venues/:id/amendments',
    access: ['director'],
    params: idParams,
    body: amendmentSchema,
    answer: json(amendmentResultSchema, 201),
  }),
  /** The incident report of the venue (also in the certificates ZIP). */
  reportPdf: contract({
    method: 'GET',
    path: '/venues/:id/incident-report.pdf',
    access: STAFF,
    params: idParams,
    answer: file('application/pdf'),
  }),
};
