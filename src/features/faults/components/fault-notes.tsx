import { useState } from 'react';
import { useIsFetching } from '@tanstack/react-query';
import { FAULT_KIND_LABELS, FAULT_STATUS_LABELS } from '@shared/schemas/faults';
import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { faultQueryOptions, type FaultDetail } from '../api/get-fault';
import { useUpdateFault } from '../api/update-fault';

/**
 * The fault's notes. A save carries the version the page loaded (If-Match); when someone saved
 * meanwhile the server answers 412 and both versions are shown: keep theirs, or put yours on top.
 */
export function FaultNotes({ fault, canWrite }: { fault: FaultDetail; canWrite: boolean }) {
  const update = useUpdateFault(fault.id);
  const [draft, setDraft] = useState<string | null>(null);
  // What this person tried to save when the 412 came back.
  const [mine, setMine] = useState<string | null>(null);
  // After a 412 the fault reloads; theirs is only shown, and mine only re-applied, on the fresh copy.
  const reloading = useIsFetching({ queryKey: faultQueryOptions(fault.id).queryKey }) > 0;

  if (!canWrite) return <p className="text-sm">{fault.notes ?? 'No notes.'}</p>;

  const save = (text: string, version: number) =>
    update.mutate(
      { version, patch: { notes: text.trim() || null } },
      {
        onSuccess: () => {
          setDraft(null);
          setMine(null);
        },
        onError: (err) => {
          if (err instanceof ApiError && err.status === 412) setMine(text);
        },
      },
    );

  if (mine !== null) {
    const waiting = update.isPending || reloading;
    return (
      <div data-testid="notes-conflict" className="flex flex-col gap-3">
        <Notice tone="caution">
          Someone else saved this fault while you were writing. Nothing is lost: here are both versions. Choose which one stays.
        </Notice>
        <div className="grid gap-3 md:grid-cols-2">
          <section aria-labelledby="notes-yours" className="rounded-lg border-2 border-brand/40 bg-brand-soft/40 p-3">
            <h3 id="notes-yours" className="text-sm font-semibold">
              Yours (not saved)
            </h3>
            <p className="mt-1 whitespace-pre-wrap text-base">{mine.trim() || <em className="text-ink-soft">no notes</em>}</p>
          </section>
          <section aria-labelledby="notes-theirs" className="rounded-lg border-2 border-line bg-paper p-3">
            <h3 id="notes-theirs" className="text-sm font-semibold">
              Theirs ({waiting ? 'loading…' : `saved now, version ${fault.version}`})
            </h3>
            <p className="mt-1 whitespace-pre-wrap text-base">{fault.notes?.trim() || <em className="text-ink-soft">no notes</em>}</p>
            <p className="mt-2 text-xs text-ink-soft">
              {FAULT_KIND_LABELS[fault.kind]} · {FAULT_STATUS_LABELS[fault.status]}
            </p>
          </section>
        </div>
        <div className="flex flex-wrap gap-2">
          <Button
            variant="secondary"
            disabled={waiting}
            onClick={() => {
              setMine(null);
              setDraft(null);
              update.reset();
            }}
          >
            Keep theirs
          </Button>
          <Button disabled={waiting} onClick={() => save(mine, fault.version)}>
            Re-apply mine over theirs
          </Button>
        </div>
      </div>
    );
  }

  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        save(draft ?? fault.notes ?? '', fault.version);
      }}
    >
      <label htmlFor="fault-notes" className="sr-only">
        Notes on this fault
      </label>
      <textarea
        id="fault-notes"
        rows={3}
        value={draft ?? fault.notes ?? ''}
        onChange={(e) => setDraft(e.target.value)}
        className="rounded-lg border border-line bg-card px-3 py-2 text-base"
      />
      {update.isError && !(update.error instanceof ApiError && update.error.status === 412) && (
        <Notice tone="error">{update.error.message}</Notice>
      )}
      <div>
        <Button type="submit" variant="secondary" disabled={draft === null || update.isPending}>
          Save notes
        </Button>
      </div>
    </form>
  );
}
