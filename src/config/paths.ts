// Every client route path in one place.
import { fullPath } from '@shared/contracts/contract';
import { equipmentImportContracts } from '@shared/contracts/equipment-import';
import { ITEM_LABEL_PREFIX, STRIP_LABEL_PREFIX } from '@shared/domain/label-codes';

export const paths = {
  home: '/',
  signIn: '/sign-in',
  resetPassword: '/reset-password',
  setPassword: (token = ':token') => `/set-password/${token}`,
  people: '/people',
  outbox: '/people/outbox',
  notAllowed: '/not-allowed',
  faultLocator: '/fault-locator',
  verify: (number = ':number') => `/verify/${number}`,
  verifyLookup: '/verify',
  venueSignOff: (venueId = ':venueId') => `/venues/${venueId}/sign-off`,
  venueCertificates: (venueId = ':venueId') => `/venues/${venueId}/certificates`,
  venue: (venueId = ':venueId') => `/venues/${venueId}`,
  venueBoard: (venueId = ':venueId') => `/venues/${venueId}/board`,
  stripTest: (stripId = ':stripId') => `/strips/${stripId}/test`,
  /** Readings on this tablet: waiting to send, or needing the technician. */
  onThisTablet: '/on-this-tablet',
  /** What a strip's printed label links to (shared/domain/label-codes.ts): it opens the testing screen. */
  scannedStrip: `${STRIP_LABEL_PREFIX}:stripId`,
  /** What an item's printed label links to: the strip it sits on, or the item. */
  scannedTag: `${ITEM_LABEL_PREFIX}:tag`,
  fault: (faultId = ':faultId') => `/faults/${faultId}`,
  equipment: '/equipment',
  equipmentItem: (equipmentId = ':equipmentId') => `/equipment/${equipmentId}`,
  equipmentImport: '/equipment/import',
  /** A download from the API, not a client route. */
  equipmentCsv: fullPath(equipmentImportContracts.csv),
  events: '/events',
  event: (eventId = ':eventId') => `/events/${eventId}`,
  venuePlan: (venueId = ':venueId') => `/venues/${venueId}/plan`,
  venueReadings: (venueId = ':venueId') => `/venues/${venueId}/readings`,
  venueAudit: (venueId = ':venueId') => `/venues/${venueId}/audit`,
  /** Competition days: the venue's incidents, the amendment and the incident report. */
  venueIncidents: (venueId = ':venueId') => `/venues/${venueId}/incidents`,
  venueSpares: (venueId = ':venueId') => `/venues/${venueId}/spares`,
  profiles: '/profiles',
  profile: (profileId = ':profileId') => `/profiles/${profileId}`,
} as const;
