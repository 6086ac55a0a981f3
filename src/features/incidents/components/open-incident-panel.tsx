import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createIncidentSchema, type CreateIncidentInput } from '@shared/schemas/incidents';
import { OTHER_SYMBOLS } from '@shared/domain/symbols';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { MarkIcon } from '@/components/ui/status-mark';
import { COMMON_SYMPTOMS } from '../utils/symptoms';

export interface IncidentStrip {
  id: string;
  label: string;
  positions: { id: string; name: string }[];
}

const chip =
  'inline-flex min-h-14! items-center rounded-lg border-2 border-line bg-card px-4 text-base font-medium hover:border-fail hover:bg-fail-soft';

/**
 * Opening an incident in two taps: the button that shows this panel, then a symptom. Choosing the
 * item first is optional (the strip may simply be dark); an unusual symptom is typed.
 */
export function OpenIncidentPanel({
  strip,
  onOpen,
  onClose,
}: {
  strip: IncidentStrip;
  onOpen: (input: CreateIncidentInput) => Promise<unknown>;
  onClose: () => void;
}) {
  const [positionId, setPositionId] = useState<string | null>(null);
  const form = useForm<CreateIncidentInput>({
    resolver: zodResolver(createIncidentSchema),
    defaultValues: { stripId: strip.id, symptom: '' },
  });
  const submit = () =>
    form.handleSubmit(async (v) => {
      try {
        await onOpen({ ...v, positionId });
      } catch (err) {
        form.setError('root', { message: err instanceof Error ? err.message : 'The incident could not be opened.' });
      }
    })();
  const pick = (symptom: string) => {
    form.setValue('symptom', symptom);
    void submit();
  };
  const error = form.formState.errors.symptom?.message ?? form.formState.errors.root?.message;
  // A sheet over the page, from the bottom: the tapped tile may be anywhere on a long board.
  return (
    <div className="fixed inset-0 z-40 flex items-end justify-center bg-ink/40 p-3 sm:items-center">
      <section
        role="dialog"
        aria-modal="true"
        aria-label={`Open an incident on ${strip.label}`}
        className="flex max-h-full w-full max-w-3xl flex-col gap-4 overflow-y-auto rounded-card border-2 border-fail/50 bg-card p-4 shadow-lg"
        data-testid="open-incident"
      >
        <header className="flex items-center gap-3">
          <MarkIcon shape={OTHER_SYMBOLS['needs-you'].shape} tone="fail" className="size-6" />
          <h2 className="text-lg font-semibold">{strip.label}: what went wrong?</h2>
          <Button variant="ghost" className="ml-auto" onClick={onClose}>
            Cancel
          </Button>
        </header>
        {strip.positions.length > 0 && (
          <div role="group" aria-label="Which item (optional)" className="flex flex-wrap items-center gap-2">
            <span className="text-sm text-ink-soft">Item, if known:</span>
            {strip.positions.map((p) => (
              <button
                key={p.id}
                type="button"
                aria-pressed={positionId === p.id}
                onClick={() => setPositionId(positionId === p.id ? null : p.id)}
                className={`min-h-14! rounded-lg border-2 px-3 text-sm font-medium ${positionId === p.id ? 'border-brand bg-brand text-white' : 'border-line bg-paper'}`}
              >
                {p.name}
              </button>
            ))}
          </div>
        )}
        <div role="group" aria-label="Symptom" className="grid grid-cols-2 gap-3 md:grid-cols-3">
          {COMMON_SYMPTOMS.map((s) => (
            <button key={s} type="button" className={chip} disabled={form.formState.isSubmitting} onClick={() => pick(s)}>
              {s}
            </button>
          ))}
        </div>
        <form
          noValidate
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
        >
          <label className="flex min-w-64 flex-1 flex-col gap-1 text-sm font-medium">
            Something else
            <input
              className="min-h-14! rounded-lg border border-line bg-card px-3 text-base"
              autoComplete="off"
              aria-invalid={error ? true : undefined}
              {...form.register('symptom')}
            />
          </label>
          <Button type="submit" variant="danger" className="min-h-14!" disabled={form.formState.isSubmitting}>
            Open the incident
          </Button>
        </form>
        {error && <Notice tone="error">{error}</Notice>}
      </section>
    </div>
  );
}
