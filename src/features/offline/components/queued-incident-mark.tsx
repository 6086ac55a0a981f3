import { OTHER_SYMBOLS } from '@shared/domain/symbols';
import { SymbolMark } from '@/components/ui/status-mark';
import type { QueuedIncident } from '../utils/queue';

/** An incident opened on this tablet that the server does not have yet: waiting, or refused. */
export function QueuedIncidentMark({ item }: { item: QueuedIncident }) {
  const look = item.status === 'problem' ? OTHER_SYMBOLS['needs-you'] : OTHER_SYMBOLS['waiting-to-send'];
  return (
    <span
      data-testid="queued-incident"
      data-state={item.status}
      title={item.problem ? `${item.problem.message} See On this tablet.` : undefined}
    >
      <SymbolMark look={look} label={item.status === 'problem' ? 'Incident refused' : 'Incident waiting to send'} size="sm" />
    </span>
  );
}
