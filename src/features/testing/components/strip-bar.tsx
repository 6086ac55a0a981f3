import type { ReactNode } from 'react';
import { MarkIcon, type MarkShape, type MarkTone } from '@/components/ui/status-mark';

/**
 * Always on screen while testing (sticky): the strip's name, how much of it is measured (readings
 * still on this tablet count, and are said), and the sync state in words.
 */
export function StripBar({
  label,
  done,
  total,
  waiting,
  sync,
  children,
}: {
  label: string;
  done: number;
  total: number;
  waiting: number;
  sync: { state: string; words: string; shape: MarkShape; tone: MarkTone };
  children?: ReactNode;
}) {
  const percent = total === 0 ? 0 : Math.round((done / total) * 100);
  return (
    <div
      data-testid="strip-bar"
      className="sticky top-0 z-20 -mx-4 mb-3 flex min-h-11 flex-wrap items-center gap-x-4 gap-y-1 border-b border-line bg-card/95 px-4 py-1 text-sm shadow-sm backdrop-blur"
    >
      <strong className="text-base">{label}</strong>
      <span className="flex items-center gap-2" data-testid="strip-bar-progress">
        <span
          role="progressbar"
          aria-label="Steps measured on this strip"
          aria-valuemin={0}
          aria-valuemax={total}
          aria-valuenow={done}
          className="h-2 w-24 overflow-hidden rounded-full bg-idle-soft"
        >
          <span className="block h-full bg-brand" style={{ width: `${percent}%` }} />
        </span>
        <span className="tabular-nums">
          {done} of {total} measured{waiting > 0 ? ` · ${waiting} waiting to send` : ''}
        </span>
      </span>
      <span className="flex items-center gap-1.5 font-medium" data-testid="strip-bar-sync" data-state={sync.state}>
        <MarkIcon shape={sync.shape} tone={sync.tone} className="size-4" />
        {sync.words}
      </span>
      {children && <span className="ml-auto flex flex-wrap items-center gap-2">{children}</span>}
    </div>
  );
}
