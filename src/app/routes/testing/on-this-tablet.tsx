import { useState } from 'react';
import { useMe } from '@/features/auth/api/get-me';
import { useOutbox } from '@/features/offline/hooks/use-outbox';
import { QueueList } from '@/features/offline/components/queue-list';
import { moveToStep } from '@/features/offline/stores/outbox';
import type { QueuedReading } from '@/features/offline/utils/queue';
import { IncidentQueue } from '@/features/offline/components/incident-queue';
import { useStrip } from '@/features/testing/api/get-strip';
import { stepTitle } from '@/features/testing/components/step-row';
import { previewReading } from '@/features/testing/utils/preview';
import { Button } from '@/components/ui/button';
import { Loading, Notice, PageHeader } from '@/components/ui/card';

/** "Record it on another step": the steps of the same strip, each judged for the same value. */
function MoveToStep({ item }: { item: QueuedReading }) {
  const strip = useStrip(item.stripId);
  const [stepId, setStepId] = useState('');
  const [error, setError] = useState<string | null>(null);
  if (!strip.data?.profile)
    return (
      <span className="text-sm text-ink-soft">
        {strip.isPending ? 'Loading the strip’s steps…' : 'The strip’s steps are not on this tablet.'}
      </span>
    );
  const data = strip.data;
  const profile = {
    name: data.profile!.name,
    version: data.profile!.version,
    rules: data.profile!.rules,
    loopRequired: data.profile!.loopRequired,
  };
  const choices = data.positions.flatMap((p) =>
    p.steps.filter((s) => s.id !== item.body.stepId).map((s) => ({ step: s, position: p, label: `${p.name} · ${stepTitle(s)}` })),
  );
  const fieldId = `move-${item.id}`;
  return (
    <form
      className="flex flex-wrap items-center gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        const c = choices.find((x) => x.step.id === stepId);
        if (!c) return setError('Choose the step the value belongs to.');
        const p = previewReading(
          item.body.value,
          {
            profile,
            equipmentKind: c.position.equipmentKind,
            testKind: c.step.testKind,
            conductors: c.step.conductors,
            lengthM: c.position.equipment?.lengthM ?? null,
          },
          item.leadNull?.valueOhm ?? null,
        );
        if (p.state !== 'judged') return setError(p.state === 'invalid' ? p.message : 'The value cannot be judged on that step.');
        void moveToStep(item.id, {
          stepId: c.step.id,
          where: `${data.label} · ${c.label}`,
          preview: { verdict: p.verdict.verdict, display: p.display, explanation: p.verdict.explanation },
        });
      }}
    >
      <label htmlFor={fieldId} className="text-sm font-medium">
        Record it on
      </label>
      <select
        id={fieldId}
        className="min-h-touch rounded-lg border border-line bg-card px-2"
        value={stepId}
        onChange={(e) => {
          setStepId(e.target.value);
          setError(null);
        }}
      >
        <option value="">another step of {data.label}…</option>
        {choices.map((c) => (
          <option key={c.step.id} value={c.step.id}>
            {c.label}
          </option>
        ))}
      </select>
      <Button type="submit">Record it there</Button>
      {error && (
        <p role="alert" className="w-full text-sm text-fail">
          {error}
        </p>
      )}
    </form>
  );
}

/** Readings on this tablet: what waits to be sent, what needs the technician, what was set aside. */
export default function OnThisTabletPage() {
  const me = useMe();
  const outbox = useOutbox();
  if (!outbox.loaded) return <Loading />;
  const mine = outbox.items.filter((i) => i.userId === me.data?.id);
  const others = outbox.items.length - mine.length;
  return (
    <>
      <PageHeader
        title="Readings on this tablet"
        subtitle="Readings are kept here as soon as they are typed, and sent in the order typed whenever there is a network. Nothing is dropped: a reading the server refuses waits here for you."
      />
      {!outbox.online && (
        <div className="mb-4">
          <Notice tone="caution">
            This tablet is offline. Keep testing: every reading is kept here and sent when the network is back.
          </Notice>
        </div>
      )}
      <IncidentQueue items={outbox.incidents.filter((i) => i.userId === me.data?.id)} />
      <QueueList
        items={mine}
        online={outbox.online}
        syncing={outbox.syncing}
        lastStop={outbox.lastStop}
        moveTo={(item) => <MoveToStep item={item} />}
      />
      {others > 0 && (
        <p className="mt-6 text-sm text-ink-soft">
          {others} more reading{others === 1 ? ' was' : 's were'} typed here by someone else; {others === 1 ? 'it is' : 'they are'} sent
          when they sign in again.
        </p>
      )}
    </>
  );
}
