import { useState } from 'react';
import { formatOhm, parseReading } from '@shared/domain/units';
import { Button } from '@/components/ui/button';

/** The test leads' own resistance, measured tips together once per session and subtracted from every reading. */
export function LeadNull({ valueOhm, onChange }: { valueOhm: number | null; onChange: (ohm: number | null) => void }) {
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  if (!editing) {
    return (
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <span>
          Test-lead null: <strong className="tabular-nums">{valueOhm === null ? 'not set' : formatOhm(valueOhm)}</strong>
        </span>
        <Button variant="secondary" onClick={() => setEditing(true)}>
          {valueOhm === null ? 'Null the leads' : 'Change'}
        </Button>
      </div>
    );
  }
  return (
    <form
      className="flex flex-wrap items-center gap-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        const p = parseReading(text, 'resistance');
        if (!p.ok) return setError(p.message);
        if (p.overRange || p.value === null || p.value > 10) return setError('Touch the probe tips together: the leads should read well under 10 Ω.');
        onChange(p.value);
        setEditing(false);
        setError(null);
      }}
    >
      <label htmlFor="lead-null">Leads with tips touching read</label>
      <input id="lead-null" autoFocus inputMode="decimal" className="min-h-touch w-24 rounded-lg border border-line bg-card px-2 text-base" value={text} onChange={(e) => setText(e.target.value)} />
      <Button type="submit">Save</Button>
      {valueOhm !== null && (
        <Button variant="ghost" onClick={() => { onChange(null); setEditing(false); }}>
          Clear
        </Button>
      )}
      {error && <p role="alert" className="w-full text-fail">{error}</p>}
    </form>
  );
}
