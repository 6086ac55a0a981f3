// A second, invented organisation with its own director, event, venue, item and profile, so tests
// can check that one organisation never reaches another's objects.
import { hashPassword, TEST_SCRYPT } from '../../server/auth/password';
import * as s from '../../server/db/schema';
import { DEFAULT_LIMIT_PROFILE } from '../../shared/domain/limits';
import type { TestApp } from './test-app';

export const OTHER_DIRECTOR = 'td@hilltop.example';
export const OTHER_ADMIN = 'admin@hilltop.example';
export const OTHER_PASSWORD = 'hilltop-blades-2026';

export async function addOtherOrg(t: TestApp) {
  const id = () => crypto.randomUUID();
  const orgId = id();
  const directorId = id();
  const adminId = id();
  const profileId = id();
  const eventId = id();
  const venueId = id();
  const stripId = id();
  const positionId = id();
  const stepId = id();
  const equipmentId = id();
  t.db.insert(s.organisations).values({ id: orgId, name: 'Hilltop Blades' }).run();
  t.db
    .insert(s.users)
    .values({
      id: directorId,
      orgId,
      email: OTHER_DIRECTOR,
      name: 'Hilltop Director',
      role: 'director',
      passwordHash: await hashPassword(OTHER_PASSWORD, TEST_SCRYPT),
    })
    .run();
  t.db
    .insert(s.users)
    .values({
      id: adminId,
      orgId,
      email: OTHER_ADMIN,
      name: 'Hilltop Admin',
      role: 'admin',
      passwordHash: await hashPassword(OTHER_PASSWORD, TEST_SCRYPT),
    })
    .run();
  t.db
    .insert(s.limitProfiles)
    .values({
      id: profileId,
      orgId,
      lineageId: id(),
      name: 'Hilltop rules',
      version: 1,
      rulesJson: JSON.stringify(DEFAULT_LIMIT_PROFILE.rules),
      loopRequiredJson: '[]',
    })
    .run();
  t.db
    .insert(s.events)
    .values({ id: eventId, orgId, name: 'Hilltop Open', startsOn: '2026-10-01', endsOn: '2026-10-01', directorId })
    .run();
  t.db.insert(s.venues).values({ id: venueId, eventId, name: 'Hilltop Gym', profileId }).run();
  t.db.insert(s.strips).values({ id: stripId, venueId, label: 'H1', sortOrder: 1 }).run();
  t.db.insert(s.equipment).values({ id: equipmentId, orgId, assetTag: 'HB-001', kind: 'floor-cable', lengthM: 10 }).run();
  t.db
    .insert(s.positions)
    .values({ id: positionId, stripId, name: 'Left floor cable', equipmentKind: 'floor-cable', sortOrder: 1, equipmentId })
    .run();
  t.db.insert(s.steps).values({ id: stepId, positionId, testKind: 'continuity', conductors: 'A', sortOrder: 1 }).run();
  return { orgId, directorId, adminId, profileId, eventId, venueId, stripId, positionId, stepId, equipmentId };
}
