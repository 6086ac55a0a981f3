import { useState } from 'react';
import { Button } from '@/components/ui/button';
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
  const [draft, setChosen] = useState<string[] | null>(null);
  const chosen = draft ?? plan.technicians.map((t) => t.id);
  const same = chosen.length === plan.technicians.length && plan.technicians.every((t) => chosen.includes(t.id));
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        if (await onSave(chosen)) setChosen(null);
      }}
    >
      <fieldset>
        <legend className="mb-1 text-sm font-medium">Technicians who test this venue</legend>
        {people.map((p) => (
          <label key={p.id} className="flex min-h-touch items-center gap-3">
            <input
              type="checkbox"
              className="size-5 accent-brand"
              checked={chosen.includes(p.id)}
              onChange={(e) => setChosen(e.target.checked ? [...chosen, p.id] : chosen.filter((x) => x !== p.id))}
            />
            <span>
              {p.name} <span className="text-sm text-ink-soft">{p.email}</span>
            </span>
          </label>
        ))}
      </fieldset>
      <Button type="submit" variant="secondary" disabled={same}>
        Save technicians
      </Button>
    </form>
  );
}
