import type { StripStatus } from '@shared/domain/progress';
import { STRIP_SYMBOLS } from '@shared/domain/symbols';

export const STRIP_STATUSES: StripStatus[] = ['not-started', 'in-progress', 'clear', 'fault-open', 'withdrawn'];

// The one symbol module, shared with the certificates.
export const stripStatusLook = STRIP_SYMBOLS;

export const VENUE_STATUS_LABELS: Record<string, string> = { planning: 'Planning', testing: 'Testing', 'signed-off': 'Signed off' };
