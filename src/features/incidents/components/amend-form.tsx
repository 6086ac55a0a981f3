import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { amendmentSchema, type AmendmentInput } from '@shared/schemas/incidents';
import { showServerErrors } from '@/lib/form-errors';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/card';
import { minutesText } from '@/lib/minutes';
import type { Incident } from '../api/get-venue-incidents';

/**
 * The director amends the signed-off venue for the incidents chosen: each strip gets a new strip
 * certificate, the venue certificate stays valid. The password confirms it, as at sign-off.
 */
export function AmendForm({ incidents, onAmend }: { incidents: Incident[]; onAmend: (body: AmendmentInput) => Promise<unknown> }) {
  const form = useForm<AmendmentInput>({
    resolver: zodResolver(amendmentSchema),
    defaultValues: { password: '', incidentIds: incidents.map((i) => i.id) },
  });
  const chosen = useWatch({ control: form.control, name: 'incidentIds' }) ?? [];
  const toggle = (id: string) =>
    form.setValue('incidentIds', chosen.includes(id) ? chosen.filter((x) => x !== id) : [...chosen, id], {
      shouldValidate: form.formState.isSubmitted,
    });
  const strips = new Set(incidents.filter((i) => chosen.includes(i.id)).map((i) => i.stripLabel));
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={form.handleSubmit(async (body) => {
        try {
          await onAmend(body);
          form.reset({ password: '', incidentIds: [] });
        } catch (err) {
          showServerErrors(form.setError, err, 'The venue could not be amended.');
          form.setValue('password', '');
        }
      })}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-medium">Resolved incidents to amend for</legend>
        {incidents.map((i) => (
          <label key={i.id} className="flex min-h-14! cursor-pointer items-center gap-3 rounded-lg border border-line bg-paper px-3">
            <input type="checkbox" className="size-6" checked={chosen.includes(i.id)} onChange={() => toggle(i.id)} />
            <span>
              <strong>{i.stripLabel}</strong>
              {i.positionName ? `, ${i.positionName}` : ''} · {i.symptom}
              <span className="block text-xs text-ink-soft">
                out of service {minutesText(i.minutesOutOfService)}
                {i.swaps.length > 0
                  ? ` · ${i.swaps.map((s) => `${s.removed?.assetTag ?? 'empty'} → ${s.replacement.assetTag}`).join(', ')}`
                  : ''}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      {form.formState.errors.incidentIds && <Notice tone="error">{form.formState.errors.incidentIds.message}</Notice>}
      <TextField
        label="Your password, to confirm"
        type="password"
        autoComplete="current-password"
        {...form.register('password')}
        error={form.formState.errors.password?.message}
      />
      {form.formState.errors.root && <Notice tone="error">{form.formState.errors.root.message}</Notice>}
      <Button type="submit" className="min-h-14!" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting
          ? 'Issuing…'
          : `Amend: new certificate${strips.size === 1 ? '' : 's'} for ${strips.size} strip${strips.size === 1 ? '' : 's'}`}
      </Button>
    </form>
  );
}
