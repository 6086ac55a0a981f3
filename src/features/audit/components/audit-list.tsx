import type { AuditEntry } from '../api/get-venue-audit';
import { useDates } from '@/lib/date-format';

const ACTIONS: Record<string, string> = {
  'venue.created': 'created the venue',
  'venue.cloned': 'created the venue as a copy',
  'venue.updated': 'changed the venue details',
  'venue.technicians-set': 'changed the technicians',
  'venue.reopened': 're-opened the signed-off venue',
  'venue.signed-off': 'signed the venue off',
  'certificate.revoked': 'revoked a certificate',
  'strip.created': 'added a strip',
  'strip.updated': 'changed a strip',
  'strip.withdrawn': 'withdrew a strip',
  'strip.reinstated': 'reinstated a strip',
  'position.equipment-attached': 'attached an item',
  'position.equipment-removed': 'took an item off',
  'position.added': 'added a position',
  'position.removed': 'removed an untested position',
  'step.added': 'added a checklist step',
  'step.dropped': 'dropped a checklist step',
  'reading.recorded': 'recorded a reading',
  'reading.corrected': 'corrected a reading',
  'fault.opened': 'opened a fault',
  'fault.updated': 'changed a fault record',
  'fault.estimated': 'estimated where a fault is',
  'fault.repaired': 'recorded a repair',
  'fault.retest-failed': 'saw a retest fail',
  'fault.closed': 'closed a fault',
  'fault.dismissed': 'dismissed a fault as a typing mistake',
  'lead-null.recorded': 'recorded a test-lead null',
  'attachment.added': 'attached a file',
  'strip.suspended': 'took a strip out of service',
  'incident.opened': 'opened an incident',
  'incident.swapped': 'swapped a spare in',
  'incident.resolved': 'put a strip back in service',
  'venue.amended': 'amended the signed-off venue',
  'venue.spares-set': 'changed the spare pool',
  'equipment.to-inspect': 'set an item aside to inspect',
};

/** A short line from the entry's detail: the fields a person recognises. */
function summary(e: AuditEntry): string {
  const d = e.detail;
  const parts: string[] = [];
  for (const k of ['label', 'strip', 'position', 'assetTag', 'testKind', 'conductors', 'value', 'reason', 'name'] as const) {
    const v = d[k];
    if (typeof v === 'string' && v) parts.push(v);
  }
  if (d.changed && typeof d.changed === 'object') {
    for (const [field, change] of Object.entries(d.changed as Record<string, { from: unknown; to: unknown }>)) {
      parts.push(`${field}: ${String(change.from ?? '—')} → ${String(change.to ?? '—')}`);
    }
  }
  if (Array.isArray(d.added) && d.added.length) parts.push(`added ${d.added.join(', ')}`);
  if (Array.isArray(d.removed) && d.removed.length) parts.push(`removed ${d.removed.join(', ')}`);
  return parts.join(' · ');
}

export function AuditList({ entries }: { entries: AuditEntry[] }) {
  const dates = useDates();
  if (entries.length === 0) return <p className="p-5 text-ink-soft">Nothing recorded yet.</p>;
  return (
    <ol className="divide-y divide-line">
      {entries.map((e) => (
        <li key={e.id} className="grid gap-1 px-5 py-3 sm:grid-cols-[11rem_1fr]">
          <time dateTime={e.at} className="text-sm text-ink-soft">
            {dates.dateTime(e.at)}
          </time>
          <div>
            <p>
              <strong>{e.actorName ?? 'The system'}</strong> {ACTIONS[e.action] ?? e.action}
            </p>
            {summary(e) && <p className="text-sm text-ink-soft">{summary(e)}</p>}
          </div>
        </li>
      ))}
    </ol>
  );
}
