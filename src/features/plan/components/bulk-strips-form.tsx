import { useForm, useWatch } from 'react-hook-form';
import { bulkStripsSchema, type BulkStripsInput } from '@shared/schemas/plan';
import { DEFAULT_POSITION_TEMPLATE } from '@shared/domain/checklist';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { messagesUnder } from '@/lib/form-errors';
import { bodyResolver } from '@/lib/form-resolver';

interface BulkForm {
  mode: 'count' | 'labels';
  count: string;
  prefix: string;
  startAt: string;
  labels: string;
  zone: string;
  conductivePiste: boolean;
}

/** What the form sends: a count with a prefix and start number, or the labels one per line. */
const toBody = (v: BulkForm, nextNumber: number): BulkStripsInput => {
  const common = { zone: v.zone.trim() || null, conductivePiste: v.conductivePiste };
  return v.mode === 'count'
    ? { ...common, count: Number(v.count), prefix: v.prefix, startAt: v.startAt ? Number(v.startAt) : nextNumber }
    : {
        ...common,
        labels: v.labels
          .split(/[\n,]/)
          .map((l) => l.trim())
          .filter(Boolean),
      };
};

/** Lay out strips in bulk: a count with a prefix and start number, or a list of labels. */
export function BulkStripsForm({ nextNumber, onAdd }: { nextNumber: number; onAdd: (v: BulkStripsInput) => Promise<boolean> }) {
  const form = useForm<BulkForm, unknown, BulkStripsInput>({
    resolver: bodyResolver(bulkStripsSchema, (v: BulkForm) => toBody(v, nextNumber)),
    // Every field holds a real value or stays empty: no example text that could pass for one.
    defaultValues: {
      mode: 'count',
      count: '8',
      prefix: 'Strip ',
      startAt: String(nextNumber),
      labels: '',
      zone: '',
      conductivePiste: false,
    },
  });
  const [mode, conductive] = useWatch({ control: form.control, name: ['mode', 'conductivePiste'] });
  const errors = form.formState.errors;
  // The schema's paths are the body's: `labels` and `labels.N` are one textarea here.
  const labelsError = messagesUnder(errors.labels)[0];
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (body) => {
        const added = body.count ?? body.labels?.length ?? 0;
        if (await onAdd(body)) form.reset({ ...form.getValues(), labels: '', startAt: String(nextNumber + added) });
      })}
    >
      <div role="radiogroup" aria-label="How to name the strips" className="flex gap-2">
        {(['count', 'labels'] as const).map((m) => (
          <label
            key={m}
            className={`flex min-h-touch flex-1 cursor-pointer items-center justify-center rounded-lg border px-3 text-sm font-medium ${mode === m ? 'border-brand bg-brand-soft' : 'border-line'}`}
          >
            <input type="radio" className="sr-only" value={m} {...form.register('mode')} />
            {m === 'count' ? 'Numbered' : 'My own labels'}
          </label>
        ))}
      </div>
      {mode === 'count' ? (
        <div className="grid grid-cols-3 gap-3">
          <TextField label="How many" inputMode="numeric" {...form.register('count')} error={errors.count?.message} />
          <TextField label="Prefix" {...form.register('prefix')} error={errors.prefix?.message} />
          <TextField label="Start at" inputMode="numeric" {...form.register('startAt')} error={errors.startAt?.message} />
        </div>
      ) : (
        <div className="flex flex-col gap-1">
          <label htmlFor="f-labels" className="text-sm font-medium">
            Labels (one per line or comma-separated)
          </label>
          <textarea
            id="f-labels"
            rows={3}
            className="rounded-lg border border-line bg-card p-3 aria-[invalid=true]:border-fail"
            aria-invalid={labelsError ? true : undefined}
            aria-describedby={labelsError ? 'f-labels-error' : 'f-labels-hint'}
            {...form.register('labels')}
          />
          {!labelsError && (
            <p id="f-labels-hint" className="text-xs text-ink-soft">
              For example Final, Red, Green.
            </p>
          )}
          {labelsError && (
            <p id="f-labels-error" role="alert" className="text-xs font-medium text-fail">
              {labelsError}
            </p>
          )}
        </div>
      )}
      <TextField
        label="Row or zone"
        hint="Optional, for example Row A. Left empty, the strips belong to no row."
        {...form.register('zone')}
        error={errors.zone?.message}
      />
      <label className="flex min-h-touch items-center gap-3">
        <input type="checkbox" className="size-5 accent-brand" {...form.register('conductivePiste')} />
        Conductive (metal) pistes
      </label>
      <p className="text-xs text-ink-soft">
        Each strip gets:{' '}
        {DEFAULT_POSITION_TEMPLATE.filter((p) => !p.pisteOnly || conductive)
          .map((p) => p.name.toLowerCase())
          .join(', ')}
        .
      </p>
      <Button type="submit">Add strips</Button>
    </form>
  );
}
