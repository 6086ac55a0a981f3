import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { venueTechniciansSchema } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { keepTyped } from '@/lib/form-values';
import type { PlanningPeople, VenuePlan } from '../api/types';

export function TechniciansForm({
  plan,
  people,
  onSave,
}: {
  plan: VenuePlan;
  people: PlanningPeople['technicians'];
  onSave: (userIds: string[]) => Promise<boolean>;
}) {
  const assigned = useMemo(() => plan.technicians.map((t) => t.id), [plan.technicians]);
  const form = useForm<z.input<typeof venueTechniciansSchema>, unknown, z.output<typeof venueTechniciansSchema>>({
    resolver: zodResolver(venueTechniciansSchema),
    values: useMemo(() => ({ userIds: assigned }), [assigned]),
    resetOptions: keepTyped,
  });
  const chosen = useWatch({ control: form.control, name: 'userIds' }) ?? [];
  const same = chosen.length === assigned.length && assigned.every((id) => chosen.includes(id));
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={form.handleSubmit(async ({ userIds }) => {
        if (await onSave(userIds)) form.reset({ userIds });
      })}
    >
      <fieldset>
        <legend className="mb-1 text-sm font-medium">Technicians who test this venue</legend>
        {people.map((p) => (
          <label key={p.id} className="flex min-h-touch items-center gap-3">
            <input type="checkbox" className="size-5 accent-brand" value={p.id} {...form.register('userIds')} />
            <span>
              {p.name} <span className="text-sm text-ink-soft">{p.email}</span>
            </span>
          </label>
        ))}
      </fieldset>
      {form.formState.errors.userIds?.message && (
        <p role="alert" className="text-xs font-medium text-fail">
          {form.formState.errors.userIds.message}
        </p>
      )}
      <Button type="submit" variant="secondary" disabled={same}>
        Save technicians
      </Button>
    </form>
  );
}
