import { useEffect, useRef } from 'react';
import { Link, useParams } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { formatLength, formatOhm } from '@shared/domain/units';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { FAULT_KIND_LABELS, FAULT_STATUS_LABELS } from '@shared/schemas/faults';
import { useMe } from '@/features/auth/api/get-me';
import { faultQueryOptions, useFault } from '@/features/faults/api/get-fault';
import { useQueryClient } from '@tanstack/react-query';
import { AttachmentsPanel } from '@/features/attachments/components/attachments-panel';
import { useAddEstimate } from '@/features/faults/api/add-estimate';
import { FaultNotes } from '@/features/faults/components/fault-notes';
import { RepairForm } from '@/features/faults/components/repair-form';
import { LocateForm } from '@/features/fault-locator/components/locate-form';
import { METHOD_DEFINITIONS, methodsForFault, type LocateMethod } from '@shared/domain/fault-methods';
import { DismissForm } from '@/features/faults/components/dismiss-form';
import { CableDrawing } from '@/components/ui/cable-drawing';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { StatusMark, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { FAULT_SYMBOLS, READING_SYMBOLS } from '@shared/domain/symbols';
import { paths } from '@/config/paths';
import { TimeZoneProvider, useDates } from '@/lib/date-format';
import { useVenueTimeZone } from '@/app/venue-clock';

const statusLook = FAULT_SYMBOLS;
const verdictLook = Object.fromEntries(
  (['pass', 'near-limit', 'fail'] as const).map((v) => [v, [READING_SYMBOLS[v].shape, READING_SYMBOLS[v].tone, READING_SYMBOLS[v].label]]),
) as Record<'pass' | 'near-limit' | 'fail', [MarkShape, MarkTone, string]>;
const ACTION_LABELS = {
  'cut-out': 'Section cut out',
  'connector-remade': 'Connector remade',
  swapped: 'Swapped',
  retired: 'Retired',
} as const;

type FaultStep = NonNullable<ReturnType<typeof useFault>['data']>['steps'][number];
const ohmText = (r: { overRange: boolean; valueOhm: number | null }) => (r.overRange ? 'OL' : formatOhm(r.valueOhm ?? 0));
const stepCol = createColumnHelper<FaultStep>();
const stepColumns = [
  stepCol.display({
    id: 'step',
    header: 'Step',
    cell: (c) => `${TEST_KIND_LABELS[c.row.original.testKind]} ${c.row.original.conductors}`,
    meta: { className: 'pr-3' },
  }),
  stepCol.accessor('latest', {
    header: 'Latest',
    cell: (c) => (c.getValue() ? ohmText(c.getValue()!) : '—'),
    meta: { className: 'pr-3', cellClassName: 'tabular-nums' },
  }),
  stepCol.display({
    id: 'verdict',
    header: 'Verdict',
    meta: { className: 'pr-3' },
    cell: (c) => {
      const l = c.row.original.latest;
      const v = l ? verdictLook[l.verdict] : null;
      return v ? <StatusMark shape={v[0]} tone={v[1]} label={v[2]} size="sm" /> : <span className="text-ink-soft">not measured</span>;
    },
  }),
  stepCol.display({
    id: 'limit',
    header: 'Limit',
    meta: { className: 'pr-3', cellClassName: 'tabular-nums' },
    cell: (c) => {
      const l = c.row.original.latest;
      return l?.limitOhm != null ? `${l.limitKind === 'min' ? '≥' : '≤'} ${formatOhm(l.limitOhm)}` : '—';
    },
  }),
  stepCol.accessor('readings', {
    header: 'Earlier',
    cell: (c) => c.getValue().slice(1, 4).map(ohmText).join(', ') || '—',
    meta: { cellClassName: 'text-xs text-ink-soft' },
  }),
];
const stepsLook = {
  table: 'w-full text-left text-sm',
  head: 'border-b border-line text-xs uppercase tracking-wide text-ink-soft',
  th: 'py-2',
  row: 'border-b border-line last:border-0',
  td: 'py-2',
};

/** The latest reading of each step of the item, the fault's own step marked. */
function StepReadings({ steps, faultStepId }: { steps: FaultStep[]; faultStepId: string | null }) {
  const table = useReactTable({ data: steps, columns: stepColumns, getCoreRowModel: getCoreRowModel(), getRowId: (s) => s.id });
  return (
    <DataTable
      table={table}
      look={stepsLook}
      rowProps={(row) => ({ className: row.original.id === faultStepId ? 'bg-fail-soft/50' : undefined })}
    />
  );
}

/** A fault: where it is on the cable, how to locate it, the repair, and the way back to the retest. */
export default function FaultPage() {
  const { faultId = '' } = useParams();
  const fault = useFault(faultId);
  const me = useMe();
  const qc = useQueryClient();
  const add = useAddEstimate(faultId);
  const zone = useVenueTimeZone(fault.data?.venueId);
  const dates = useDates(zone);
  // The server words the saved estimates in the reader's units: after an m ↔ ft switch, read them again.
  const wordsIn = useRef(me.data?.unitSystem);
  useEffect(() => {
    const now = me.data?.unitSystem;
    if (wordsIn.current !== undefined && now !== undefined && now !== wordsIn.current)
      void qc.invalidateQueries({ queryKey: faultQueryOptions(faultId).queryKey });
    wordsIn.current = now;
  }, [me.data?.unitSystem, qc, faultId]);
  if (fault.isPending) return <Loading />;
  if (fault.isError) return <Notice tone="error">{fault.error.message}</Notice>;
  const f = fault.data;
  const unit = me.data?.unitSystem ?? 'metric';
  const canWrite = me.data?.role === 'technician' || me.data?.role === 'director';
  const active = f.status !== 'closed';
  const lengthM = f.equipment?.lengthM ?? f.lengthM;
  const retest = `${paths.stripTest(f.stripId)}?position=${f.positionId}`;

  const shown = f.combined ?? null;
  // Estimates are shown against the item's length when they were made: a cut-out since does not move them.
  const latest = f.estimates[f.estimates.length - 1];
  const locatedOnM = shown ? shown.itemLengthM : (latest?.itemLengthM ?? null);
  const drawnM = locatedOnM ?? lengthM;
  const shortenedSince = locatedOnM !== null && lengthM !== null && lengthM < locatedOnM;
  const used = new Set(shown?.estimateIds ?? []);
  const single = f.estimates.flatMap((e) =>
    used.has(e.id) && e.distanceFromNearM !== null ? [{ distanceM: e.distanceFromNearM, uncertaintyM: e.uncertaintyM }] : [],
  );
  const apartOf = new Map((shown?.apart ?? []).map((a) => [a.estimateId, a.reason]));
  const title = (method: string) => METHOD_DEFINITIONS[method as LocateMethod]?.title ?? method;

  return (
    <TimeZoneProvider timeZone={zone}>
      <PageHeader
        title={`Fault on ${f.stripLabel} · ${f.positionName}`}
        subtitle={
          <>
            {FAULT_KIND_LABELS[f.kind]} ({f.conductors.replace('-', '–')}) ·{' '}
            {f.equipment
              ? `${f.equipment.assetTag}, ${lengthM !== null ? formatLength(lengthM, unit) : 'length not recorded'}`
              : 'no item recorded'}{' '}
            · opened {dates.dateTime(f.openedAt)} by {f.openedByName ?? 'someone'}
          </>
        }
        actions={
          <>
            <StatusMark {...statusLook[f.status]} label={FAULT_STATUS_LABELS[f.status]} size="lg" />
            <Link
              to={retest}
              className={`inline-flex min-h-touch items-center rounded-lg px-4 font-medium ${f.status === 'repaired' ? 'bg-brand text-white' : 'border border-line bg-card'}`}
            >
              Retest on the testing screen
            </Link>
          </>
        }
      />
      {f.status === 'repaired' && (
        <div className="mb-4">
          <Notice tone="caution">
            Repaired: retest every step of this item. The fault closes, and the strip can be clear, when they all pass.
          </Notice>
        </div>
      )}
      {f.status === 'closed' && (
        <div className="mb-4" data-testid="fault-closed">
          {f.dismissal ? (
            <Notice tone="info">
              Dismissed as a typing mistake {dates.dateTime(f.dismissal.at)} by {f.dismissal.byName ?? 'the technical director'}: “
              {f.dismissal.reason}”
            </Notice>
          ) : (
            <Notice tone="success">Closed {f.closedAt ? dates.dateTime(f.closedAt) : ''}: the retest passed.</Notice>
          )}
        </div>
      )}

      <Card className="mb-4">
        <h2 className="text-lg font-semibold">Where it is</h2>
        {shortenedSince && (
          <p className="mt-1 text-sm" data-testid="shortened-since">
            Located on the item as it was then, {formatLength(locatedOnM, unit)} long; it is {formatLength(lengthM, unit)} now, after a
            cut-out.
          </p>
        )}
        {drawnM !== null ? (
          <>
            <CableDrawing
              lengthM={drawnM}
              distanceM={shown?.distanceM}
              uncertaintyM={shown?.uncertaintyM}
              others={single.length > 1 ? single : []}
              unitSystem={unit}
              nearLabel="apparatus end"
              farLabel="far end"
            />
            {shown && single.length > 1 && (
              <p className="text-xs text-ink-soft">Cross and dashed band: the estimate used. Grey lines: the single estimates.</p>
            )}
          </>
        ) : (
          <p className="text-sm text-ink-soft">The item’s length is not recorded, so the cable cannot be drawn to scale.</p>
        )}
        {shown ? (
          <div className="mt-2 space-y-2 text-sm" data-testid="estimate">
            <p className="flex flex-wrap items-center gap-2 text-base">
              <strong>
                About {formatLength(shown.distanceM, unit)} ±{formatLength(shown.uncertaintyM, unit)} from the apparatus end
                {drawnM !== null
                  ? ` (${formatLength(drawnM - shown.distanceM, unit)} from the far end${shortenedSince ? ` of the ${formatLength(drawnM, unit)} it was then` : ''})`
                  : ''}
              </strong>
              {shown.count > 1 && (
                <StatusMark
                  shape={shown.agree ? 'circle' : 'octagon'}
                  tone={shown.agree ? 'pass' : 'brass'}
                  label={shown.agree ? 'Estimates agree' : 'Estimates disagree'}
                  size="sm"
                />
              )}
            </p>
            <p>{shown.count > 1 || shown.apart.length > 0 ? shown.explanation : f.estimates.find((e) => used.has(e.id))?.explanation}</p>
          </div>
        ) : (
          <p className="mt-2 text-sm text-ink-soft">Not located yet. Choose a method below.</p>
        )}
        {f.estimates.length > 0 && (
          <details className="mt-3 text-sm">
            <summary className="min-h-touch cursor-pointer py-2 font-medium">Saved estimates ({f.estimates.length})</summary>
            <ol className="divide-y divide-line">
              {f.estimates.map((e, i) => (
                <li key={e.id} className="py-2" data-testid="saved-estimate">
                  <strong>
                    {i + 1}. {title(e.method)}
                  </strong>
                  : {formatLength(e.distanceM, unit)} ±{formatLength(e.uncertaintyM, unit)} from the{' '}
                  {e.fromEnd === 'near' ? 'apparatus end' : 'far end'}
                  {e.itemLengthM !== null ? ` of the ${formatLength(e.itemLengthM, unit)} item` : ''} · {e.createdByName ?? ''},{' '}
                  {dates.dateTime(e.createdAt)}
                  {e.itemShortenedSince && (
                    <p className="font-medium">
                      Worked out when the item was {formatLength(e.itemLengthM!, unit)} long; it has been shortened since.
                    </p>
                  )}
                  {apartOf.has(e.id) && <p className="font-medium">Not weighed in with the others: {apartOf.get(e.id)}</p>}
                  <p className="text-ink-soft">{e.explanation}</p>
                </li>
              ))}
            </ol>
          </details>
        )}
      </Card>

      <div className="grid gap-4 lg:grid-cols-2">
        {canWrite && active && (
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Locate</h2>
            {/* A new kind, pair or length (after a cut-out) starts the form again from what is known. */}
            <LocateForm
              key={`${f.kind} ${f.conductors} ${f.prefill.lengthM ?? ''}`}
              unitSystem={unit}
              methods={methodsForFault(f.kind, f.conductors)}
              prefill={f.prefill}
              conductors={f.conductors}
              askFromEnd
              layout="narrow"
              submitLabel="Estimate and save"
              pendingLabel="Working out…"
              answeredNote="Saved."
              onSubmit={async (request, fromEnd) => {
                const { estimate } = await add.mutateAsync({ ...request, fromEnd });
                return {
                  method: estimate.method,
                  distanceM: estimate.distanceM,
                  uncertaintyM: estimate.uncertaintyM,
                  explanation: estimate.explanation,
                  ...(estimate.fromOtherEndM !== null ? { fromOtherEndM: estimate.fromOtherEndM } : {}),
                  ...(estimate.faultOhm !== null ? { faultOhm: estimate.faultOhm } : {}),
                };
              }}
            />
          </Card>
        )}
        {canWrite && active && (
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Repair</h2>
            <RepairForm fault={f} unitSystem={unit} />
            <p className="mt-4">
              <Link to={retest} className="inline-flex min-h-touch items-center rounded-lg border border-brand px-4 font-medium text-brand">
                Retest the affected steps →
              </Link>
            </p>
          </Card>
        )}
      </div>

      {f.canDismiss && (
        <Card className="mt-4">
          <h2 className="mb-2 text-lg font-semibold">A typing mistake?</h2>
          <DismissForm fault={f} />
        </Card>
      )}

      <Card className="mt-4">
        <h2 className="mb-3 text-lg font-semibold">Photos, scope traces and files</h2>
        <AttachmentsPanel
          ownerType="fault"
          ownerId={f.id}
          canUpload={canWrite}
          unitSystem={unit}
          faultId={f.id}
          canSaveEstimate={canWrite && active}
          onEstimateSaved={() => void qc.invalidateQueries({ queryKey: faultQueryOptions(f.id).queryKey })}
        />
      </Card>

      {f.repairs.length > 0 && (
        <Card className="mt-4">
          <h2 className="mb-2 text-lg font-semibold">Repairs</h2>
          <ul className="divide-y divide-line text-sm">
            {f.repairs.map((r) => (
              <li key={r.id} className="py-2">
                <strong>{ACTION_LABELS[r.action]}</strong>
                {r.action === 'cut-out' && r.lengthBeforeM !== null && r.lengthRemovedM !== null
                  ? `: ${formatLength(r.lengthRemovedM, unit)} removed, ${formatLength(r.lengthBeforeM, unit)} → ${formatLength(r.lengthBeforeM - r.lengthRemovedM, unit)}`
                  : ''}
                {r.action === 'swapped' && f.currentEquipment ? `: ${f.currentEquipment.assetTag} put in` : ''} · {r.createdByName ?? ''},{' '}
                {dates.dateTime(r.createdAt)}
                {r.notes && <p className="text-ink-soft">{r.notes}</p>}
                <div className="mt-3 rounded-lg border border-line p-3">
                  <h3 className="mb-2 font-medium">Photos and files of this repair</h3>
                  <AttachmentsPanel
                    ownerType="repair"
                    ownerId={r.id}
                    canUpload={canWrite}
                    unitSystem={unit}
                    label={`Photos and files of the repair: ${ACTION_LABELS[r.action]}`}
                  />
                </div>
              </li>
            ))}
          </ul>
        </Card>
      )}

      <Card className="mt-4 overflow-x-auto">
        <h2 className="mb-2 text-lg font-semibold">Readings of this item</h2>
        <StepReadings steps={f.steps} faultStepId={f.stepId} />
      </Card>

      <Card className="mt-4">
        <h2 className="mb-2 text-lg font-semibold">Notes</h2>
        <FaultNotes fault={f} canWrite={canWrite} />
      </Card>
    </TimeZoneProvider>
  );
}
