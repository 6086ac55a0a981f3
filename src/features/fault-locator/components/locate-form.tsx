import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { FaultLocationAnswer } from '@shared/domain/fault-location';
import { LOCATE_METHODS, METHOD_DEFINITIONS, murrayLines, type LocateMethod, type SuggestedMethod } from '@shared/domain/fault-methods';
import type { FaultLocationRequest } from '@shared/schemas/fault-location';
import { roundSignificant, type LengthSystem } from '@shared/domain/units';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { fromSiValues, switchUnits, typeText, type Dimension, type UnitTexts } from '@/lib/unit-texts';
import {
  buildRequest,
  CONDUCTOR_SIZES,
  formFields,
  PER_METRE_SOURCE_LABELS,
  PER_METRE_SOURCES,
  unitFor,
  type FormField,
  type LocatorState,
} from '../utils/build-request';
import { EstimateResult } from './estimate-result';
import { MurraySketch } from './murray-sketch';

export interface LocatorPreset {
  /** A new id applies the preset again. */
  id: number;
  method: LocateMethod;
  texts: Record<string, string>;
}

/** What is known before anything is typed, in metres, Ω and Ω per metre; sent exactly as it is. */
export interface LocatePrefill {
  lengthM?: number | null;
  velocityFactor?: number | null;
  conductorOhm?: number | null;
  ohmPerMetre?: number | null;
  /** Where the Ω per length comes from, in words ("line C of this cable, end to end, read 0.45 Ω"). */
  ohmPerMetreSource?: string | null;
}

export interface LocateFormProps {
  unitSystem: LengthSystem;
  /** The methods offered, in order, with why each fits; every method (but the flex test) when absent. */
  methods?: SuggestedMethod[] | undefined;
  prefill?: LocatePrefill | undefined;
  /** The fault's conductors (e.g. A-C), to name the Murray loop's faulted and sound lines. */
  conductors?: string | undefined;
  preset?: LocatorPreset | undefined;
  /** Ask from which end the readings were taken (a saved estimate on a fault). */
  askFromEnd?: boolean;
  submitLabel: string;
  pendingLabel: string;
  /** Sends the readings; resolves to the server's answer. A refusal (ApiError) shows on the field it names. */
  onSubmit: (request: FaultLocationRequest, fromEnd: 'near' | 'far') => Promise<FaultLocationAnswer>;
  /** A pure computation may be asked again after an m ↔ ft switch, so its words follow; a save may not. */
  recheckOnUnitSwitch?: boolean;
  /** Form and result side by side (a page of its own) or one under the other (a card on the fault page). */
  layout?: 'wide' | 'narrow';
  /** Said before the server's explanation once it answers, e.g. "Saved." */
  answeredNote?: string;
}

const ALL_METHODS: SuggestedMethod[] = LOCATE_METHODS.filter((m) => m !== 'flex').map((method) => ({
  method,
  reason: METHOD_DEFINITIONS[method].suits,
}));

// Every length or resistance per length any method has, for rewriting them after an m ↔ ft switch.
const DIMENSIONS: Record<string, Dimension> = { lengthM: 'length', distanceM: 'length', uncertaintyM: 'length', ohmPerMetre: 'per-length' };

function initialState(method: LocateMethod, prefill: LocatePrefill | undefined, system: LengthSystem): LocatorState {
  const si: Record<string, number> = {};
  if (prefill?.lengthM) si.lengthM = prefill.lengthM;
  const fromReading = !!prefill?.conductorOhm;
  if (!fromReading && prefill?.ohmPerMetre) si.ohmPerMetre = prefill.ohmPerMetre;
  const values = fromSiValues(si, DIMENSIONS, system);
  if (prefill?.velocityFactor) values.texts.velocityFactor = String(roundSignificant(prefill.velocityFactor, 3));
  if (fromReading) values.texts.conductorOhm = String(prefill!.conductorOhm);
  return { method, values, perMetreSource: fromReading || !prefill?.ohmPerMetre ? 'reading' : 'value', conductorSize: 'mm2:0.75' };
}

interface ServerState {
  /** The request and end it answers, as JSON. */
  key: string;
  unitSystem: LengthSystem;
  pending: boolean;
  answer?: FaultLocationAnswer;
  error?: unknown;
}

/**
 * The one locate form: choose a method (those that fit the fault, the one to try first first,
 * each with why), type its readings as the meter shows them, see the estimate at once from the
 * shared engine, and send it to the server (to check, or to save on a fault). Labels, units and
 * help come from the one definition of each method (shared/domain/fault-methods.ts); lengths are
 * typed in the reader's units, and a prefilled value is sent exactly as it was.
 */
export function LocateForm({
  unitSystem,
  methods = ALL_METHODS,
  prefill,
  conductors,
  preset,
  askFromEnd = false,
  submitLabel,
  pendingLabel,
  onSubmit,
  recheckOnUnitSwitch = false,
  layout = 'wide',
  answeredNote,
}: LocateFormProps) {
  const [state, setState] = useState<LocatorState>(() => initialState(methods[0]!.method, prefill, unitSystem));
  const [fromEnd, setFromEnd] = useState<'near' | 'far'>('near');
  const [showMissing, setShowMissing] = useState(false);
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  const [seenPreset, setSeenPreset] = useState<number | undefined>(undefined);
  const [server, setServer] = useState<ServerState | null>(null);

  // Adjusting state while rendering (not in an effect) when the inputs from outside change.
  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setState((s) => ({ ...s, values: switchUnits(s.values, DIMENSIONS, seenSystem, unitSystem) }));
  }
  if (preset && preset.id !== seenPreset) {
    setSeenPreset(preset.id);
    setState((s) => ({
      ...s,
      method: preset.method,
      values: Object.entries(preset.texts).reduce<UnitTexts>((v, [k, t]) => typeText(v, k, t), s.values),
    }));
    setShowMissing(false);
  }

  const built = useMemo(() => buildRequest(state, unitSystem), [state, unitSystem]);
  const fields = formFields(state);
  const def = METHOD_DEFINITIONS[state.method];
  const offered = methods.find((m) => m.method === state.method);
  const requestKey = built.request ? JSON.stringify([built.request, fromEnd]) : null;
  const sameReadings = server !== null && requestKey !== null && server.key === requestKey;
  const current = sameReadings && server.unitSystem === unitSystem ? server : null;

  const submitRef = useRef(onSubmit);
  useEffect(() => {
    submitRef.current = onSubmit;
  });
  const send = useCallback(async (request: FaultLocationRequest, end: 'near' | 'far', system: LengthSystem) => {
    const key = JSON.stringify([request, end]);
    setServer({ key, unitSystem: system, pending: true });
    const settle = (patch: Partial<ServerState>) =>
      setServer((s) => (s && s.key === key && s.unitSystem === system ? { ...s, pending: false, ...patch } : s));
    try {
      settle({ answer: await submitRef.current(request, end) });
    } catch (error) {
      settle({ error });
    }
  }, []);
  // The server words its explanation in the reader's units: after a switch, ask it again in the new ones.
  const reask = recheckOnUnitSwitch && sameReadings && !current && !server.pending && server.answer ? built.request : null;
  useEffect(() => {
    if (reask) void send(reask, fromEnd, unitSystem);
  }, [reask, fromEnd, unitSystem, send]);

  const serverFieldErrors: Record<string, string> = {};
  if (current?.error instanceof ApiError) for (const e of current.error.errors) serverFieldErrors[e.path] ??= e.message;
  const errorFor = (name: string): string | undefined =>
    serverFieldErrors[name] ?? built.errors[name] ?? (showMissing && built.missing.includes(name) ? 'Needed for this method.' : undefined);
  const shown = new Set(fields.map((f) => f.input.name));
  const otherErrors = [...new Map([...Object.entries(built.errors), ...Object.entries(serverFieldErrors)]).entries()].filter(
    ([k]) => !shown.has(k),
  );
  const answer = current?.answer ?? built.answer;
  const lengthM = typeof built.request?.lengthM === 'number' ? built.request.lengthM : undefined;
  const lines = conductors ? murrayLines(conductors) : null;
  const set = (name: string, text: string) => setState((s) => ({ ...s, values: typeText(s.values, name, text) }));
  // The Ω per length as it came from the cable's own reading or its size, not yet edited.
  const prefilledUnchanged = (name: string) =>
    (name === 'conductorOhm' && prefill?.conductorOhm != null && state.values.texts.conductorOhm === String(prefill.conductorOhm)) ||
    (name === 'ohmPerMetre' && prefill?.ohmPerMetre != null && state.values.exact.ohmPerMetre === prefill.ohmPerMetre);

  const form = (
    <form
      noValidate
      aria-label="Readings"
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        setShowMissing(true);
        if (built.request) void send(built.request, fromEnd, unitSystem);
      }}
    >
      <fieldset>
        <legend className="mb-2 text-sm font-medium text-ink">Method</legend>
        <div className="flex flex-wrap gap-2">
          {methods.map((m, i) => (
            <label
              key={m.method}
              className="inline-flex min-h-touch cursor-pointer items-center gap-1 rounded-lg border border-line bg-card px-3 text-sm font-medium has-checked:border-brand has-checked:bg-brand has-checked:text-white has-focus-visible:outline-3 has-focus-visible:outline-brass"
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
              {METHOD_DEFINITIONS[m.method].title}
              {i === 0 && methods !== ALL_METHODS && methods.length > 1 && (
                <span className="text-xs font-normal opacity-80">(try first)</span>
              )}
            </label>
          ))}
        </div>
        {offered && methods !== ALL_METHODS && (
          <p className="mt-2 text-sm" data-testid="method-reason">
            <span className="font-medium">Why: </span>
            {offered.reason}
          </p>
        )}
        <p className="mt-2 text-sm text-ink-soft">
          {methods === ALL_METHODS ? `${def.suits} ` : ''}
          {def.help}
        </p>
      </fieldset>

      {state.method === 'murray' && <MurraySketch faultedLine={lines?.faulted} soundLine={lines?.sound} />}

      <div className={`grid gap-3 ${layout === 'narrow' ? 'sm:grid-cols-2' : ''}`}>
        {fields.map((field) =>
          field.input.quantity === 'per-length' && state.perMetreSource === 'size' ? null : (
            <ReadingField
              key={`${state.method}-${field.input.name}`}
              field={field}
              value={state.values.texts[field.input.name] ?? ''}
              onChange={(v) => set(field.input.name, v)}
              error={errorFor(field.input.name)}
              readAs={built.readAs[field.input.name]}
              unitSystem={unitSystem}
              suffix={
                state.method === 'murray' && lines
                  ? field.input.name === 'faultedArm'
                    ? lines.faulted
                    : field.input.name === 'soundArm'
                      ? lines.sound
                      : undefined
                  : undefined
              }
              source={prefilledUnchanged(field.input.name) ? (prefill?.ohmPerMetreSource ?? undefined) : undefined}
            />
          ),
        )}
        {askFromEnd && (
          <SelectField
            id="locate-fromEnd"
            label="Measured from"
            value={fromEnd}
            onChange={(e) => setFromEnd(e.target.value as 'near' | 'far')}
          >
            <option value="near">the apparatus end (near)</option>
            <option value="far">the far end</option>
          </SelectField>
        )}
      </div>

      {fields.some((f) => f.input.perMetre) && (
        <fieldset className="flex flex-col gap-3 rounded-lg border border-line p-3">
          <legend className="px-1 text-sm font-medium text-ink">Resistance of one conductor per length, from</legend>
          <div className="flex flex-wrap gap-2">
            {PER_METRE_SOURCES.map((source) => (
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
                {PER_METRE_SOURCE_LABELS[source]}
              </label>
            ))}
          </div>
          {state.perMetreSource === 'size' && (
            <SelectField
              id="locate-conductorSize"
              label="Conductor size"
              value={state.conductorSize}
              onChange={(e) => setState((s) => ({ ...s, conductorSize: e.target.value }))}
              error={errorFor('ohmPerMetre')}
              hint={
                built.readAs.ohmPerMetre ? `Maximum at 20 °C: ${built.readAs.ohmPerMetre}; real conductors read a little less.` : undefined
              }
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

      <div>
        <Button type="submit" disabled={server?.pending}>
          {server?.pending ? pendingLabel : submitLabel}
        </Button>
      </div>
    </form>
  );

  const result = (
    <div className="flex flex-col gap-3" aria-live="polite">
      {otherErrors.map(([key, message]) => (
        <Notice key={key} tone="error">
          {message}
        </Notice>
      ))}
      {current?.error !== undefined && !(current.error instanceof ApiError && current.error.errors.length > 0) && (
        <Notice tone="error">
          {current.error instanceof Error ? current.error.message : 'The server could not be reached; try again.'}
        </Notice>
      )}
      {current?.answer && answeredNote && (
        <Notice tone="success">
          {answeredNote} {current.answer.explanation}
        </Notice>
      )}
      {answer ? (
        <EstimateResult
          answer={answer}
          lengthM={lengthM}
          unitSystem={unitSystem}
          source={current?.answer ? 'server' : 'browser'}
          nearLabel={def.nearEnd}
          compact={layout === 'narrow'}
        />
      ) : (
        <p className="rounded-lg border border-dashed border-line p-6 text-center text-sm text-ink-soft">
          {Object.keys(built.errors).length > 0 || current?.error !== undefined
            ? 'Correct the reading marked in red to see the estimate.'
            : 'Fill in the readings to see where the fault is.'}
        </p>
      )}
    </div>
  );

  return layout === 'wide' ? (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      {form}
      {result}
    </div>
  ) : (
    <div className="flex flex-col gap-4">
      {form}
      {result}
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
  suffix,
  source,
}: {
  field: FormField;
  value: string;
  onChange: (value: string) => void;
  error: string | undefined;
  readAs: string | undefined;
  unitSystem: LengthSystem;
  /** Which line this is on the fault, e.g. "A". */
  suffix: string | undefined;
  /** Where a prefilled value comes from. */
  source: string | undefined;
}) {
  const { input, required } = field;
  const unit = unitFor(input.quantity, unitSystem);
  const label = `${input.label}${suffix ? ` (${suffix})` : ''}${unit ? ` (${unit})` : ''}${required ? '' : ' — optional'}`;
  return (
    <TextField
      id={`locate-${input.name}`}
      name={input.name}
      label={label}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      inputMode="decimal"
      autoComplete="off"
      placeholder={input.placeholder ? `e.g. ${input.placeholder}` : undefined}
      error={error}
      hint={source ? `From ${source}.` : readAs ? `Read as ${readAs}` : input.hint}
    />
  );
}
