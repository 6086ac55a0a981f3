import { Link } from 'react-router';
import { MarkIcon, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { useSyncSummary } from '../hooks/use-outbox';
import type { SyncState } from '../utils/queue';

export const syncLook: Record<SyncState, { shape: MarkShape; tone: MarkTone; pill: string }> = {
  'up-to-date': { shape: 'circle', tone: 'pass', pill: 'border-white/30' },
  syncing: { shape: 'half', tone: 'brass', pill: 'border-white/30' },
  waiting: { shape: 'hourglass', tone: 'brass', pill: 'border-brass' },
  offline: { shape: 'box', tone: 'idle', pill: 'border-white/60 border-dashed' },
  'needs-you': { shape: 'octagon', tone: 'fail', pill: 'border-brass bg-brass text-ink hover:bg-brass/90' },
};

const readings = (n: number) => `${n} reading${n === 1 ? '' : 's'}`;

export function syncWords(s: { state: SyncState; waiting: number; needsYou: number }): string {
  switch (s.state) {
    case 'up-to-date':
      return 'Online · all sent';
    case 'syncing':
      return `Sending ${readings(s.waiting)}…`;
    case 'waiting':
      return `${readings(s.waiting)} waiting to send`;
    case 'offline':
      return s.waiting > 0 ? `Offline · ${readings(s.waiting)} waiting` : 'Offline · nothing waiting';
    case 'needs-you':
      return `${s.needsYou} need${s.needsYou === 1 ? 's' : ''} you${s.waiting > 0 ? ` · ${s.waiting} waiting` : ''}`;
  }
}

/** Always in the header: is everything on the server, and if not, why. Shape and words, not colour alone. */
export function SyncIndicator() {
  const s = useSyncSummary();
  const l = syncLook[s.state];
  return (
    <Link
      to={paths.onThisTablet}
      data-testid="sync-indicator"
      data-state={s.state}
      aria-live="polite"
      className={`inline-flex min-h-touch items-center gap-2 rounded-full border px-3 text-sm font-medium ${l.pill} ${s.state === 'needs-you' ? '' : 'hover:bg-white/10'}`}
    >
      <span className={s.state === 'syncing' ? 'motion-safe:animate-spin' : ''}>
        <MarkIcon shape={l.shape} tone={l.tone} className="size-4" />
      </span>
      {syncWords(s)}
    </Link>
  );
}
