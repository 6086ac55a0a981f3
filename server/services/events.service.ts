// Events: the competitions a director plans venues for, and the people who can be chosen.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { planRepository } from '../db/plan.repository';
import { recordAudit } from '../db/audit.repository';
import { accessService } from './access.service';
import { forbidden, notFound, unprocessable } from '../lib/app-error';
import { newId } from '../lib/ids';
import type { CreateEventInput } from '../../shared/schemas/plan';

export function eventsService(deps: AppDeps) {
  const access = accessService(deps.db);
  const repo = planRepository(deps.db);

  function getEvent(user: AuthUser, id: string) {
    const event = repo.findEvent(id);
    if (!event || event.orgId !== user.orgId) throw notFound('That event');
    const venues = repo.venuesOfEvent(id).filter((v) => access.canSee(user, v.id));
    if (user.role === 'technician' && venues.length === 0) throw forbidden('You are not assigned to a venue of this event.');
    const people = repo.usersByIds([event.directorId, event.organiserId].filter((x): x is string => !!x));
    const nameOf = (uid: string | null) => people.find((p) => p.id === uid)?.name ?? null;
    return {
      ...event,
      directorName: nameOf(event.directorId),
      organiserName: nameOf(event.organiserId),
      venues: venues.map((v) => ({
        id: v.id,
        name: v.name,
        status: v.status,
        profileId: v.profileId,
        clonedFromId: v.clonedFromId,
        stripCount: repo.stripsOf(v.id).length,
      })),
    };
  }

  function createEvent(user: AuthUser, input: CreateEventInput) {
    if (input.organiserId) {
      const organiser = repo.findUser(input.organiserId);
      if (!organiser || organiser.orgId !== user.orgId || organiser.role !== 'organiser') {
        throw unprocessable('no-such-organiser', 'The organiser must be someone in your organisation with the organiser role.', {
          errors: [{ path: 'organiserId', message: 'Choose an organiser of your organisation.' }],
        });
      }
    }
    const id = newId();
    deps.db.transaction((tx) => {
      planRepository(tx).insertEvent({
        id,
        orgId: user.orgId,
        name: input.name,
        startsOn: input.startsOn,
        endsOn: input.endsOn,
        directorId: user.id,
        organiserId: input.organiserId ?? null,
      });
      recordAudit(tx, user, 'event.created', 'event', id, { name: input.name, startsOn: input.startsOn, endsOn: input.endsOn });
    });
    return getEvent(user, id);
  }

  return {
    getEvent,
    createEvent,

    /** Who a director can choose from: technicians for venues, organisers for events. */
    people(user: AuthUser) {
      const all = repo.activePeopleOfOrg(user.orgId);
      return { technicians: all.filter((p) => p.role === 'technician'), organisers: all.filter((p) => p.role === 'organiser') };
    },

    listEvents(user: AuthUser) {
      const list = user.role === 'technician' ? repo.eventsWithVenueOf(user.id) : repo.eventsOfOrg(user.orgId);
      return list.map((e) => {
        const venues = repo.venuesOfEvent(e.id).filter((v) => user.role !== 'technician' || access.canSee(user, v.id));
        return { ...e, venues: venues.map((v) => ({ id: v.id, name: v.name, status: v.status })) };
      });
    },
  };
}
