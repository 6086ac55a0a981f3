// Every route of the router, enumerated from createApp().routes, against seven callers. A route that
// is added without a row here fails the test, so every new route gets a decided answer per caller.
// Bodies are valid where a route needs one: the answer shows the access decision, not validation.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { addOtherOrg, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import { stripByLabel, venueIds } from '../api/testing-helpers';
import { syntheticTdrTrace } from '../setup/synthetic-trace';
import { DEFAULT_LIMIT_PROFILE } from '../../shared/domain/limits';
import * as s from '../../server/db/schema';
import type { RouteSpec } from '../../server/http/api-router';

/** The routes createApp() declares (Express's own typing of app.routes would hide their type). */
const routesOf = (app: TestApp): RouteSpec[] => (app.app as unknown as { routes: RouteSpec[] }).routes;

type Agent = ReturnType<typeof supertest.agent>;
const ACTORS = ['anonymous', 'techAssigned', 'techNotAssigned', 'director', 'otherOrgDirector', 'organiser', 'admin'] as const;
type Actor = (typeof ACTORS)[number];
/** One expected status per actor, in the order of ACTORS. */
type Expect = [number, number, number, number, number, number, number];

interface Ctx {
  hall: string;
  annex: string;
  eventId: string;
  stripId: string;
  stepId: string;
  positionId: string;
  spareStripId: string;
  spareStepId: string;
  sparePositionId: string;
  /** An untested position added to the spare strip in the setup, for DELETE /api/positions/:id. */
  removablePositionId: string;
  faultId: string;
  /** An open incident of the hall, opened by its director in the setup. */
  incidentId: string;
  /** An open fault of the hall opened by hand in the setup, for its director to dismiss. */
  dismissableFaultId: string;
  readingId: string;
  repairId: string;
  equipmentId: string;
  /** That item's asset tag, for GET /api/tags/:tag. */
  assetTag: string;
  profileId: string;
  profileCopyId: string;
  attachmentId: string;
  traceAttachmentId: string;
  userId: string;
  samId: string;
  mailId: string;
  certificate: string;
  /** Strip certificates kept for revocation, one per caller allowed to revoke. */
  revocable: string[];
  certificatePdf: Buffer;
  png: Buffer;
  /** A different picture per caller: the same file twice is recognised and answered 200. */
  pngs: Record<Actor, Buffer>;
  trace: string;
}

interface Row {
  route: string;
  path: (c: Ctx, a: Actor) => string;
  expect: Expect;
  /** For a batch answered 200: the status of the reading inside, per actor (the check per object). */
  results?: Expect;
  body?: (c: Ctx, a: Actor) => unknown;
  attach?: (c: Ctx, a: Actor) => { field: string; data: Buffer; filename: string; fields?: Record<string, string> };
  text?: (c: Ctx) => { type: string; data: string };
  headers?: (c: Ctx, a: Actor) => Promise<Record<string, string>>;
  /** The object lives in the Annex: there Lee is the assigned technician and Sam is not. */
  annex?: boolean;
  /** The request ends or replaces the caller's session: use a session (or a cookie jar) of its own. */
  fresh?: boolean;
}

const id = () => randomUUID();
// The shapes of answer, per actor: A anonymous, T assigned technician, U technician not assigned,
// D director of the event, X director of another organisation, O organiser, M admin.
const ALL_OK = (code: number): Expect => [code, code, code, code, code, code, code];
const SIGNED_IN = (code: number): Expect => [401, code, code, code, code, code, code];
const READ_VENUE = (code = 200): Expect => [401, code, 403, code, 404, code, code];
const TEST_VENUE = (code: number): Expect => [401, code, 403, code, 404, 403, 403];
const PLAN_VENUE = (code: number): Expect => [401, 403, 403, code, 404, 403, 403];
const ADMIN_ONLY = (code: number): Expect => [401, 403, 403, 403, 403, 403, code];

const venueTag = (t: TestApp, director: () => Agent) => async (c: Ctx) => ({
  'If-Match': (await director().get(`/api/venues/${c.hall}`)).headers.etag as string,
});

let t: TestApp;
let ctx: Ctx;
const agents = {} as Record<Actor, Agent>;
const emailOf: Record<Exclude<Actor, 'anonymous'>, [string, string]> = {
  techAssigned: [DEMO.technician, DEMO_PASSWORD],
  techNotAssigned: [DEMO.annexTechnician, DEMO_PASSWORD],
  director: [DEMO.director, DEMO_PASSWORD],
  otherOrgDirector: [OTHER_DIRECTOR, OTHER_PASSWORD],
  organiser: [DEMO.organiser, DEMO_PASSWORD],
  admin: [DEMO.admin, DEMO_PASSWORD],
};
const anonymous = () => supertest.agent(t.app).set('Origin', ORIGIN);

function rows(): Row[] {
  const director = () => agents.director;
  const planTag = venueTag(t, director);
  const faultTag = async (c: Ctx) => ({ 'If-Match': (await director().get(`/api/faults/${c.faultId}`)).headers.etag as string });
  const rules = DEFAULT_LIMIT_PROFILE.rules;
  const etagOf = (path: (c: Ctx, a: Actor) => string) => async (c: Ctx, a: Actor) => ({
    'If-Match': (await agents.admin.get(path(c, a))).headers.etag as string,
  });
  // Each profile edit makes a new version: the director and the admin edit different profiles.
  const profileFor = (c: Ctx, a: Actor) => `/api/profiles/${a === 'admin' ? c.profileCopyId : c.profileId}`;
  return [
    { route: 'GET /api/health', path: () => '/api/health', expect: ALL_OK(200) },
    {
      route: 'POST /api/auth/sign-in',
      path: () => '/api/auth/sign-in',
      fresh: true,
      body: () => ({ email: DEMO.technician, password: DEMO_PASSWORD }),
      expect: ALL_OK(200),
    },
    { route: 'GET /api/auth/me', path: () => '/api/auth/me', expect: SIGNED_IN(200) },
    { route: 'POST /api/auth/sign-out', path: () => '/api/auth/sign-out', fresh: true, expect: SIGNED_IN(204) },
    {
      route: 'PUT /api/auth/preferences',
      path: () => '/api/auth/preferences',
      body: () => ({ unitSystem: 'metric' }),
      expect: SIGNED_IN(200),
    },
    {
      route: 'POST /api/auth/password-reset',
      path: () => '/api/auth/password-reset',
      body: () => ({ email: 'nobody@lakeshore.example' }),
      expect: ALL_OK(202),
    },
    { route: 'GET /api/auth/set-password/:token', path: () => '/api/auth/set-password/not-a-real-link-token', expect: ALL_OK(404) },
    {
      route: 'POST /api/auth/set-password/:token',
      path: () => '/api/auth/set-password/not-a-real-link-token',
      body: () => ({ password: 'a long new password 2026' }),
      expect: ALL_OK(404),
    },
    { route: 'GET /api/users', path: () => '/api/users', expect: ADMIN_ONLY(200) },
    {
      route: 'POST /api/users',
      path: () => '/api/users',
      body: (_c, a) => ({ email: `new-${a}-${id().slice(0, 8)}@lakeshore.example`, name: 'New Person', role: 'technician' }),
      expect: ADMIN_ONLY(201),
    },
    {
      route: 'PATCH /api/users/:id',
      path: (c) => `/api/users/${c.userId}`,
      body: () => ({ name: 'Spare Person' }),
      expect: ADMIN_ONLY(200),
    },
    { route: 'POST /api/users/:id/end-sessions', path: (c) => `/api/users/${c.userId}/end-sessions`, expect: ADMIN_ONLY(204) },
    { route: 'GET /api/mail', path: () => '/api/mail', expect: ADMIN_ONLY(200) },
    { route: 'GET /api/mail/:id', path: (c) => `/api/mail/${c.mailId}`, expect: ADMIN_ONLY(200) },
    { route: 'GET /api/venues', path: () => '/api/venues', expect: SIGNED_IN(200) },
    { route: 'GET /api/venues/:id/strips', path: (c) => `/api/venues/${c.hall}/strips`, expect: READ_VENUE() },
    { route: 'GET /api/strips/:id', path: (c) => `/api/strips/${c.stripId}`, expect: READ_VENUE() },
    {
      route: 'POST /api/readings',
      path: () => '/api/readings',
      body: (c) => ({ id: id(), stepId: c.stepId, value: '0.5' }),
      expect: TEST_VENUE(201),
    },
    // The batch is let in for testers; each reading in it meets the same per-venue check as alone.
    {
      route: 'POST /api/readings/batch',
      path: () => '/api/readings/batch',
      body: (c) => ({ readings: [{ id: id(), stepId: c.stepId, value: '0.5' }] }),
      expect: [401, 200, 200, 200, 200, 403, 403],
      results: TEST_VENUE(201),
    },
    { route: 'GET /api/readings/:id', path: (c) => `/api/readings/${c.readingId}`, expect: READ_VENUE() },
    // A technician's or director's own test-lead null: no venue involved, any tester records one.
    {
      route: 'POST /api/lead-nulls',
      path: () => '/api/lead-nulls',
      body: () => ({ id: id(), value: '0.12' }),
      expect: [401, 201, 201, 201, 201, 403, 403],
    },
    { route: 'GET /api/venues/:id/faults', path: (c) => `/api/venues/${c.hall}/faults`, expect: READ_VENUE() },
    { route: 'GET /api/faults/:id', path: (c) => `/api/faults/${c.faultId}`, expect: READ_VENUE() },
    {
      route: 'POST /api/faults',
      path: () => '/api/faults',
      body: (c) => ({ positionId: c.positionId, kind: 'intermittent', conductors: 'B' }),
      expect: TEST_VENUE(201),
    },
    {
      route: 'PATCH /api/faults/:id',
      path: (c) => `/api/faults/${c.faultId}`,
      headers: faultTag,
      body: () => ({ notes: 'Checked again at the connector.' }),
      expect: TEST_VENUE(200),
    },
    {
      route: 'POST /api/faults/:id/estimates',
      path: (c) => `/api/faults/${c.faultId}/estimates`,
      body: () => ({ method: 'flex', distanceM: 3, uncertaintyM: 0.2, fromEnd: 'near' }),
      expect: TEST_VENUE(201),
    },
    {
      route: 'POST /api/faults/:id/dismiss',
      path: (c) => `/api/faults/${c.dismissableFaultId}/dismiss`,
      headers: async (c) => ({ 'If-Match': (await director().get(`/api/faults/${c.dismissableFaultId}`)).headers.etag as string }),
      body: () => ({ reason: 'Opened by mistake on the wrong cable; nothing was measured.' }),
      expect: [401, 403, 403, 200, 404, 403, 403],
    },
    {
      route: 'POST /api/faults/:id/repairs',
      path: (c) => `/api/faults/${c.faultId}/repairs`,
      body: () => ({ action: 'connector-remade', notes: 'Remade the plug.' }),
      expect: TEST_VENUE(201),
    },
    { route: 'GET /api/venues/:id/board', path: (c) => `/api/venues/${c.hall}/board`, expect: READ_VENUE() },
    { route: 'GET /api/equipment', path: () => '/api/equipment', expect: SIGNED_IN(200) },
    {
      route: 'POST /api/equipment',
      path: () => '/api/equipment',
      body: (_c, a) => ({ assetTag: `MX-${ACTORS.indexOf(a)}`, kind: 'floor-cable', lengthM: 12 }),
      expect: [401, 403, 403, 201, 201, 403, 201],
    },
    { route: 'GET /api/equipment/:id', path: (c) => `/api/equipment/${c.equipmentId}`, expect: [401, 200, 200, 200, 404, 200, 200] },
    {
      route: 'PATCH /api/equipment/:id',
      path: (c) => `/api/equipment/${c.equipmentId}`,
      headers: etagOf((c) => `/api/equipment/${c.equipmentId}`),
      body: () => ({ notes: 'Label renewed.' }),
      expect: [401, 403, 403, 200, 404, 403, 200],
    },
    {
      route: 'POST /api/equipment/:id/calibrations',
      path: (c) => `/api/equipment/${c.equipmentId}/calibrations`,
      body: () => ({ roundTripNs: 121, lengthM: 12 }),
      expect: [401, 403, 403, 201, 404, 403, 201],
    },
    { route: 'GET /api/planning/people', path: () => '/api/planning/people', expect: [401, 403, 403, 200, 200, 403, 403] },
    { route: 'GET /api/events', path: () => '/api/events', expect: SIGNED_IN(200) },
    {
      route: 'POST /api/events',
      path: () => '/api/events',
      body: () => ({ name: 'Spring Open 2027', startsOn: '2027-03-06', endsOn: '2027-03-07' }),
      expect: [401, 403, 403, 201, 201, 403, 403],
    },
    { route: 'GET /api/events/:id', path: (c) => `/api/events/${c.eventId}`, expect: [401, 200, 200, 200, 404, 200, 200] },
    {
      route: 'POST /api/events/:id/venues',
      path: (c) => `/api/events/${c.eventId}/venues`,
      body: (c, a) => ({ name: `Side Hall ${a}`, profileId: c.profileId }),
      expect: [401, 403, 403, 201, 404, 403, 403],
    },
    { route: 'GET /api/venues/:id', path: (c) => `/api/venues/${c.hall}`, expect: READ_VENUE() },
    {
      route: 'PATCH /api/venues/:id',
      path: (c) => `/api/venues/${c.hall}`,
      headers: planTag,
      body: () => ({ name: 'Riverside Sports Hall, main floor' }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'POST /api/venues/:id/strips/bulk',
      path: (c) => `/api/venues/${c.hall}/strips/bulk`,
      headers: planTag,
      body: (_c, a) => ({ labels: [`Extra ${a}`] }),
      expect: PLAN_VENUE(201),
    },
    {
      route: 'PUT /api/venues/:id/equipment',
      path: (c) => `/api/venues/${c.hall}/equipment`,
      headers: planTag,
      body: (c) => ({ positions: [{ positionId: c.sparePositionId, assetTag: null }] }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'PUT /api/venues/:id/technicians',
      path: (c) => `/api/venues/${c.hall}/technicians`,
      headers: planTag,
      body: (c) => ({ userIds: [c.samId] }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'PATCH /api/strips/:id',
      path: (c) => `/api/strips/${c.spareStripId}`,
      headers: planTag,
      body: () => ({ zone: 'Row C' }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'POST /api/strips/:id/withdraw',
      path: (c) => `/api/strips/${c.spareStripId}/withdraw`,
      headers: planTag,
      body: () => ({ reason: 'Leaking roof above it' }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'POST /api/strips/:id/reinstate',
      path: (c) => `/api/strips/${c.spareStripId}/reinstate`,
      headers: planTag,
      expect: PLAN_VENUE(200),
    },
    {
      route: 'POST /api/strips/:id/positions',
      path: (c) => `/api/strips/${c.spareStripId}/positions`,
      headers: planTag,
      body: (_c, a) => ({ name: `Spare reel ${a}`, equipmentKind: 'reel' }),
      expect: PLAN_VENUE(201),
    },
    {
      route: 'DELETE /api/positions/:id',
      path: (c) => `/api/positions/${c.removablePositionId}`,
      headers: planTag,
      expect: PLAN_VENUE(200),
    },
    {
      route: 'PUT /api/positions/:id/equipment',
      path: (c) => `/api/positions/${c.sparePositionId}/equipment`,
      headers: planTag,
      body: () => ({ assetTag: null }),
      expect: PLAN_VENUE(200),
    },
    {
      route: 'POST /api/positions/:id/steps',
      path: (c) => `/api/positions/${c.sparePositionId}/steps`,
      headers: planTag,
      body: () => ({ testKind: 'loop', conductors: 'A-C' }),
      expect: PLAN_VENUE(201),
    },
    { route: 'DELETE /api/steps/:id', path: (c) => `/api/steps/${c.spareStepId}`, headers: planTag, expect: PLAN_VENUE(200) },
    { route: 'GET /api/profiles', path: () => '/api/profiles', expect: SIGNED_IN(200) },
    { route: 'GET /api/profiles/:id', path: (c) => `/api/profiles/${c.profileId}`, expect: [401, 200, 200, 200, 404, 200, 200] },
    {
      route: 'POST /api/profiles/:id/copy',
      path: (c) => `/api/profiles/${c.profileId}/copy`,
      body: (_c, a) => ({ name: `House rules ${a}` }),
      expect: [401, 403, 403, 201, 404, 403, 201],
    },
    {
      route: 'PUT /api/profiles/:id',
      path: profileFor,
      headers: etagOf(profileFor),
      body: () => ({ rules }),
      expect: [401, 403, 403, 201, 404, 403, 201],
    },
    { route: 'GET /api/venues/:id/readings', path: (c) => `/api/venues/${c.hall}/readings`, expect: READ_VENUE() },
    { route: 'GET /api/venues/:id/readings.csv', path: (c) => `/api/venues/${c.hall}/readings.csv`, expect: READ_VENUE() },
    { route: 'GET /api/audit', path: () => '/api/audit', expect: [401, 403, 403, 200, 200, 403, 200] },
    { route: 'GET /api/venues/:id/audit', path: (c) => `/api/venues/${c.hall}/audit`, expect: [401, 403, 403, 200, 404, 200, 200] },
    { route: 'GET /api/faults/:id/attachments', path: (c) => `/api/faults/${c.faultId}/attachments`, expect: READ_VENUE() },
    {
      route: 'POST /api/faults/:id/attachments',
      path: (c) => `/api/faults/${c.faultId}/attachments`,
      attach: (c, a) => ({ field: 'file', data: c.pngs[a], filename: 'connector.png' }),
      expect: TEST_VENUE(201),
    },
    { route: 'GET /api/repairs/:id/attachments', path: (c) => `/api/repairs/${c.repairId}/attachments`, expect: READ_VENUE() },
    {
      route: 'POST /api/repairs/:id/attachments',
      path: (c) => `/api/repairs/${c.repairId}/attachments`,
      attach: (c, a) => ({ field: 'file', data: c.pngs[a], filename: 'after.png' }),
      expect: TEST_VENUE(201),
    },
    {
      route: 'GET /api/equipment/:id/attachments',
      path: (c) => `/api/equipment/${c.equipmentId}/attachments`,
      expect: [401, 200, 200, 200, 404, 200, 200],
    },
    {
      route: 'POST /api/equipment/:id/attachments',
      path: (c) => `/api/equipment/${c.equipmentId}/attachments`,
      attach: (c, a) => ({ field: 'file', data: c.pngs[a], filename: 'label.png' }),
      expect: [401, 403, 403, 201, 404, 403, 201],
    },
    { route: 'GET /api/attachments/:id', path: (c) => `/api/attachments/${c.attachmentId}`, expect: READ_VENUE() },
    { route: 'GET /api/attachments/:id/preview', path: (c) => `/api/attachments/${c.attachmentId}/preview`, expect: READ_VENUE() },
    { route: 'GET /api/attachments/:id/analysis', path: (c) => `/api/attachments/${c.traceAttachmentId}/analysis`, expect: READ_VENUE() },
    {
      route: 'POST /api/equipment/import/preview',
      path: () => '/api/equipment/import/preview',
      attach: () => ({ field: 'file', data: Buffer.from('Asset tag,Kind,Length (m)\nIMP-001,Floor cable,12\n'), filename: 'register.csv' }),
      expect: [401, 403, 403, 200, 200, 403, 200],
    },
    {
      route: 'POST /api/equipment/import',
      path: () => '/api/equipment/import',
      attach: (_c, a) => ({
        field: 'file',
        data: Buffer.from(`Asset tag,Kind,Length (m)\nIMP-${ACTORS.indexOf(a)},Floor cable,12\n`),
        filename: 'register.csv',
        fields: { mapping: JSON.stringify({ assetTag: 0, kind: 1, length: 2 }) },
      }),
      expect: [401, 403, 403, 200, 200, 403, 200],
    },
    { route: 'GET /api/equipment.csv', path: () => '/api/equipment.csv', expect: SIGNED_IN(200) },
    // Labels: who may see the venue, but not the organiser; the register's sheet for its keepers
    // (another organisation's director prints their own register); a tag of another organisation is not found.
    {
      route: 'GET /api/venues/:id/labels.pdf',
      path: (c) => `/api/venues/${c.hall}/labels.pdf`,
      expect: [401, 200, 403, 200, 404, 403, 200],
    },
    {
      route: 'GET /api/equipment/labels.pdf',
      path: (c, a) => `/api/equipment/labels.pdf?q=${a === 'otherOrgDirector' ? 'HB-001' : c.assetTag}`,
      expect: [401, 403, 403, 200, 200, 403, 200],
    },
    {
      route: 'GET /api/tags/:tag',
      path: (c) => `/api/tags/${encodeURIComponent(c.assetTag)}`,
      expect: [401, 200, 200, 200, 404, 200, 200],
    },
    {
      route: 'POST /api/fault-location',
      path: () => '/api/fault-location',
      body: () => ({ method: 'tdr', roundTripNs: 100, velocityFactor: 0.66 }),
      expect: SIGNED_IN(200),
    },
    {
      route: 'POST /api/waveforms/analyse',
      path: () => '/api/waveforms/analyse',
      text: (c) => ({ type: 'text/csv', data: c.trace }),
      expect: SIGNED_IN(200),
    },
    { route: 'GET /api/venues/:id/readiness', path: (c) => `/api/venues/${c.hall}/readiness`, expect: READ_VENUE() },
    // The Annex was signed off in the setup: a second sign-off is 409, which shows access was granted.
    {
      route: 'POST /api/venues/:id/sign-off',
      path: (c) => `/api/venues/${c.annex}/sign-off`,
      annex: true,
      body: () => ({ password: DEMO_PASSWORD }),
      expect: [401, 403, 403, 409, 404, 403, 403],
    },
    { route: 'GET /api/venues/:id/certificates', path: (c) => `/api/venues/${c.annex}/certificates`, annex: true, expect: READ_VENUE() },
    {
      route: 'POST /api/venues/:id/incidents',
      path: (c) => `/api/venues/${c.hall}/incidents`,
      body: (c) => ({ stripId: c.stripId, symptom: 'No lights on the box' }),
      expect: TEST_VENUE(201),
    },
    { route: 'GET /api/venues/:id/incidents', path: (c) => `/api/venues/${c.hall}/incidents`, expect: READ_VENUE() },
    { route: 'GET /api/incidents/:id', path: (c) => `/api/incidents/${c.incidentId}`, expect: READ_VENUE() },
    // Allowed callers reach the check of the spare (none by that tag: 422) and of the retest (409).
    {
      route: 'POST /api/incidents/:id/swap',
      path: (c) => `/api/incidents/${c.incidentId}/swap`,
      body: (c) => ({ positionId: c.positionId, replacementAssetTag: 'NO-SUCH-SPARE' }),
      expect: TEST_VENUE(422),
    },
    { route: 'POST /api/incidents/:id/resolve', path: (c) => `/api/incidents/${c.incidentId}/resolve`, expect: TEST_VENUE(409) },
    { route: 'GET /api/venues/:id/spares', path: (c) => `/api/venues/${c.hall}/spares`, expect: READ_VENUE() },
    {
      route: 'PUT /api/venues/:id/spares',
      path: (c) => `/api/venues/${c.hall}/spares`,
      body: () => ({ assetTags: [] }),
      expect: PLAN_VENUE(200),
    },
    // The event's director gets past the password to the incidents named (none of this venue: 422).
    {
      route: 'POST /api/venues/:id/amendments',
      path: (c) => `/api/venues/${c.annex}/amendments`,
      annex: true,
      body: () => ({ password: DEMO_PASSWORD, incidentIds: [id()] }),
      expect: [401, 403, 403, 422, 404, 403, 403],
    },
    { route: 'GET /api/venues/:id/incident-report.pdf', path: (c) => `/api/venues/${c.hall}/incident-report.pdf`, expect: READ_VENUE() },
    {
      route: 'GET /api/venues/:id/certificates.zip',
      path: (c) => `/api/venues/${c.annex}/certificates.zip`,
      annex: true,
      expect: READ_VENUE(),
    },
    {
      route: 'GET /api/certificates/:number/pdf',
      path: (c) => `/api/certificates/${c.certificate}/pdf`,
      annex: true,
      expect: READ_VENUE(),
    },
    {
      route: 'POST /api/certificates/:number/revoke',
      path: (c, a) => `/api/certificates/${c.revocable[a === 'admin' ? 1 : 0]}/revoke`,
      annex: true,
      body: () => ({ reason: 'Issued against the wrong strip list.' }),
      expect: [401, 403, 403, 200, 404, 403, 200],
    },
    { route: 'GET /api/verify/:number', path: (c) => `/api/verify/${c.certificate}`, expect: ALL_OK(200) },
    { route: 'GET /.well-known/jwks.json', path: () => '/.well-known/jwks.json', expect: ALL_OK(200) },
    {
      route: 'POST /api/verify/file',
      path: () => '/api/verify/file',
      attach: (c) => ({ field: 'file', data: c.certificatePdf, filename: 'certificate.pdf' }),
      expect: ALL_OK(200),
    },
  ];
}

async function call(row: Row, actor: Actor): Promise<{ status: number; type: string; body: unknown }> {
  const swapped =
    row.annex && actor === 'techAssigned' ? 'techNotAssigned' : row.annex && actor === 'techNotAssigned' ? 'techAssigned' : actor;
  let agent: Agent = agents[swapped];
  if (row.fresh) {
    agent = anonymous();
    if (swapped !== 'anonymous') {
      const [email, password] = emailOf[swapped];
      await agent.post('/api/auth/sign-in').send({ email, password }).expect(200);
    }
  }
  const [method, template] = row.route.split(' ');
  let req = agent[method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete'](row.path(ctx, actor));
  if (row.headers) req = req.set(await row.headers(ctx, actor));
  if (row.attach) {
    const a = row.attach(ctx, actor);
    for (const [k, v] of Object.entries(a.fields ?? {})) req = req.field(k, v);
    req = req.attach(a.field, a.data, a.filename);
  } else if (row.text) {
    const x = row.text(ctx);
    req = req.set('Content-Type', x.type).send(x.data);
  } else if (row.body) req = req.send(row.body(ctx, actor) as object);
  void template;
  const res = await req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
  const type = String(res.headers['content-type'] ?? '');
  const raw = res.body as Buffer;
  return { status: res.status, type, body: type.includes('json') ? JSON.parse(raw.toString('utf8') || 'null') : raw };
}

beforeAll(async () => {
  t = await createTestApp();
  const other = await addOtherOrg(t);
  void other;
  for (const [actor, [email, password]] of Object.entries(emailOf)) agents[actor as Actor] = await t.agentFor(email, password);
  agents.anonymous = anonymous();
  const { hall, annex } = await venueIds(t);
  const marco = agents.director;
  const sam = agents.techAssigned;
  const strip = await stripByLabel(t, hall, 'Strip 12');
  const spare = await stripByLabel(t, hall, 'Strip 20');
  const leftCable = strip.positions.find((p) => p.name === 'Left floor cable')!;
  const spareCable = spare.positions.find((p) => p.name === 'Left floor cable')!;
  const faults = (await marco.get(`/api/venues/${hall}/faults`)).body as { id: string; status: string }[];
  const reading = await sam.post('/api/readings').send({ id: id(), stepId: leftCable.steps[0].id, value: '0.5' }).expect(201);
  // A fault with a repair on Strip 12's right cable, for the repair's attachments.
  const rightCable = strip.positions.find((p) => p.name === 'Right floor cable')!;
  const fault2 = await sam.post('/api/faults').send({ positionId: rightCable.id, kind: 'open', conductors: 'C' }).expect(201);
  const repair = await sam.post(`/api/faults/${fault2.body.id}/repairs`).send({ action: 'connector-remade' }).expect(201);
  const dismissable = await sam.post('/api/faults').send({ positionId: rightCable.id, kind: 'intermittent', conductors: 'A' }).expect(201);
  const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#2266aa' } })
    .png()
    .toBuffer();
  const openFault = faults.find((f) => f.status !== 'closed')!;
  const photo = await sam.post(`/api/faults/${openFault.id}/attachments`).attach('file', png, 'short.png').expect(201);
  const trace = syntheticTdrTrace({ roundTripNs: 60 }).csv;
  const traceUp = await sam.post(`/api/faults/${openFault.id}/attachments`).attach('file', Buffer.from(trace), 'scope.csv').expect(201);
  const register = (await marco.get('/api/equipment')).body as { id: string; kind: string; assetTag: string }[];
  const profiles = (await marco.get('/api/profiles')).body as { id: string }[];
  const events = (await marco.get('/api/events')).body as { id: string }[];
  const copy = await agents.admin.post(`/api/profiles/${profiles[0].id}/copy`).send({ name: 'Club rules' }).expect(201);
  const invited = await agents.admin
    .post('/api/users')
    .send({ email: 'spare@lakeshore.example', name: 'Spare', role: 'technician' })
    .expect(201);
  await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD }).expect(201);
  const certs = (await marco.get(`/api/venues/${annex}/certificates`)).body.certificates as { number: string; kind: string }[];
  const stripCerts = certs.filter((c) => c.kind === 'strip').map((c) => c.number);
  const venueCert = certs.find((c) => c.kind === 'venue')!.number;
  const pdf = await call({ route: 'GET x', path: () => `/api/certificates/${venueCert}/pdf`, expect: ALL_OK(200) }, 'director');
  let mail: { id: string }[] = [];
  for (let i = 0; i < 50 && mail.length === 0; i++) {
    mail = (await agents.admin.get('/api/mail')).body as { id: string }[];
    if (mail.length === 0) await new Promise((r) => setTimeout(r, 50));
  }
  const hallTag = (await marco.get(`/api/venues/${hall}`)).headers.etag as string;
  const removable = await marco
    .post(`/api/strips/${spare.id}/positions`)
    .set('If-Match', hallTag)
    .send({ name: 'Removable reel', equipmentKind: 'reel' })
    .expect(201);
  const removablePosition = (removable.body.strips as { id: string; positions: { id: string; name: string }[] }[])
    .find((x) => x.id === spare.id)!
    .positions.find((p) => p.name === 'Removable reel')!;
  const sam_ = t.db.select().from(s.users).where(eq(s.users.email, DEMO.technician)).get()!;
  const incident = await marco
    .post(`/api/venues/${hall}/incidents`)
    .send({ stripId: strip.id, symptom: 'Box shows a hit on every touch' })
    .expect(201);
  ctx = {
    hall,
    annex,
    eventId: events[0].id,
    stripId: strip.id,
    stepId: leftCable.steps[0].id,
    positionId: leftCable.id,
    spareStripId: spare.id,
    spareStepId: spareCable.steps[spareCable.steps.length - 1].id,
    sparePositionId: spare.positions.find((p) => p.name === 'Right reel')!.id,
    removablePositionId: removablePosition.id,
    faultId: openFault.id,
    incidentId: incident.body.id,
    dismissableFaultId: dismissable.body.id,
    readingId: reading.body.id,
    repairId: repair.body.repair?.id ?? repair.body.id,
    equipmentId: register.find((e) => e.kind === 'floor-cable')!.id,
    assetTag: register.find((e) => e.kind === 'floor-cable')!.assetTag,
    profileId: profiles[0].id,
    profileCopyId: copy.body.id,
    attachmentId: photo.body.id,
    traceAttachmentId: traceUp.body.id,
    userId: invited.body.id,
    samId: sam_.id,
    mailId: mail[0]?.id ?? 'none',
    certificate: venueCert,
    revocable: stripCerts.slice(0, 2),
    certificatePdf: pdf.body as Buffer,
    png,
    pngs: Object.fromEntries(
      await Promise.all(
        ACTORS.map(
          async (a, i) =>
            [
              a,
              await sharp({ create: { width: 40 + i, height: 30, channels: 3, background: '#884422' } })
                .png()
                .toBuffer(),
            ] as const,
        ),
      ),
    ) as Record<Actor, Buffer>,
    trace,
  };
});
afterAll(() => t?.close());

describe('access matrix', () => {
  test('every route of the router has a row, and every row is a route of the router', () => {
    const declared = routesOf(t).map((r) => `${r.method} ${r.path}`);
    const table = new Set(rows().map((r) => r.route));
    const missing = declared.filter((r) => !table.has(r));
    const stale = [...table].filter((r) => !declared.includes(r));
    expect(
      missing,
      `Routes without a row in the access matrix (tests/reliability/access-matrix.test.ts): add one with the expected answer per caller:\n  ${missing.join('\n  ')}`,
    ).toEqual([]);
    expect(stale, `Rows for routes the router no longer has:\n  ${stale.join('\n  ')}`).toEqual([]);
  });

  test('every route answers each caller as the table says, refusals as problem+json', async () => {
    const wrong: string[] = [];
    for (const row of rows()) {
      for (const [i, actor] of ACTORS.entries()) {
        const res = await call(row, actor);
        const want = row.expect[i];
        if (res.status !== want) {
          const detail = res.type.includes('json') ? JSON.stringify(res.body).slice(0, 160) : res.type;
          wrong.push(`${row.route} as ${actor}: ${res.status}, expected ${want} — ${detail}`);
        } else if (res.status >= 400 && !res.type.startsWith('application/problem+json')) {
          wrong.push(`${row.route} as ${actor}: ${res.status} without problem+json (${res.type})`);
        } else if (row.results && res.status === 200) {
          const inner = (res.body as { results: { status: number; problem?: { detail: string } }[] }).results[0];
          if (inner.status !== row.results[i])
            wrong.push(
              `${row.route} as ${actor}: the reading inside answered ${inner.status}, expected ${row.results[i]} — ${inner.problem?.detail ?? ''}`,
            );
        }
      }
    }
    expect(wrong, wrong.join('\n')).toEqual([]);
  }, 240_000); // ~650 sequential requests: 54 s were seen at load average 20; an upper bound only
});
