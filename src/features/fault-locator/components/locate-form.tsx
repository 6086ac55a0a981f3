import { useEffect, useMemo, useState } from 'react';
import { fromOhmPerMetre, type LengthSystem } from '@shared/domain/units';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { useLocateFault } from '../api/locate-fault';
import {
  activeFields,
  buildRequest,
  CONDUCTOR_SIZES,
  METHODS,
  methodDef,
  parseField,
  perLengthUnit,
  perMetreField,
  type FieldDef,
  type LocatorMethod,
  type LocatorState,
  type PerMetreSource,
} from '../utils/build-request';
import { pinLengthUnit } from '../utils/parse-inputs';
import { EstimateResult } from './estimate-result';

export interface LocatorPreset {
  /** A new id applies the preset again. */
  id: number;
  method: LocatorMethod;
  texts: Record<string, string>;
}

const SOURCE_LABELS: Record<PerMetreSource, string> = {
  reading: 'A sound conductor’s reading',
  size: 'Conductor size (table)',
  value: 'A value per length',
};

const INITIAL: LocatorState = { method: 'loop-both-ends', texts: {}, perMetreSource: 'reading', conductorSize: 'mm2:0.75' };

/**
 * Choose a method, type the readings, see the estimate at once (the shared engine runs here) and
 * have the server confirm it. Lengths are typed and shown in the user's unit system.
 */
export function LocateForm({ unitSystem, preset }: { unitSystem: LengthSystem; preset?: LocatorPreset | undefined }) {
  const [state, setState] = useState<LocatorState>(INITIAL);
  const [showMissing, setShowMissing] = useState(false);
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  const [seenPreset, setSeenPreset] = useState<number | undefined>(undefined);
  const locate = useLocateFault();

  // Adjusting state while rendering (not in an effect) when the inputs from outside change.
  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setState((s) => ({ ...s, texts: convertLengths(s.texts, seenSystem, unitSystem) }));
  }
  if (preset && preset.id !== seenPreset) {
    setSeenPreset(preset.id);
    setState((s) => ({ ...s, method: preset.method, texts: { ...s.texts, ...preset.texts } }));
    setShowMissing(false);
  }

  const built = useMemo(() => buildRequest(state, unitSystem), [state, unitSystem]);
  const fields = activeFields(state, unitSystem);
  const def = methodDef(state.method);
  const requestKey = built.request ? JSON.stringify(built.request) : null;
  const serverKey = locate.variables ? JSON.stringify(locate.variables.request) : null;
  const sameReadings = requestKey !== null && requestKey === serverKey;
  const serverCurrent = sameReadings && locate.variables?.unitSystem === unitSystem;
  // The server words its explanation in the user's units: after a switch, ask it again in the new ones.
  const reask = sameReadings && !serverCurrent && locate.isSuccess ? built.request : null;
  const { mutate } = locate;
  useEffect(() => {
    if (reask) mutate({ request: reask, unitSystem });
  }, [reask, unitSystem, mutate]);
  const serverAnswer = serverCurrent && locate.isSuccess ? locate.data : null;
  const serverError = serverCurrent && locate.error ? locate.error : null;
  const serverFieldErrors: Record<string, string> = {};
  if (serverError instanceof ApiError) for (const e of serverError.errors) serverFieldErrors[e.path] ??= e.message;

  const errorFor = (key: string): string | undefined =>
    serverFieldErrors[key] ?? built.errors[key] ?? (showMissing && built.missing.includes(key) ? 'Needed for this method.' : undefined);
  const shownKeys = new Set(fields.map((f) => f.key));
  const otherErrors = [...Object.entries(built.errors), ...Object.entries(serverFieldErrors)].filter(([k]) => !shownKeys.has(k));

  const set = (key: string, value: string) => setState((s) => ({ ...s, texts: { ...s.texts, [key]: value } }));
  const answer = serverAnswer ?? built.answer;
  const lengthM = typeof built.request?.lengthM === 'number' ? built.request.lengthM : undefined;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      <form
        noValidate
        aria-label="Readings"
        className="flex flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          setShowMissing(true);
          if (built.request) locate.mutate({ request: built.request, unitSystem });
        }}
      >
        <fieldset>
          <legend className="mb-2 text-sm font-medium text-ink">Method</legend>
          <div className="flex flex-wrap gap-2">
            {METHODS.map((m) => (
              <label
                key={m.method}
                className="inline-flex min-h-touch cursor-pointer items-center rounded-lg border border-line bg-card px-3 text-sm font-medium has-checked:border-brand has-checked:bg-brand has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-brass"
              >
                <input
                  type="radio"
                  name="method"
                  value={m.method}
                  className="sr-only"
                  checked={state.method === m.method}
                  onChange={() => {
                    setState((s) => ({ ...s, method: m.method }));
                    setShowMissing(false);
                  }}
                />
                {m.title}
              </label>
            ))}
          </div>
          <p className="mt-2 text-sm text-ink-soft">{def.when}</p>
        </fieldset>

        {fields.map((field) =>
          field.kind === 'per-length' && state.perMetreSource === 'size' ? null : (
            <ReadingField
              key={`${state.method}-${field.key}`}
              field={field}
              value={state.texts[field.key] ?? ''}
              onChange={(v) => set(field.key, v)}
              error={errorFor(field.key)}
              readAs={built.readAs[field.key]}
              unitSystem={unitSystem}
            />
          ),
        )}

        {def.perMetre && (
          <fieldset className="flex flex-col gap-3 rounded-lg border border-line p-3">
            <legend className="px-1 text-sm font-medium text-ink">Resistance of one conductor per length, from</legend>
            <div className="flex flex-wrap gap-2">
              {(['reading', 'size', 'value'] as const).map((source) => (
                <label
                  key={source}
                  className="inline-flex min-h-touch cursor-pointer items-center gap-2 rounded-lg border border-line px-3 text-sm has-checked:border-brand has-checked:bg-brand-soft"
                >
                  <input
                    type="radio"
                    name="perMetreSource"
                    value={source}
                    checked={state.perMetreSource === source}
                    onChange={() => setState((s) => ({ ...s, perMetreSource: source }))}
                  />
                  {SOURCE_LABELS[source]}
                </label>
              ))}
            </div>
            {state.perMetreSource === 'size' && (
              <SelectField
                id="locate-conductorSize"
                label={perMetreField('size', unitSystem).label}
                value={state.conductorSize}
                onChange={(e) => setState((s) => ({ ...s, conductorSize: e.target.value }))}
                error={errorFor('ohmPerMetre')}
                hint={built.readAs.ohmPerMetre ? `Maximum at 20 °C: ${built.readAs.ohmPerMetre}; real conductors read a little less.` : undefined}
              >
                {CONDUCTOR_SIZES.map((s) => (
                  <option key={s.value} value={s.value}>
                    {s.label}
                  </option>
                ))}
              </SelectField>
            )}
          </fieldset>
        )}

        <Button type="submit" disabled={locate.isPending}>
          {locate.isPending ? 'Checking…' : 'Calculate'}
        </Button>
      </form>

      <div className="flex flex-col gap-3" aria-live="polite">
        {otherErrors.map(([key, message]) => (
          <Notice key={key} tone="error">
            {message}
          </Notice>
        ))}
        {serverError && !(serverError instanceof ApiError && serverError.errors.length > 0) && (
          <Notice tone="error">{serverError.message}</Notice>
        )}
        {answer ? (
          <EstimateResult
            answer={answer}
            lengthM={lengthM}
            unitSystem={unitSystem}
            source={serverAnswer ? 'server' : 'browser'}
            nearLabel={state.method === 'murray' ? 'bridge end (near end)' : state.method === 'tdr' ? 'instrument end (near end)' : 'near end'}
          />
        ) : (
          <p className="rounded-lg border border-dashed border-line p-6 text-center text-sm text-ink-soft">
            {Object.keys(built.errors).length > 0 || serverError
              ? 'Correct the reading marked in red to see the estimate.'
              : 'Fill in the readings to see where the fault is.'}
          </p>
        )}
      </div>
    </div>
  );
}

function ReadingField({
  field,
  value,
  onChange,
  error,
  readAs,
  unitSystem,
}: {
  field: FieldDef;
  value: string;
  onChange: (value: string) => void;
  error: string | undefined;
  readAs: string | undefined;
  unitSystem: LengthSystem;
}) {
  const unit = unitFor(field, unitSystem);
  return (
    <TextField
      id={`locate-${field.key}`}
      name={field.key}
      label={unit ? `${field.label} (${unit})` : field.label}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      inputMode="decimal"
      autoComplete="off"
      placeholder={field.placeholder ? `e.g. ${field.placeholder}` : undefined}
      error={error}
      hint={readAs ? `Read as ${readAs}` : field.hint}
    />
  );
}

function unitFor(field: FieldDef, system: LengthSystem): string | null {
  switch (field.kind) {
    case 'resistance':
      return 'Ω';
    case 'capacitance':
      return 'nF';
    case 'time':
      return 'ns';
    case 'length':
      return system === 'imperial' ? 'ft' : 'm';
    default:
      return null;
  }
}

const BARE = /^\s*\d+(?:[.,]\d*)?\s*$/;

/** Length-dependent fields keep their value across the unit switch, so a typed 12 m stays 12 m. */
function convertLengths(texts: Record<string, string>, from: LengthSystem, to: LengthSystem): Record<string, string> {
  const out = { ...texts };
  if (texts.lengthM !== undefined) out.lengthM = pinLengthUnit(texts.lengthM, from);
  const perLength = texts.ohmPerMetre;
  if (perLength !== undefined && BARE.test(perLength)) {
    const parsed = parseField(perMetreField('value', from), perLength, from);
    if (parsed.ok) {
      const perUnit = fromOhmPerMetre(parsed.value, perLengthUnit(to));
      out.ohmPerMetre = String(Number(perUnit.toPrecision(4)));
    }
  }
  return out;
}
