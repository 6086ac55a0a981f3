import { Link, useParams } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { formatLength, formatOhm } from '@shared/domain/units';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { FAULT_KIND_LABELS, FAULT_STATUS_LABELS } from '@shared/schemas/faults';
import { useMe } from '@/features/auth/api/get-me';
import { faultQueryOptions, useFault } from '@/features/faults/api/get-fault';
import { useQueryClient } from '@tanstack/react-query';
import { AttachmentsPanel } from '@/features/attachments/components/attachments-panel';
import { FaultNotes } from '@/features/faults/components/fault-notes';
import { LocateForm } from '@/features/faults/components/locate-form';
import { RepairForm } from '@/features/faults/components/repair-form';
import { DismissForm } from '@/features/faults/components/dismiss-form';
import { METHOD_LABELS, type LocateMethod } from '@/features/faults/utils/methods';
import { CableDrawing } from '@/components/ui/cable-drawing';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';

const statusLook = {
  open: { shape: 'triangle', tone: 'fail' },
  located: { shape: 'diamond', tone: 'fail' },
  repaired: { shape: 'half', tone: 'near' },
  closed: { shape: 'circle', tone: 'pass' },
} as const;
const verdictLook = { pass: ['circle', 'pass', 'Pass'], 'near-limit': ['diamond', 'near', 'Near limit'], fail: ['triangle', 'fail', 'Fail'] } as const;
const ACTION_LABELS = { 'cut-out': 'Section cut out', 'connector-remade': 'Connector remade', swapped: 'Swapped', retired: 'Retired' } as const;

type FaultStep = NonNullable<ReturnType<typeof useFault>['data']>['steps'][number];
const ohmText = (r: { overRange: boolean; valueOhm: number | null }) => (r.overRange ? 'OL' : formatOhm(r.valueOhm ?? 0));
const stepCol = createColumnHelper<FaultStep>();
const stepColumns = [
  stepCol.display({ id: 'step', header: 'Step', cell: (c) => `${TEST_KIND_LABELS[c.row.original.testKind]} ${c.row.original.conductors}`, meta: { className: 'pr-3' } }),
  stepCol.accessor('latest', { header: 'Latest', cell: (c) => (c.getValue() ? ohmText(c.getValue()!) : '—'), meta: { className: 'pr-3', cellClassName: 'tabular-nums' } }),
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
  stepCol.accessor('readings', { header: 'Earlier', cell: (c) => c.getValue().slice(1, 4).map(ohmText).join(', ') || '—', meta: { cellClassName: 'text-xs text-ink-soft' } }),
];
const stepsLook = { table: 'w-full text-left text-sm', head: 'border-b border-line text-xs uppercase tracking-wide text-ink-soft', th: 'py-2', row: 'border-b border-line last:border-0', td: 'py-2' };

/** The latest reading of each step of the item, the fault's own step marked. */
function StepReadings({ steps, faultStepId }: { steps: FaultStep[]; faultStepId: string | null }) {
  const table = useReactTable({ data: steps, columns: stepColumns, getCoreRowModel: getCoreRowModel(), getRowId: (s) => s.id });
  return <DataTable table={table} look={stepsLook} rowProps={(row) => ({ className: row.original.id === faultStepId ? 'bg-fail-soft/50' : undefined })} />;
}

/** A fault: where it is on the cable, how to locate it, the repair, and the way back to the retest. */
export default function FaultPage() {
  const { faultId = '' } = useParams();
  const fault = useFault(faultId);
  const me = useMe();
  const qc = useQueryClient();
  if (fault.isPending) return <Loading />;
  if (fault.isError) return <Notice tone="error">{fault.error.message}</Notice>;
  const f = fault.data;
  const unit = me.data?.unitSystem ?? 'metric';
  const canWrite = me.data?.role === 'technician' || me.data?.role === 'director';
  const active = f.status !== 'closed';
  const lengthM = f.equipment?.lengthM ?? f.lengthM;
  const retest = `${paths.stripTest(f.stripId)}?position=${f.positionId}`;

  const single = f.estimates.flatMap((e) => (e.distanceFromNearM !== null ? [{ distanceM: e.distanceFromNearM, uncertaintyM: e.uncertaintyM }] : []));
  const shown = f.combined ?? null;

  return (
    <>
      <PageHeader
        title={`Fault on ${f.stripLabel} · ${f.positionName}`}
        subtitle={
          <>
            {FAULT_KIND_LABELS[f.kind]} ({f.conductors.replace('-', '–')}) · {f.equipment ? `${f.equipment.assetTag}, ${lengthM !== null ? formatLength(lengthM, unit) : 'length not recorded'}` : 'no item recorded'} · opened{' '}
            {new Date(f.openedAt).toLocaleString()} by {f.openedByName ?? 'someone'}
          </>
        }
        actions={
          <>
            <StatusMark {...statusLook[f.status]} label={FAULT_STATUS_LABELS[f.status]} size="lg" />
            <Link to={retest} className={`inline-flex min-h-touch items-center rounded-lg px-4 font-medium ${f.status === 'repaired' ? 'bg-brand text-white' : 'border border-line bg-card'}`}>
              Retest on the testing screen
            </Link>
          </>
        }
      />
      {f.status === 'repaired' && (
        <div className="mb-4">
          <Notice tone="caution">Repaired: retest every step of this item. The fault closes, and the strip can be clear, when they all pass.</Notice>
        </div>
      )}
      {f.status === 'closed' && (
        <div className="mb-4" data-testid="fault-closed">
          {f.dismissal ? (
            <Notice tone="info">
              Dismissed as a typing mistake {new Date(f.dismissal.at).toLocaleString()} by {f.dismissal.byName ?? 'the technical director'}: “{f.dismissal.reason}”
            </Notice>
          ) : (
            <Notice tone="success">Closed {f.closedAt ? new Date(f.closedAt).toLocaleString() : ''}: the retest passed.</Notice>
          )}
        </div>
      )}

      <Card className="mb-4">
        <h2 className="text-lg font-semibold">Where it is</h2>
        {lengthM !== null ? (
          <>
            <CableDrawing
              lengthM={lengthM}
              distanceM={shown?.distanceM}
              uncertaintyM={shown?.uncertaintyM}
              others={single.length > 1 ? single : []}
              unitSystem={unit}
              nearLabel="apparatus end"
              farLabel="far end"
            />
            {shown && single.length > 1 && <p className="text-xs text-ink-soft">Cross and dashed band: the estimate used. Grey lines: the single estimates.</p>}
          </>
        ) : (
          <p className="text-sm text-ink-soft">The item’s length is not recorded, so the cable cannot be drawn to scale.</p>
        )}
        {shown ? (
          <div className="mt-2 space-y-2 text-sm" data-testid="estimate">
            <p className="flex flex-wrap items-center gap-2 text-base">
              <strong>
                About {formatLength(shown.distanceM, unit)} ±{formatLength(shown.uncertaintyM, unit)} from the apparatus end
                {lengthM !== null ? ` (${formatLength(lengthM - shown.distanceM, unit)} from the far end)` : ''}
              </strong>
              {shown.count > 1 && <StatusMark shape={shown.agree ? 'circle' : 'triangle'} tone={shown.agree ? 'pass' : 'near'} label={shown.agree ? 'Estimates agree' : 'Estimates disagree'} size="sm" />}
            </p>
            <p>{shown.count > 1 ? shown.explanation : f.estimates[f.estimates.length - 1]?.explanation}</p>
          </div>
        ) : (
          <p className="mt-2 text-sm text-ink-soft">Not located yet. Choose a method below.</p>
        )}
        {f.estimates.length > 0 && (
          <details className="mt-3 text-sm">
            <summary className="min-h-touch cursor-pointer py-2 font-medium">Saved estimates ({f.estimates.length})</summary>
            <ul className="divide-y divide-line">
              {f.estimates.map((e) => (
                <li key={e.id} className="py-2">
                  <strong>{METHOD_LABELS[e.method as LocateMethod] ?? e.method}</strong>: {formatLength(e.distanceM, unit)} ±{formatLength(e.uncertaintyM, unit)} from the{' '}
                  {e.fromEnd === 'near' ? 'apparatus end' : 'far end'} · {e.createdByName ?? ''}, {new Date(e.createdAt).toLocaleString()}
                  <p className="text-ink-soft">{e.explanation}</p>
                </li>
              ))}
            </ul>
          </details>
        )}
      </Card>

      <div className="grid gap-4 lg:grid-cols-2">
        {canWrite && active && (
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Locate</h2>
            <LocateForm key={f.kind + f.conductors} fault={f} unitSystem={unit} />
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
                {r.action === 'swapped' && f.currentEquipment ? `: ${f.currentEquipment.assetTag} put in` : ''} · {r.createdByName ?? ''}, {new Date(r.createdAt).toLocaleString()}
                {r.notes && <p className="text-ink-soft">{r.notes}</p>}
                <div className="mt-3 rounded-lg border border-line p-3">
                  <h3 className="mb-2 font-medium">Photos and files of this repair</h3>
                  <AttachmentsPanel ownerType="repair" ownerId={r.id} canUpload={canWrite} unitSystem={unit} label={`Photos and files of the repair: ${ACTION_LABELS[r.action]}`} />
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
    </>
  );
}
