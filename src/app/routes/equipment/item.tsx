import { Link, useParams } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import type { TestKind } from '@shared/domain/limits';
import { useMe } from '@/features/auth/api/get-me';
import { useEquipmentItem } from '@/features/equipment/api/get-equipment-item';
import { useUpdateEquipment } from '@/features/equipment/api/update-equipment';
import { useCalibrateEquipment } from '@/features/equipment/api/calibrate-equipment';
import { EquipmentStatusMark, ToInspectMark } from '@/features/equipment/components/equipment-table';
import { EquipmentEditForm } from '@/features/equipment/components/edit-form';
import { CalibrateForm } from '@/features/equipment/components/calibrate-form';
import { lengthText } from '@/features/equipment/components/labels';
import { useDates } from '@/lib/date-format';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { DataTable, plainTableLook } from '@/components/ui/data-table';
import { StatusMark, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { READING_SYMBOLS } from '@shared/domain/symbols';
import { paths } from '@/config/paths';
import { minutesText } from '@/lib/minutes';
import { AttachmentsPanel } from '@/features/attachments/components/attachments-panel';

const VERDICT = Object.fromEntries(
  (['pass', 'near-limit', 'fail'] as const).map((v) => [v, [READING_SYMBOLS[v].shape, READING_SYMBOLS[v].tone, READING_SYMBOLS[v].label]]),
) as Record<'pass' | 'near-limit' | 'fail', [MarkShape, MarkTone, string]>;
const INCIDENT_ROLE_LABELS = { 'in-position': 'in the position', removed: 'swapped out', installed: 'put in as the spare' } as const;
const REPAIR_LABELS = {
  'cut-out': 'Section cut out',
  'connector-remade': 'Connector remade',
  swapped: 'Swapped for another item',
  retired: 'Retired',
} as const;

function Section({ title, count, children }: { title: string; count: number; children: React.ReactNode }) {
  return (
    <Card className="overflow-x-auto p-0!">
      <h2 className="border-b border-line px-5 py-3 text-lg font-semibold">
        {title} <span className="text-sm font-normal text-ink-soft">({count})</span>
      </h2>
      {count === 0 ? <p className="px-5 py-4 text-sm text-ink-soft">Nothing yet.</p> : children}
    </Card>
  );
}

/** An instant in the reader's clock and locale (the item moves between venues). */
function When({ at }: { at: string }) {
  return <>{useDates().dateTime(at)}</>;
}

type ItemReading = NonNullable<ReturnType<typeof useEquipmentItem>['data']>['readings'][number];
const col = createColumnHelper<ItemReading>();
const readingColumns = [
  col.accessor('takenAt', { header: 'When', cell: (c) => <When at={c.getValue()} />, meta: { cellClassName: 'text-ink-soft' } }),
  col.display({ id: 'where', header: 'Where', cell: (c) => `${c.row.original.stripLabel} · ${c.row.original.venueName}` }),
  col.accessor('testKind', {
    header: 'Test',
    cell: (c) => `${TEST_KIND_LABELS[c.getValue() as TestKind] ?? c.getValue()} ${c.row.original.conductors}`,
  }),
  col.accessor('valueText', { header: 'Value', meta: { cellClassName: 'font-mono' } }),
  col.accessor('verdict', {
    header: 'Verdict',
    cell: (c) => {
      const [shape, tone, label] = VERDICT[c.getValue()];
      return <StatusMark shape={shape} tone={tone} label={label} size="sm" />;
    },
  }),
];
const readingsLook = { ...plainTableLook, th: 'px-4 py-2' };

function ItemReadings({ readings }: { readings: ItemReading[] }) {
  const table = useReactTable({ data: readings, columns: readingColumns, getCoreRowModel: getCoreRowModel(), getRowId: (r) => r.id });
  return <DataTable table={table} look={readingsLook} />;
}

export default function EquipmentItemPage() {
  const { equipmentId = '' } = useParams();
  const me = useMe();
  const detail = useEquipmentItem(equipmentId);
  const update = useUpdateEquipment(equipmentId);
  const calibrate = useCalibrateEquipment(equipmentId);
  const system = me.data?.unitSystem ?? 'metric';
  const canManage = me.data?.role === 'admin' || me.data?.role === 'director';

  if (detail.isPending) return <Loading />;
  if (detail.isError) return <Notice tone="error">{detail.error.message}</Notice>;
  const { item, readings, faults, repairs, placements, calibrations, originalLengthM, lengthRemovedM, incidents, inspection } = detail.data;

  return (
    <>
      <PageHeader
        title={item.assetTag}
        subtitle={
          <>
            {EQUIPMENT_KIND_LABELS[item.kind]}
            {item.description ? ` · ${item.description}` : ''} ·{' '}
            <Link className="text-brand underline" to={paths.equipment}>
              Back to the register
            </Link>
          </>
        }
        actions={
          <>
            <EquipmentStatusMark status={item.status} />
            {item.toInspectIncidentId && <ToInspectMark />}
          </>
        }
      />
      {inspection.flagged && (
        <div className="mb-6" data-testid="inspect-flag">
          <Notice tone="caution">
            <strong>Inspect this item:</strong>{' '}
            {inspection.reason ??
              (inspection.toInspect
                ? 'it was taken out of a strip during an incident; look at it before it is used again.'
                : `${inspection.incidentCount} incidents across events.`)}
          </Notice>
        </div>
      )}
      <div className="grid gap-6 lg:grid-cols-[1fr_2fr]">
        <div className="flex flex-col gap-6">
          <Card>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-3 text-sm">
              <dt className="text-ink-soft">Recorded length</dt>
              <dd className="font-semibold tabular-nums">
                {lengthText(item.lengthM, system)}
                {originalLengthM != null && (
                  <span className="block text-xs font-normal text-ink-soft">
                    was {lengthText(originalLengthM, system)}; {lengthText(lengthRemovedM, system)} cut out
                  </span>
                )}
              </dd>
              <dt className="text-ink-soft">Conductor</dt>
              <dd>{item.conductorMm2 ? `${item.conductorMm2} mm²` : item.awg ? `AWG ${item.awg}` : '—'}</dd>
              <dt className="text-ink-soft">Cable type</dt>
              <dd>{item.cableType ?? '—'}</dd>
              <dt className="text-ink-soft">Velocity factor</dt>
              <dd className="tabular-nums">{item.velocityFactor != null ? item.velocityFactor.toFixed(3) : 'not calibrated'}</dd>
              <dt className="text-ink-soft">Notes</dt>
              <dd>{item.notes ?? '—'}</dd>
            </dl>
          </Card>
          {canManage && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold">Edit the record</h2>
              <EquipmentEditForm item={item} onSave={(v) => update.mutateAsync({ id: item.id, ...v })} onReload={() => detail.refetch()} />
            </Card>
          )}
          {canManage && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold">Calibrate the velocity factor</h2>
              <CalibrateForm defaultLengthM={item.lengthM} onCalibrate={(v) => calibrate.mutateAsync({ id: item.id, ...v })} />
            </Card>
          )}
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Photos and files</h2>
            <AttachmentsPanel ownerType="equipment" ownerId={item.id} canUpload={canManage} unitSystem={system} />
          </Card>
        </div>
        <div className="flex flex-col gap-6">
          <Section title="Strips it sat on" count={placements.length}>
            <ul className="divide-y divide-line text-sm">
              {placements.map((p) => (
                <li key={p.id} className="flex flex-wrap justify-between gap-2 px-5 py-3">
                  <span>
                    <span className="font-semibold">{p.stripLabel}</span>, {p.positionName} · {p.venueName} · {p.eventName}
                  </span>
                  <span className="text-ink-soft">
                    <When at={p.assignedAt} /> → {p.removedAt ? <When at={p.removedAt} /> : <strong className="text-ink">there now</strong>}
                  </span>
                </li>
              ))}
            </ul>
          </Section>
          <Section title="Incidents" count={incidents.length}>
            <ul className="divide-y divide-line text-sm" data-testid="item-incidents">
              {incidents.map((i) => (
                <li key={i.id} className="flex flex-wrap justify-between gap-2 px-5 py-3">
                  <span>
                    <span className="font-semibold">{i.symptom}</span> · {INCIDENT_ROLE_LABELS[i.role]}
                  </span>
                  <span>
                    {i.stripLabel}
                    {i.positionName ? `, ${i.positionName}` : ''} · {i.venueName} · {i.eventName}
                  </span>
                  <span className="text-ink-soft">
                    <When at={i.openedAt} /> · {i.status === 'open' ? 'open' : `out of service ${minutesText(i.minutesOutOfService)}`}
                  </span>
                </li>
              ))}
            </ul>
          </Section>
          <Section title="Faults" count={faults.length}>
            <ul className="divide-y divide-line text-sm">
              {faults.map((f) => (
                <li key={f.id} className="flex flex-wrap justify-between gap-2 px-5 py-3">
                  <Link to={paths.fault(f.id)} className="font-semibold text-brand underline">
                    {f.kind} on {f.conductors}
                  </Link>
                  <span>
                    {f.stripLabel}, {f.positionName} · {f.venueName}
                  </span>
                  <span className="text-ink-soft">
                    {f.status} · <When at={f.openedAt} />
                  </span>
                </li>
              ))}
            </ul>
          </Section>
          <Section title="Repairs" count={repairs.length}>
            <ul className="divide-y divide-line text-sm">
              {repairs.map((r) => (
                <li key={r.id} className="px-5 py-3">
                  <span className="font-semibold">{r.role === 'replacement' ? 'Put in as a replacement' : REPAIR_LABELS[r.action]}</span>
                  {r.action === 'cut-out' && r.lengthRemovedM != null && (
                    <span>
                      {' '}
                      · {lengthText(r.lengthRemovedM, system)} removed
                      {r.lengthBeforeM != null &&
                        r.lengthAfterM != null &&
                        `: ${lengthText(r.lengthBeforeM, system)} → ${lengthText(r.lengthAfterM, system)}`}
                    </span>
                  )}
                  <span className="block text-ink-soft">
                    {r.byName ?? '—'} · <When at={r.createdAt} />
                    {r.notes ? ` · ${r.notes}` : ''}
                  </span>
                </li>
              ))}
            </ul>
          </Section>
          <Section title="Velocity calibrations" count={calibrations.length}>
            <ul className="divide-y divide-line text-sm">
              {calibrations.map((c) => (
                <li key={c.id} className="flex flex-wrap justify-between gap-2 px-5 py-3">
                  <span className="font-semibold tabular-nums">VF {c.velocityFactor.toFixed(3)}</span>
                  <span>
                    {c.roundTripNs} ns over {lengthText(c.lengthM, system)}
                  </span>
                  <span className="text-ink-soft">
                    {c.byName ?? '—'} · <When at={c.createdAt} />
                  </span>
                </li>
              ))}
            </ul>
          </Section>
          <Section title="Readings" count={readings.length}>
            <ItemReadings readings={readings} />
          </Section>
        </div>
      </div>
    </>
  );
}
