import { urlOf } from '@/lib/api-client';
import { labelsContracts } from '@shared/contracts/labels';
import { EQUIPMENT_KINDS } from '@shared/domain/limits';
import { EQUIPMENT_STATUSES } from '@shared/schemas/equipment';

/** Plain links: the browser opens the PDF with the session cookie, to print from its viewer. */
export const venueLabelsUrl = (venueId: string) => urlOf(labelsContracts.venueSheet, { id: venueId });
/** The register's labels with the filters on screen (an empty choice means all). */
export const registerLabelsUrl = (f: { kind?: string; status?: string; q?: string }) =>
  urlOf(labelsContracts.registerSheet, undefined, {
    kind: EQUIPMENT_KINDS.find((k) => k === f.kind),
    status: EQUIPMENT_STATUSES.find((s) => s === f.status),
    q: f.q || undefined,
  });
