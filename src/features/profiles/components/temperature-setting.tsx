import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { decimalProblem, parseDecimal } from '@shared/domain/units';
import { temperatureReferenceSchema, type UpdateProfileInput } from '@shared/schemas/limit-profile';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';

// The two choices as the form has them, turned into the body's temperatureReferenceC (null: as measured).
const temperatureFormSchema = z
  .object({ correct: z.enum(['no', 'yes']), referenceC: z.string() })
  .transform((v, ctx): Pick<UpdateProfileInput, 'temperatureReferenceC'> => {
    if (v.correct === 'no') return { temperatureReferenceC: null };
    const checked = temperatureReferenceSchema.safeParse(parseDecimal(v.referenceC));
    if (!checked.success || checked.data === null) {
      const problem = decimalProblem(v.referenceC, '°C');
      ctx.addIssue({
        code: 'custom',
        path: ['referenceC'],
        message: problem ?? checked.error?.issues[0]?.message ?? 'Type the reference temperature in °C, e.g. 20.',
      });
      return z.NEVER;
    }
    return { temperatureReferenceC: checked.data };
  });

/**
 * How the profile treats a cable's temperature: judged as measured (the default: the FIE
 * Material Rules give no reference temperature), or copper readings corrected to a reference
 * temperature, which is a house rule. Saving stores a new version, like a rule edit.
 */
export function TemperatureSetting({
  referenceC,
  canEdit,
  onSave,
}: {
  referenceC: number | null;
  canEdit: boolean;
  onSave: (body: Pick<UpdateProfileInput, 'temperatureReferenceC'>) => Promise<unknown>;
}) {
  const form = useForm<z.input<typeof temperatureFormSchema>, unknown, z.output<typeof temperatureFormSchema>>({
    resolver: zodResolver(temperatureFormSchema),
    defaultValues: { correct: referenceC === null ? 'no' : 'yes', referenceC: String(referenceC ?? 20) },
  });
  const correct = useWatch({ control: form.control, name: 'correct' });
  const { errors, isSubmitting, isDirty } = form.formState;

  return (
    <div className="mt-2 flex flex-col gap-3 text-sm">
      <p data-testid="temperature-rule">
        {referenceC === null ? (
          'Readings are judged as measured, whatever the cable’s temperature: the FIE Material Rules give no reference temperature.'
        ) : (
          <>
            Copper readings taken with a temperature are corrected to {referenceC} °C (IEC 60228 Annex B) before they are judged.{' '}
            <span className="rounded bg-brass-soft px-1.5 py-0.5 text-xs font-semibold">House rule</span>
          </>
        )}
      </p>
      {canEdit && (
        <form
          noValidate
          className="flex flex-col gap-2"
          onSubmit={form.handleSubmit(async (body) => {
            try {
              await onSave(body);
            } catch (err) {
              form.setError('root', { message: err instanceof Error ? err.message : 'Not saved.' });
            }
          })}
        >
          <fieldset className="flex flex-col gap-1">
            <legend className="sr-only">Cable temperature</legend>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" value="no" {...form.register('correct')} className="size-4" />
              Judge readings as measured (default)
            </label>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" value="yes" {...form.register('correct')} className="size-4" />
              Correct copper readings to a reference temperature (house rule)
            </label>
          </fieldset>
          {correct === 'yes' && (
            <TextField
              label="Reference temperature (°C)"
              id="f-temperatureReferenceC"
              inputMode="decimal"
              {...form.register('referenceC')}
              error={errors.referenceC?.message}
            />
          )}
          {errors.root?.message && <Notice tone="error">{errors.root.message}</Notice>}
          <Button type="submit" variant="secondary" disabled={!isDirty || isSubmitting}>
            {isSubmitting ? 'Saving…' : 'Save as a new version'}
          </Button>
        </form>
      )}
    </div>
  );
}
