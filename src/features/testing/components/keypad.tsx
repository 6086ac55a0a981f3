// The keypad beside the entry grid: keys of 56 px with 12 px between them (a gloved finger's
// target, common practice for touch kiosks), pressed without taking focus from the cell.
export type PadKey = '0' | '1' | '2' | '3' | '4' | '5' | '6' | '7' | '8' | '9' | '.' | 'k' | 'M' | 'OL' | 'back' | 'enter' | 'all-ol';

const KEYS: { key: PadKey; label: string; aria?: string; tone?: 'action' | 'unit' }[] = [
  { key: '7', label: '7' },
  { key: '8', label: '8' },
  { key: '9', label: '9' },
  { key: 'OL', label: 'OL', aria: 'OL: over range, record', tone: 'action' },
  { key: '4', label: '4' },
  { key: '5', label: '5' },
  { key: '6', label: '6' },
  { key: 'k', label: 'k', aria: 'kilo-ohm', tone: 'unit' },
  { key: '1', label: '1' },
  { key: '2', label: '2' },
  { key: '3', label: '3' },
  { key: 'M', label: 'M', aria: 'mega-ohm', tone: 'unit' },
  { key: '.', label: '.', aria: 'decimal point' },
  { key: '0', label: '0' },
  { key: 'back', label: '⌫', aria: 'delete' },
  { key: 'enter', label: 'Record', tone: 'action' },
];

export function Keypad({ onKey, disabled, allInsulation }: { onKey: (key: PadKey) => void; disabled: boolean; allInsulation: boolean }) {
  const press = (key: PadKey) => ({
    // Keep the focus (and the on-screen keyboard's absence) in the cell being typed.
    onPointerDown: (e: React.PointerEvent) => e.preventDefault(),
    onClick: () => onKey(key),
  });
  return (
    <div className="flex flex-col gap-3" data-testid="keypad">
      <div className="grid grid-cols-[repeat(4,3.5rem)] gap-3">
        {KEYS.map((k) => (
          <button
            key={k.key}
            type="button"
            tabIndex={-1}
            disabled={disabled}
            aria-label={k.aria}
            data-key={k.key}
            className={`size-14 rounded-lg border text-lg font-semibold disabled:opacity-40 ${k.tone === 'action' ? 'border-brand bg-brand text-white' : k.tone === 'unit' ? 'border-line bg-paper' : 'border-line bg-card'} ${k.key === 'enter' ? 'text-sm' : ''}`}
            {...press(k.key)}
          >
            {k.label}
          </button>
        ))}
      </div>
      {allInsulation && (
        <button
          type="button"
          tabIndex={-1}
          disabled={disabled}
          data-key="all-ol"
          className="h-14 w-[15.5rem] rounded-lg border-2 border-brand bg-card text-base font-semibold text-brand disabled:opacity-40"
          {...press('all-ol')}
        >
          All insulation OL (A)
        </button>
      )}
      {/* One line at 14 px, so the strip keeps its one screen (Enter is the Record key itself). */}
      <p className="text-sm whitespace-nowrap text-ink-soft">Keys: O = OL · A = all insulation OL</p>
    </div>
  );
}
