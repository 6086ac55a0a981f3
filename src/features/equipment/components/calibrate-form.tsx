import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { calibrationSchema, type CalibrationInput } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { showServerErrors } from '@/lib/form-errors';
import { numberOrNull } from './labels';

/** Velocity factor from a known-good length: VF = 2L / (c · Δt). */
export function CalibrateForm({
  defaultLengthM,
  onCalibrate,
}: {
  defaultLengthM: number | null;
  onCalibrate: (v: CalibrationInput) => Promise<{ explanation: string }>;
}) {
  const form = useForm<CalibrationInput>({
    resolver: zodResolver(calibrationSchema),
    defaultValues: { lengthM: defaultLengthM ?? undefined },
  });
  const errors = form.formState.errors;
  const [done, setDone] = useState<string | null>(null);
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (v) => {
        try {
          setDone(null);
          const r = await onCalibrate(v);
          setDone(r.explanation);
        } catch (err) {
          showServerErrors(form.setError, err, 'Could not calibrate.');
        }
      })}
    >
      <p className="text-sm text-ink-soft">
        On a cable known to be good, measure the round trip to the far-end reflection with the TDR, cable disconnected from the apparatus.
      </p>
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="Round trip (ns)"
          inputMode="decimal"
          {...form.register('roundTripNs', { setValueAs: numberOrNull })}
          error={errors.roundTripNs?.message}
        />
        <TextField
          label="Known length (m)"
          inputMode="decimal"
          {...form.register('lengthM', { setValueAs: numberOrNull })}
          error={errors.lengthM?.message}
        />
      </div>
      {errors.root?.message && <Notice tone="error">{errors.root.message}</Notice>}
      {done && <Notice tone="success">{done}</Notice>}
      <Button type="submit" variant="secondary" disabled={form.formState.isSubmitting}>
        Calibrate
      </Button>
    </form>
  );
}
