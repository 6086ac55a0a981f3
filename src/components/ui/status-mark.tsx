// A status shown three ways at once: a shape, a word and a colour, so it reads without colour too.
// The shapes are drawn from the one symbol module the certificates use too.
import { SHAPE_PATHS, type SymbolLook, type SymbolShape, type SymbolTone } from '@shared/domain/symbols';

export type MarkShape = SymbolShape;
export type MarkTone = SymbolTone;

const fill: Record<MarkTone, string> = {
  pass: 'fill-pass stroke-pass',
  near: 'fill-near stroke-near',
  fail: 'fill-fail stroke-fail',
  idle: 'fill-idle stroke-idle',
  brand: 'fill-brand stroke-brand',
  brass: 'fill-brass stroke-brass',
};
const chip: Record<MarkTone, string> = {
  pass: 'bg-pass-soft text-pass border-pass/40',
  near: 'bg-near-soft text-near border-near/40',
  fail: 'bg-fail-soft text-fail border-fail/40',
  idle: 'bg-idle-soft text-ink-soft border-line',
  brand: 'bg-brand-soft text-brand border-brand/30',
  brass: 'bg-brass-soft text-ink border-brass/40',
};

export function MarkIcon({ shape, tone, className = 'size-4' }: { shape: MarkShape; tone: MarkTone; className?: string }) {
  const p = SHAPE_PATHS[shape];
  return (
    <svg aria-hidden viewBox="0 0 16 16" className={`shrink-0 ${fill[tone]} ${className}`} data-shape={shape}>
      {p.stroke && <path d={p.stroke} fill="none" strokeWidth="2" />}
      {p.fill && <path d={p.fill} stroke="none" />}
    </svg>
  );
}

/** A look from the symbol module, as a chip: `<Symbol look={READING_SYMBOLS.fail} />`. */
export function SymbolMark({ look, label, size = 'md' }: { look: SymbolLook; label?: string; size?: 'sm' | 'md' | 'lg' }) {
  return <StatusMark shape={look.shape} tone={look.tone} label={label ?? look.label} size={size} />;
}

export function StatusMark({
  shape,
  tone,
  label,
  size = 'md',
  className = '',
}: {
  shape: MarkShape;
  tone: MarkTone;
  label: string;
  size?: 'sm' | 'md' | 'lg';
  className?: string;
}) {
  const sizes = { sm: 'px-2 py-0.5 text-xs', md: 'px-2.5 py-1 text-sm', lg: 'px-3 py-1.5 text-base' };
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border font-semibold whitespace-nowrap ${chip[tone]} ${sizes[size]} ${className}`}
    >
      <MarkIcon shape={shape} tone={tone} className={size === 'lg' ? 'size-5' : 'size-3.5'} />
      {label}
    </span>
  );
}

export function ProgressBar({ done, total, label }: { done: number; total: number; label: string }) {
  const percent = total === 0 ? 0 : Math.round((done / total) * 100);
  return (
    <div>
      <div className="flex justify-between text-xs text-ink-soft">
        <span>{label}</span>
        <span>
          {done} of {total} ({percent} %)
        </span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={total}
        aria-valuenow={done}
        className="mt-1 h-2.5 overflow-hidden rounded-full bg-idle-soft"
      >
        <div className="h-full rounded-full bg-brand" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}
