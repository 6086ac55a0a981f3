import { useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import type { StripStatus } from '@shared/domain/progress';
import { MarkIcon, StatusMark } from '@/components/ui/status-mark';
import { minutesText } from '@/lib/minutes';
import type { BoardStrip } from '../api/get-board';
import { STRIP_STATUSES, stripStatusLook } from '../utils/strip-status';

/** Filters by status and zone, shared by the venue page and the board. */
export function useStripFilters(strips: BoardStrip[]) {
  const [status, setStatus] = useState<StripStatus | 'all'>('all');
  const [zone, setZone] = useState<string>('all');
  const zones = useMemo(() => [...new Set(strips.map((s) => s.zone ?? 'No zone'))], [strips]);
  const shown = strips.filter((s) => (status === 'all' || s.status === status) && (zone === 'all' || (s.zone ?? 'No zone') === zone));
  return { status, setStatus, zone, setZone, zones, shown };
}

export function StripFilters({ filters, counts }: { filters: ReturnType<typeof useStripFilters>; counts: Record<StripStatus, number> }) {
  const chip = (active: boolean) =>
    `inline-flex min-h-touch items-center gap-2 rounded-full border px-3 text-sm font-medium ${active ? 'border-brand bg-brand text-white' : 'border-line bg-card hover:bg-paper'}`;
  return (
    <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Filter strips">
      <button
        type="button"
        className={chip(filters.status === 'all')}
        aria-pressed={filters.status === 'all'}
        onClick={() => filters.setStatus('all')}
      >
        All
      </button>
      {STRIP_STATUSES.filter((s) => s !== 'out-of-service' || counts[s] > 0).map((s) => (
        <button
          key={s}
          type="button"
          className={chip(filters.status === s)}
          aria-pressed={filters.status === s}
          onClick={() => filters.setStatus(s)}
        >
          <MarkIcon shape={stripStatusLook[s].shape} tone={filters.status === s ? 'brass' : stripStatusLook[s].tone} />
          {stripStatusLook[s].label} <span className="tabular-nums">({counts[s]})</span>
        </button>
      ))}
      {filters.zones.length > 1 && (
        <label className="ml-auto flex items-center gap-2 text-sm">
          Zone
          <select
            className="min-h-touch rounded-lg border border-line bg-card px-2"
            value={filters.zone}
            onChange={(e) => filters.setZone(e.target.value)}
          >
            <option value="all">All zones</option>
            {filters.zones.map((z) => (
              <option key={z} value={z}>
                {z}
              </option>
            ))}
          </select>
        </label>
      )}
    </div>
  );
}

/** How long a strip has been out of service, in the tile's words. */
export const outOfServiceText = (s: BoardStrip) =>
  s.minutesSinceIncident === null ? 'out of service' : `out of service for ${minutesText(s.minutesSinceIncident)}`;

/**
 * Every strip as a tile: its status as shape, word and colour, and how many steps are done; an
 * out-of-service strip says for how long. `actions` adds buttons under a tile (a page's own).
 */
export function StripGrid({
  strips,
  linkTo,
  compact = false,
  actions,
}: {
  strips: BoardStrip[];
  linkTo?: (s: BoardStrip) => string;
  compact?: boolean;
  actions?: (s: BoardStrip) => ReactNode;
}) {
  if (strips.length === 0) return <p className="py-6 text-center text-ink-soft">No strip matches these filters.</p>;
  return (
    <ul className={`grid gap-3 ${compact ? 'grid-cols-3 sm:grid-cols-4 xl:grid-cols-5' : 'grid-cols-2 sm:grid-cols-3 lg:grid-cols-4'}`}>
      {strips.map((s) => {
        const look = stripStatusLook[s.status];
        const body = (
          <>
            <div className="flex items-center justify-between gap-2">
              <span className="text-base font-semibold">{s.label}</span>
              <MarkIcon shape={look.shape} tone={look.tone} className="size-5" />
            </div>
            <StatusMark {...look} size="sm" className="self-start" />
            {s.status === 'out-of-service' && s.minutesSinceIncident !== null && (
              <span className="text-sm font-semibold text-fail tabular-nums" data-testid="minutes-out">
                {minutesText(s.minutesSinceIncident)} out
                {s.openIncidents > 0
                  ? ` · ${s.openIncidents} incident${s.openIncidents === 1 ? '' : 's'} open`
                  : ' · waiting for the amendment'}
              </span>
            )}
            <span className="text-xs text-ink-soft tabular-nums">
              {s.done}/{s.total} steps{s.failed > 0 ? ` · ${s.failed} failing` : ''}
              {s.nearLimit > 0 ? ` · ${s.nearLimit} near limit` : ''}
            </span>
          </>
        );
        const border =
          s.status === 'out-of-service'
            ? 'border-fail bg-fail-soft/40'
            : s.status === 'fault-open'
              ? 'border-fail/60'
              : s.status === 'clear'
                ? 'border-pass/50'
                : 'border-line';
        const cls = `flex h-full min-h-touch flex-col gap-1.5 rounded-lg border-2 bg-card p-3 ${border}`;
        return (
          <li key={s.id} data-strip={s.label} data-status={s.status} className="flex flex-col gap-1.5">
            {linkTo ? (
              <Link to={linkTo(s)} className={`${cls} hover:bg-paper`}>
                {body}
              </Link>
            ) : (
              <div className={cls}>{body}</div>
            )}
            {actions?.(s)}
          </li>
        );
      })}
    </ul>
  );
}
