import { useState } from 'react';
import type { BulkStripsInput } from '@shared/schemas/plan';
import { DEFAULT_POSITION_TEMPLATE } from '@shared/domain/checklist';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';

/** Lay out strips in bulk: a count with a prefix and start number, or a list of labels. */
export function BulkStripsForm({ nextNumber, onAdd }: { nextNumber: number; onAdd: (v: BulkStripsInput) => Promise<boolean> }) {
  const [mode, setMode] = useState<'count' | 'labels'>('count');
  const [count, setCount] = useState('8');
  const [prefix, setPrefix] = useState('Strip ');
  const [startAt, setStartAt] = useState('');
  const [labels, setLabels] = useState('');
  const [zone, setZone] = useState('');
  const [conductive, setConductive] = useState(false);
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        const common = { zone: zone.trim() || null, conductivePiste: conductive };
        const body: BulkStripsInput =
          mode === 'count'
            ? { ...common, count: Number(count), prefix, startAt: startAt ? Number(startAt) : nextNumber }
            : { ...common, labels: labels.split(/[\n,]/).map((l) => l.trim()).filter(Boolean) };
        if (await onAdd(body)) {
          setLabels('');
          setStartAt('');
        }
      }}
    >
      <div role="radiogroup" aria-label="How to name the strips" className="flex gap-2">
        {(['count', 'labels'] as const).map((m) => (
          <label key={m} className={`flex min-h-touch flex-1 cursor-pointer items-center justify-center rounded-lg border px-3 text-sm font-medium ${mode === m ? 'border-brand bg-brand-soft' : 'border-line'}`}>
            <input type="radio" className="sr-only" name="mode" checked={mode === m} onChange={() => setMode(m)} />
            {m === 'count' ? 'Numbered' : 'My own labels'}
          </label>
        ))}
      </div>
      {mode === 'count' ? (
        <div className="grid grid-cols-3 gap-3">
          <TextField label="How many" name="count" inputMode="numeric" value={count} onChange={(e) => setCount(e.target.value)} />
          <TextField label="Prefix" name="prefix" value={prefix} onChange={(e) => setPrefix(e.target.value)} />
          <TextField label="Start at" name="startAt" inputMode="numeric" placeholder={String(nextNumber)} value={startAt} onChange={(e) => setStartAt(e.target.value)} />
        </div>
      ) : (
        <div className="flex flex-col gap-1">
          <label htmlFor="f-labels" className="text-sm font-medium">Labels (one per line or comma-separated)</label>
          <textarea id="f-labels" rows={3} className="rounded-lg border border-line bg-card p-3" value={labels} onChange={(e) => setLabels(e.target.value)} placeholder={'Final\nRed\nGreen'} />
        </div>
      )}
      <TextField label="Row or zone" name="zone" placeholder="Row A" value={zone} onChange={(e) => setZone(e.target.value)} />
      <label className="flex min-h-touch items-center gap-3">
        <input type="checkbox" className="size-5 accent-brand" checked={conductive} onChange={(e) => setConductive(e.target.checked)} />
        Conductive (metal) pistes
      </label>
      <p className="text-xs text-ink-soft">
        Each strip gets: {DEFAULT_POSITION_TEMPLATE.filter((p) => !p.pisteOnly || conductive).map((p) => p.name.toLowerCase()).join(', ')}.
      </p>
      <Button type="submit">Add strips</Button>
    </form>
  );
}
