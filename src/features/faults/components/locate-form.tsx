import { useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { lengthUnitWord, parseDecimal, type LengthSystem } from '@shared/domain/units';
import type { FaultDetail } from '../api/get-fault';
import { useAddEstimate } from '../api/add-estimate';
import { fieldLabel, METHOD_FIELDS, METHOD_HINTS, METHOD_LABELS, methodsFor, type LocateMethod } from '../utils/methods';
import { fromSiValues, siOf, switchUnits, typeText, unitOf, type Dimension, type UnitTexts } from '../utils/unit-texts';

function dimensionsOf(method: LocateMethod): Record<string, Dimension | undefined> {
  return Object.fromEntries(METHOD_FIELDS[method].map((f) => [f.name, f.dimension]));
}

function prefillValues(method: LocateMethod, fault: FaultDetail, system: LengthSystem): UnitTexts {
  const si: Record<string, number> = {};
  for (const f of METHOD_FIELDS[method]) {
    const v = f.prefill ? fault.prefill[f.prefill] : null;
    if (v !== null && v !== undefined) si[f.name] = v;
  }
  return fromSiValues(si, dimensionsOf(method), system);
}

/**
 * Takes the readings of one method, sends them, and shows the refusal on the field it concerns.
 * Lengths are typed in the user's unit (m or ft), resistance per length per metre or per 1000 ft;
 * the body is in metres and Ω per metre.
 */
export function LocateForm({ fault, unitSystem }: { fault: FaultDetail; unitSystem: LengthSystem }) {
  const methods = methodsFor(fault.kind, fault.conductors);
  const [method, setMethod] = useState<LocateMethod>(methods[0]!);
  const [values, setValues] = useState<UnitTexts>(() => prefillValues(methods[0]!, fault, unitSystem));
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  const [fromEnd, setFromEnd] = useState<'near' | 'far'>('near');
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const add = useAddEstimate(fault.id);

  // Adjusting state while rendering when the person switches m ↔ ft: what is typed is converted.
  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setValues((v) => switchUnits(v, dimensionsOf(method), seenSystem, unitSystem));
    setFieldErrors({});
  }

  const pick = (m: LocateMethod) => {
    setMethod(m);
    setValues(prefillValues(m, fault, unitSystem));
    setFieldErrors({});
    add.reset();
  };

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={async (e) => {
        e.preventDefault();
        const body: Record<string, number | string> = { method, fromEnd };
        const errors: Record<string, string> = {};
        for (const f of METHOD_FIELDS[method]) {
          if ((values.texts[f.name] ?? '').trim() === '') {
            if (f.required) errors[f.name] = 'Needed for this method.';
            continue;
          }
          const n = f.dimension ? siOf(values, f.name, f.dimension, unitSystem) : parseDecimal(values.texts[f.name] ?? '');
          if (n === null) errors[f.name] = typeANumber(f.dimension, unitSystem);
          // The API's own refusals name its fields in metres; these say it without a unit.
          else if (f.dimension && n < 0) errors[f.name] = 'Cannot be negative.';
          else if (f.dimension && n === 0 && f.name !== 'distanceM') errors[f.name] = 'Must be more than 0.';
          else body[f.name] = n;
        }
        setFieldErrors(errors);
        if (Object.keys(errors).length > 0) return;
        try {
          await add.mutateAsync(body);
        } catch (err) {
          if (err instanceof ApiError) setFieldErrors(Object.fromEntries(err.errors.map((x) => [x.path, x.message])));
        }
      }}
    >
      <fieldset>
        <legend className="text-sm font-medium">Method</legend>
        <div className="mt-2 flex flex-wrap gap-2">
          {methods.map((m, i) => (
            <label key={m} className={`flex min-h-touch cursor-pointer items-center gap-2 rounded-lg border px-3 text-sm ${method === m ? 'border-brand bg-brand-soft font-semibold' : 'border-line bg-card'}`}>
              <input type="radio" name="method" value={m} checked={method === m} onChange={() => pick(m)} className="size-4" />
              {METHOD_LABELS[m]}
              {i === 0 && methods.length > 1 && <span className="text-xs text-ink-soft">(try first)</span>}
            </label>
          ))}
        </div>
      </fieldset>
      <p className="text-sm text-ink-soft">{METHOD_HINTS[method]}</p>
      <div className="grid gap-3 sm:grid-cols-2">
        {METHOD_FIELDS[method].map((f) => (
          <div key={f.name} className="flex flex-col gap-1">
            <label htmlFor={`loc-${f.name}`} className="text-sm font-medium">
              {fieldLabel(f, unitSystem)}
              {!f.required && <span className="font-normal text-ink-soft"> — optional</span>}
            </label>
            <input
              id={`loc-${f.name}`}
              name={f.name}
              inputMode="decimal"
              autoComplete="off"
              value={values.texts[f.name] ?? ''}
              onChange={(e) => setValues((v) => typeText(v, f.name, e.target.value))}
              aria-invalid={fieldErrors[f.name] ? true : undefined}
              aria-describedby={fieldErrors[f.name] ? `loc-${f.name}-error` : undefined}
              className="min-h-touch rounded-lg border border-line bg-card px-3 text-base tabular-nums aria-[invalid=true]:border-fail"
            />
            {f.prefill === 'ohmPerMetre' && fault.prefill.ohmPerMetreSource && !fieldErrors[f.name] && (
              <p className="text-xs text-ink-soft">From {fault.prefill.ohmPerMetreSource}.</p>
            )}
            {fieldErrors[f.name] && (
              <p id={`loc-${f.name}-error`} role="alert" className="text-xs font-medium text-fail">
                {fieldErrors[f.name]}
              </p>
            )}
          </div>
        ))}
        <div className="flex flex-col gap-1">
          <label htmlFor="loc-fromEnd" className="text-sm font-medium">
            Measured from
          </label>
          <select id="loc-fromEnd" value={fromEnd} onChange={(e) => setFromEnd(e.target.value as 'near' | 'far')} className="min-h-touch rounded-lg border border-line bg-card px-3">
            <option value="near">the apparatus end (near)</option>
            <option value="far">the far end</option>
          </select>
        </div>
      </div>
      {add.isError && <Notice tone="error">{add.error.message}</Notice>}
      {add.isSuccess && <Notice tone="success">Saved. {add.data.estimate.explanation}</Notice>}
      <div>
        <Button type="submit" disabled={add.isPending}>
          {add.isPending ? 'Working out…' : 'Estimate and save'}
        </Button>
      </div>
    </form>
  );
}

function typeANumber(dimension: Dimension | undefined, system: LengthSystem): string {
  if (dimension === 'length') return `Type a number, in ${lengthUnitWord(system)}.`;
  if (dimension === 'per-length') return `Type a number, in ${unitOf('per-length', system)}.`;
  return 'Type a number.';
}
