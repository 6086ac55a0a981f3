import { useState } from 'react';
import { parseDecimal } from '@shared/domain/units';
import type { UpdateProfileInput } from '@shared/schemas/limit-profile';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';

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
  const [correct, setCorrect] = useState(referenceC !== null);
  const [text, setText] = useState(String(referenceC ?? 20));
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const typed = parseDecimal(text);
  const wanted = correct ? typed : null;
  const changed = wanted !== referenceC;

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
          className="flex flex-col gap-2"
          onSubmit={async (e) => {
            e.preventDefault();
            if (correct && typed === null) return setError('Type the reference temperature in °C, e.g. 20.');
            setError(null);
            setSaving(true);
            try {
              await onSave({ temperatureReferenceC: wanted });
            } catch (err) {
              setError(err instanceof Error ? err.message : 'Not saved.');
            } finally {
              setSaving(false);
            }
          }}
        >
          <fieldset className="flex flex-col gap-1">
            <legend className="sr-only">Cable temperature</legend>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" name="temperature" checked={!correct} onChange={() => setCorrect(false)} className="size-4" />
              Judge readings as measured (default)
            </label>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" name="temperature" checked={correct} onChange={() => setCorrect(true)} className="size-4" />
              Correct copper readings to a reference temperature (house rule)
            </label>
          </fieldset>
          {correct && (
            <TextField label="Reference temperature (°C)" name="temperatureReferenceC" inputMode="decimal" value={text} onChange={(e) => setText(e.target.value)} />
          )}
          {error && <Notice tone="error">{error}</Notice>}
          <Button type="submit" variant="secondary" disabled={!changed || saving}>
            {saving ? 'Saving…' : 'Save as a new version'}
          </Button>
        </form>
      )}
    </div>
  );
}
