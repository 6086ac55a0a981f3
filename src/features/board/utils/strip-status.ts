import type { MarkShape, MarkTone } from '@/components/ui/status-mark';
import { STRIP_STATUS_LABELS, type StripStatus } from '@shared/domain/progress';

export const STRIP_STATUSES: StripStatus[] = ['not-started', 'in-progress', 'clear', 'fault-open', 'withdrawn'];

export const stripStatusLook: Record<StripStatus, { shape: MarkShape; tone: MarkTone; label: string }> = {
  'not-started': { shape: 'ring', tone: 'idle', label: STRIP_STATUS_LABELS['not-started'] },
  'in-progress': { shape: 'half', tone: 'brand', label: STRIP_STATUS_LABELS['in-progress'] },
  clear: { shape: 'circle', tone: 'pass', label: STRIP_STATUS_LABELS.clear },
  'fault-open': { shape: 'triangle', tone: 'fail', label: STRIP_STATUS_LABELS['fault-open'] },
  withdrawn: { shape: 'dash', tone: 'idle', label: STRIP_STATUS_LABELS.withdrawn },
};

export const VENUE_STATUS_LABELS: Record<string, string> = { planning: 'Planning', testing: 'Testing', 'signed-off': 'Signed off' };
