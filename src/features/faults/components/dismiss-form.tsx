import { useState } from 'react';
import { DISMISSAL_REASON_MIN } from '@shared/schemas/faults';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import type { FaultDetail } from '../api/get-fault';
import { useDismissFault } from '../api/dismiss-fault';

/**
 * For the event's director: close a fault that was a typing mistake, with a sentence saying why.
 * The reason goes in the audit trail and on the certificate; any other fault closes by a repair
 * and a passing retest.
 */
export function DismissForm({ fault }: { fault: FaultDetail }) {
  const dismiss = useDismissFault(fault.id);
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const length = reason.trim().length;
  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Dismiss as a typing mistake…
      </Button>
    );
  }
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (length < DISMISSAL_REASON_MIN) return;
        dismiss.mutate({ version: fault.version, body: { reason: reason.trim() } });
      }}
    >
      <p className="text-sm">
        Only for a fault opened by a mistyped value: the reading should be corrected first, so its latest value passes. The fault closes
        without a repair, and the reason is printed on the certificate’s annex with your name.
      </p>
      <label htmlFor={`dismiss-${fault.id}`} className="text-sm font-medium">
        Why it was a typing mistake (at least {DISMISSAL_REASON_MIN} characters)
      </label>
      <textarea
        id={`dismiss-${fault.id}`}
        rows={3}
        className="rounded-lg border border-line bg-card p-2 text-base"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        aria-describedby={`dismiss-${fault.id}-count`}
      />
      <p id={`dismiss-${fault.id}-count`} className="text-xs text-ink-soft">
        {length < DISMISSAL_REASON_MIN ? `${DISMISSAL_REASON_MIN - length} more characters needed.` : 'Ready to dismiss.'}
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" disabled={length < DISMISSAL_REASON_MIN || dismiss.isPending}>
          {dismiss.isPending ? 'Dismissing…' : 'Dismiss this fault'}
        </Button>
        <Button variant="ghost" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
      {dismiss.isError && <Notice tone="error">{dismiss.error.message}</Notice>}
    </form>
  );
}
