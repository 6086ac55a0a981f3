import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { setAside, tryAgain } from '../stores/outbox';
import type { QueuedIncident } from '../utils/queue';
import { QueuedIncidentMark } from './queued-incident-mark';

/** Incidents opened on this tablet that the server does not have yet, with what can be done about a refused one. */
export function IncidentQueue({ items }: { items: QueuedIncident[] }) {
  if (items.length === 0) return null;
  return (
    <Card className="mb-6" data-testid="incident-queue">
      <h2 className="text-lg font-semibold">Incidents opened here</h2>
      <ul className="mt-2 divide-y divide-line">
        {items.map((i) => (
          <li key={i.id} className="flex flex-wrap items-center gap-3 py-3">
            <QueuedIncidentMark item={i} />
            <Link to={paths.stripTest(i.stripId)} className="font-semibold text-brand underline">
              {i.where}
            </Link>
            {i.problem && <span className="text-sm text-fail">{i.problem.message}</span>}
            {i.status === 'set-aside' && <span className="text-sm text-ink-soft">set aside: not sent</span>}
            {(i.status === 'problem' || i.status === 'set-aside') && (
              <span className="ml-auto flex gap-2">
                <Button variant="secondary" onClick={() => void tryAgain(i.id)}>
                  Send it again
                </Button>
                {i.status === 'problem' && (
                  <Button variant="ghost" onClick={() => void setAside(i.id)}>
                    Set it aside
                  </Button>
                )}
              </span>
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}
