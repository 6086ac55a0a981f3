import type { HTMLAttributes, ReactNode } from 'react';

export function Card({ className = '', ...props }: HTMLAttributes<HTMLDivElement>) {
  // A padding given by the caller replaces the default one (Tailwind classes do not override by order).
  const padding = /(^|\s)p[xytrbl]?-/.test(className) ? '' : 'p-5';
  return <div className={`rounded-card border border-line bg-card shadow-sm ${padding} ${className}`} {...props} />;
}

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-2xl font-semibold text-ink">{title}</h1>
        {subtitle && <p className="mt-1 text-sm text-ink-soft">{subtitle}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}

export function Notice({ tone = 'info', children }: { tone?: 'info' | 'caution' | 'error' | 'success'; children: ReactNode }) {
  const tones = {
    info: 'border-brand/30 bg-brand-soft text-ink',
    caution: 'border-brass/50 bg-brass-soft text-ink',
    error: 'border-fail/40 bg-fail-soft text-ink',
    success: 'border-pass/40 bg-pass-soft text-ink',
  };
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border px-4 py-3 text-sm ${tones[tone]}`}>
      {children}
    </div>
  );
}

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="py-8 text-center text-ink-soft">
      {label}
    </p>
  );
}
