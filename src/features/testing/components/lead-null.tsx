import { useState } from 'react';
import { v7 as uuidv7 } from 'uuid';
import { formatOhm, LEAD_NULL_MAX_OHM } from '@shared/domain/units';
import { parseLeadNull } from '@shared/domain/typed-reading';
import type { LeadNullRecord } from '@shared/schemas/lead-nulls';
import { Button } from '@/components/ui/button';
import { useDates } from '@/lib/date-format';

/**
 * The test leads' own resistance, measured tips together once per session and subtracted from this
 * technician's readings. Setting it makes a record (an id made here, so it can wait offline).
 */
export function LeadNull({
  leadNull,
  userId,
  onChange,
}: {
  leadNull: LeadNullRecord | null;
  userId: string;
  onChange: (n: LeadNullRecord | null) => void;
}) {
  const [editing, setEditing] = useState(false);
  const { time: clock } = useDates();
  const [text, setText] = useState('');
  const [meter, setMeter] = useState(leadNull?.meter ?? '');
  const [error, setError] = useState<string | null>(null);
  if (!editing) {
    return (
      <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="lead-null">
        <span>
          Test-lead null: <strong className="tabular-nums">{leadNull === null ? 'not set' : formatOhm(leadNull.valueOhm)}</strong>
          {leadNull && (
            <span className="text-ink-soft">
              {' '}
              · set {clock(leadNull.takenAt)}
              {leadNull.meter ? ` with ${leadNull.meter}` : ''} · subtracted from your readings
            </span>
          )}
        </span>
        <Button variant="secondary" onClick={() => setEditing(true)}>
          {leadNull === null ? 'Null the leads' : 'Null again'}
        </Button>
      </div>
    );
  }
  return (
    <form
      className="flex flex-wrap items-end gap-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        const p = parseLeadNull(text);
        if (!p.ok) return setError(p.message);
        onChange({
          id: uuidv7(),
          value: text.trim(),
          valueOhm: p.valueOhm,
          meter: meter.trim() || null,
          takenAt: new Date().toISOString(),
          userId,
        });
        setEditing(false);
        setText('');
        setError(null);
      }}
    >
      <label className="flex flex-col font-medium">
        Leads with tips touching read (Ω)
        <input
          id="lead-null"
          autoFocus
          inputMode="decimal"
          autoComplete="off"
          className="min-h-touch w-28 rounded-lg border border-line bg-card px-2 text-base"
          value={text}
          onChange={(e) => setText(e.target.value)}
        />
      </label>
      <label className="flex flex-col font-medium">
        Meter (optional)
        <input
          id="lead-null-meter"
          autoComplete="off"
          maxLength={80}
          className="min-h-touch w-40 rounded-lg border border-line bg-card px-2 text-base"
          value={meter}
          onChange={(e) => setMeter(e.target.value)}
        />
      </label>
      <Button type="submit">Save</Button>
      {leadNull !== null && (
        <Button
          variant="ghost"
          onClick={() => {
            onChange(null);
            setEditing(false);
          }}
        >
          No null
        </Button>
      )}
      <Button variant="ghost" onClick={() => setEditing(false)}>
        Cancel
      </Button>
      <p className="w-full text-xs text-ink-soft">
        At most {formatOhm(LEAD_NULL_MAX_OHM)}: leads that read more with their tips touching are worn; replace them.
      </p>
      {error && (
        <p role="alert" className="w-full text-fail">
          {error}
        </p>
      )}
    </form>
  );
}
