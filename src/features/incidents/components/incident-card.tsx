import { useSyncExternalStore } from 'react';
import { onlineManager } from '@tanstack/react-query';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { swapSchema, type SwapInput } from '@shared/schemas/incidents';
import { READING_SYMBOLS, STRIP_SYMBOLS } from '@shared/domain/symbols';
import type { EquipmentKind } from '@shared/domain/limits';
import { showServerErrors } from '@/lib/form-errors';
import { minutesOutOfService } from '@shared/domain/out-of-service';
import { minutesText } from '@/lib/minutes';
import { useNow } from '@/lib/use-now';
import { useDates } from '@/lib/date-format';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { Card, Loading, Notice } from '@/components/ui/card';
import { SymbolMark, StatusMark } from '@/components/ui/status-mark';
import { useIncident, type IncidentDetail, type RetestStep } from '../api/get-incident';
import { useSwapSpare } from '../api/swap-spare';
import { useResolveIncident } from '../api/resolve-incident';
import type { Spare } from '../api/get-spares';
import { missingFromError, stepWords } from '../utils/missing-steps';

export interface CardPosition {
  id: string;
  name: string;
  equipmentKind: EquipmentKind;
  assetTag: string | null;
}

const WHY: Record<RetestStep['why'], string> = {
  'after-swap': 'the spare’s connection',
  'after-incident': 'measure again',
  standing: 'must still pass',
};

function RetestList({ detail }: { detail: IncidentDetail }) {
  const { steps, openFaults } = detail.retest;
  const shown = steps.filter((s) => s.why !== 'standing' || !s.done);
  const standingDone = steps.filter((s) => s.why === 'standing' && s.done).length;
  return (
    <div>
      <h3 className="font-semibold">Before it goes back in service</h3>
      <ul className="mt-2 flex flex-col gap-1" data-testid="retest-steps">
        {shown.map((s) => (
          <li key={s.stepId} className="flex flex-wrap items-center gap-2 text-sm" data-done={s.done ? 'yes' : 'no'} data-why={s.why}>
            <SymbolMark
              look={s.done ? READING_SYMBOLS.pass : READING_SYMBOLS['not-measured']}
              label={s.done ? 'Done' : 'To measure'}
              size="sm"
            />
            <span>
              {stepWords(s)}
              {s.assetTag ? ` (${s.assetTag})` : ''} — {WHY[s.why]}
            </span>
          </li>
        ))}
      </ul>
      {standingDone > 0 && <p className="mt-1 text-xs text-ink-soft">{standingDone} other required steps of the strip still pass.</p>}
      {openFaults > 0 && <p className="mt-1 text-sm text-fail">{openFaults} fault(s) on this strip are not closed yet.</p>}
    </div>
  );
}

function SwapForm({ detail, positions, spares }: { detail: IncidentDetail; positions: CardPosition[]; spares: Spare[] }) {
  const swap = useSwapSpare(detail.incident.id);
  const form = useForm<SwapInput>({
    resolver: zodResolver(swapSchema),
    defaultValues: { positionId: detail.incident.positionId ?? '', replacementAssetTag: '' },
  });
  const positionId = useWatch({ control: form.control, name: 'positionId' });
  const kind = positions.find((p) => p.id === positionId)?.equipmentKind;
  // Only spares still in the pool and of the position's kind fit; tested ones first.
  const fitting = spares
    .filter((s) => !s.usedIn && (!kind || s.equipment.kind === kind))
    .sort((a, b) => Number(b.tested) - Number(a.tested));
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-3"
      onSubmit={form.handleSubmit(async (body) => {
        try {
          await swap.mutateAsync(body);
          form.reset({ positionId: body.positionId, replacementAssetTag: '' });
        } catch (err) {
          showServerErrors(form.setError, err, 'The swap could not be recorded.');
        }
      })}
    >
      <SelectField label="Position" className="min-w-48" {...form.register('positionId')} error={form.formState.errors.positionId?.message}>
        <option value="">Choose…</option>
        {positions.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}
            {p.assetTag ? ` (${p.assetTag})` : ''}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Spare to put in"
        className="min-w-56"
        {...form.register('replacementAssetTag')}
        error={form.formState.errors.replacementAssetTag?.message}
      >
        <option value="">{fitting.length === 0 ? 'No spare of this kind left' : 'Choose…'}</option>
        {fitting.map((s) => (
          <option key={s.equipment.id} value={s.equipment.assetTag}>
            {s.equipment.assetTag} · {s.tested ? 'tested' : 'not tested: full checklist'}
          </option>
        ))}
      </SelectField>
      <Button type="submit" className="min-h-14!" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? 'Swapping…' : 'Swap it in'}
      </Button>
      {form.formState.errors.root && (
        <div className="w-full">
          <Notice tone="error">{form.formState.errors.root.message}</Notice>
        </div>
      )}
    </form>
  );
}

/**
 * An open incident on the testing screen: how long the strip has been out, the swap of a spare,
 * the steps the strip needs before it is back, and resolving (a refusal lists what is missing).
 */
export function IncidentCard({
  incidentId,
  positions,
  spares,
  canWrite,
}: {
  incidentId: string;
  positions: CardPosition[];
  spares: Spare[];
  canWrite: boolean;
}) {
  const q = useIncident(incidentId);
  const resolve = useResolveIncident(incidentId);
  const now = useNow();
  const dates = useDates();
  // Swaps and resolving are not queued on the tablet: they need the server's answer there and then.
  const online = useSyncExternalStore(onlineManager.subscribe.bind(onlineManager), () => onlineManager.isOnline());
  if (q.isPending) return <Loading label="Loading the incident…" />;
  if (q.isError) return <Notice tone="error">{q.error.message}</Notice>;
  const detail = q.data;
  const { incident } = detail;
  const look = STRIP_SYMBOLS['out-of-service'];
  const missing = missingFromError(resolve.error);
  const minutes = incident.status === 'open' ? minutesOutOfService(incident.openedAt, now) : incident.minutesOutOfService;
  return (
    <Card className="mb-4 flex flex-col gap-4 border-2 border-fail/60" data-testid="incident-card" data-state={incident.status}>
      <div className="flex flex-wrap items-center gap-3">
        {incident.status === 'open' ? (
          <StatusMark shape={look.shape} tone={look.tone} label={`${look.label} · ${minutesText(minutes)}`} size="lg" />
        ) : (
          <SymbolMark look={READING_SYMBOLS.pass} label={`Back in service after ${minutesText(minutes)}`} size="lg" />
        )}
        <span className="text-base">
          <strong>{incident.symptom}</strong>
          {incident.positionName ? ` · ${incident.positionName}` : ''}
          {incident.equipment ? ` (${incident.equipment.assetTag})` : ''}
        </span>
        <span className="text-sm text-ink-soft">
          opened {dates.time(incident.openedAt)}
          {incident.openedByName ? ` by ${incident.openedByName}` : ''}
        </span>
      </div>
      {incident.swaps.length > 0 && (
        <ul className="text-sm" aria-label="Swaps">
          {incident.swaps.map((s) => (
            <li key={s.id}>
              {s.positionName}: {s.removed?.assetTag ?? 'empty'} → <strong>{s.replacement.assetTag}</strong>
              {s.spareTested ? ' · a tested spare: its connection only (continuity)' : ' · not tested here: its whole checklist'}
              {s.removed ? ` · ${s.removed.assetTag} goes to the register to inspect` : ''}
            </li>
          ))}
        </ul>
      )}
      {incident.status === 'open' && canWrite && !online && (
        <Notice tone="caution">
          Offline: readings are kept and sent later, but a swap and putting the strip back in service need the network.
        </Notice>
      )}
      {incident.status === 'open' && canWrite && online && <SwapForm detail={detail} positions={positions} spares={spares} />}
      {incident.status === 'open' && <RetestList detail={detail} />}
      {incident.status === 'open' && canWrite && online && (
        <div className="flex flex-wrap items-center gap-3">
          <Button className="min-h-14!" onClick={() => resolve.mutate()} disabled={resolve.isPending}>
            {resolve.isPending ? 'Checking…' : 'Back in service'}
          </Button>
          {!detail.retest.complete && (
            <span className="text-sm text-ink-soft">{detail.retest.missing.length} step(s) still to measure.</span>
          )}
        </div>
      )}
      {missing.length > 0 && (
        <div data-testid="resolve-missing">
          <Notice tone="error">
            <strong>Not yet: these still need a passing reading taken after the incident opened.</strong>
            <ul className="mt-1 list-disc pl-5">
              {missing.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          </Notice>
        </div>
      )}
      {resolve.isError && missing.length === 0 && <Notice tone="error">{resolve.error.message}</Notice>}
      {incident.status === 'resolved' && !incident.amendment && (
        <Notice tone="info">Resolved. The technical director now amends the venue to issue this strip a new certificate.</Notice>
      )}
    </Card>
  );
}
