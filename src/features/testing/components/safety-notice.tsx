import { useEffect, useRef, useState } from 'react';
import { acknowledgeSafety, safetyAcknowledged } from '../utils/session';

/** Shown on the first test run of a session; testing starts only once it is acknowledged. */
export function SafetyNotice({ onAcknowledged }: { onAcknowledged?: () => void }) {
  const [open, setOpen] = useState(() => !safetyAcknowledged());
  const button = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    if (open) button.current?.focus();
  }, [open]);
  if (!open) return null;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/60 p-4">
      <div
        role="alertdialog"
        aria-modal="true"
        aria-labelledby="safety-title"
        aria-describedby="safety-text"
        className="max-w-xl rounded-card border-2 border-brass bg-card p-6 shadow-xl"
      >
        <h2 id="safety-title" className="flex items-center gap-2 text-xl font-semibold">
          <svg aria-hidden viewBox="0 0 16 16" className="size-6 fill-brass">
            <path d="M8 1.5 15 14.5H1z" />
            <path d="M7.25 6h1.5v4.5h-1.5zM7.25 11.5h1.5V13h-1.5z" className="fill-ink" />
          </svg>
          Before you test
        </h2>
        <ul id="safety-text" className="mt-3 list-disc space-y-2 pl-5 text-base">
          <li>
            Test cables, reels and pistes only when they are <strong>disconnected from the scoring apparatus and from mains power</strong>.
          </li>
          <li>
            Use the multimeter’s resistance range. <strong>Never use a high-voltage insulation tester</strong> on anything still connected
            to an apparatus or other electronics.
          </li>
          <li>
            The venue’s mains installation and the hall’s earthing belong to a <strong>licensed electrician under local codes</strong>;
            these checks cover the competition equipment only.
          </li>
        </ul>
        <button
          ref={button}
          type="button"
          className="mt-5 inline-flex min-h-touch w-full items-center justify-center rounded-lg bg-brand px-4 font-medium text-white hover:bg-brand/90"
          onClick={() => {
            acknowledgeSafety();
            setOpen(false);
            onAcknowledged?.();
          }}
        >
          I understand — start testing
        </button>
      </div>
    </div>
  );
}
