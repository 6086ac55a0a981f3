// Object-level access (OWASP ASVS 8.2.2), in one place: who may read, test, plan or sign off a venue.
import type { Db, Tx } from '../db/client';
import { venuesRepository } from '../db/venues.repository';
import type { AuthUser } from '../auth/types';
import { forbidden, notFound } from '../lib/app-error';

// 'direct': what only the event's own technical director decides (sign-off, dismissing a fault).
export type VenueAccessMode = 'read' | 'test' | 'plan' | 'sign-off' | 'direct';

/** What an access decision needs of a venue and its event (a whole row, or the columns a query brought). */
export interface VenueAccessRow {
  venue: { id: string };
  event: { orgId: string; directorId: string | null };
}

export function accessService(db: Db | Tx) {
  const repo = venuesRepository(db);

  // `assigned`, when given, is the technician's assignment already read with the venue.
  function allowed(user: AuthUser, row: VenueAccessRow, mode: VenueAccessMode, assigned?: boolean) {
    const sameOrg = row.event.orgId === user.orgId;
    if (!sameOrg) return false;
    const isAssigned = () => assigned ?? repo.isAssigned(row.venue.id, user.id);
    switch (mode) {
      case 'read':
        return user.role === 'technician' ? isAssigned() : true;
      case 'test':
        return user.role === 'director' || (user.role === 'technician' && isAssigned());
      case 'plan':
        return user.role === 'director';
      case 'sign-off':
      case 'direct':
        return user.role === 'director' && row.event.directorId === user.id;
    }
  }

  /** The access check on a venue and event already read (with a step, say): no second look-up. */
  function requireLoadedVenue<R extends VenueAccessRow>(user: AuthUser, row: R | undefined, mode: VenueAccessMode, assigned?: boolean): R {
    if (!row || row.event.orgId !== user.orgId) throw notFound('That venue');
    if (!allowed(user, row, mode, assigned)) {
      const why =
        mode === 'sign-off'
          ? 'Only the technical director of this event can sign the venue off.'
          : mode === 'direct'
            ? 'Only the technical director of this event can do this.'
            : mode === 'plan'
              ? 'Only a technical director can change the venue plan.'
              : 'You are not assigned to this venue.';
      throw forbidden(why);
    }
    return row;
  }

  return {
    /**
     * The venue and its event if the user may act on it this way. Another organisation's venue is
     * answered as not found (no leak of its existence); one of our own that the user may not touch
     * is 403.
     */
    requireVenue(user: AuthUser, venueId: string, mode: VenueAccessMode) {
      return requireLoadedVenue(user, repo.findVenue(venueId), mode);
    },
    requireLoadedVenue,
    visibleVenues(user: AuthUser) {
      return user.role === 'technician' ? repo.venuesAssignedTo(user.id) : repo.venuesOfOrg(user.orgId);
    },
    canSee: (user: AuthUser, venueId: string) => {
      const row = repo.findVenue(venueId);
      return !!row && allowed(user, row, 'read');
    },
  };
}
