import type { StripStatus } from '@shared/domain/progress';
import { STRIP_SYMBOLS } from '@shared/domain/symbols';

// Out of service first: on competition days it is the one that matters.
export const STRIP_STATUSES: StripStatus[] = ['out-of-service', 'not-started', 'in-progress', 'clear', 'fault-open', 'withdrawn'];

// The one symbol module, shared with the certificates.
export const stripStatusLook = STRIP_SYMBOLS;

export const VENUE_STATUS_LABELS: Record<string, string> = { planning: 'Planning', testing: 'Testing', 'signed-off': 'Signed off' };
