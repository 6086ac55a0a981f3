import { useState } from 'react';
import type { LengthSystem } from '@shared/domain/units';
import type { AttachmentDto, AttachmentOwnerType } from '@shared/schemas/attachments';
import { Button } from '@/components/ui/button';
import { Loading, Notice } from '@/components/ui/card';
import { useAttachments } from '../api/get-attachments';
import { formatBytes } from '../utils/idempotency-key';
import { TraceViewer } from './trace-viewer';
import { UploadControl } from './upload-control';
import { useDates } from '@/lib/date-format';

const KIND_LABEL = { photo: 'Photo', trace: 'Scope trace', pdf: 'PDF' } as const;

/**
 * Photos, scope traces and PDFs of a fault, a repair or a register item: upload (with the camera on
 * a tablet), previews of the photos, and each trace as a plot with movable markers.
 */
export function AttachmentsPanel({
  ownerType,
  ownerId,
  canUpload,
  unitSystem,
  faultId,
  canSaveEstimate = false,
  onEstimateSaved,
  label = 'Photos and files',
}: {
  ownerType: AttachmentOwnerType;
  ownerId: string;
  canUpload: boolean;
  unitSystem: LengthSystem;
  /** When traces may be saved as estimates of this fault. */
  faultId?: string;
  canSaveEstimate?: boolean;
  onEstimateSaved?: () => void;
  /** Names the section for assistive technology: several panels can share a page. */
  label?: string;
}) {
  const list = useAttachments(ownerType, ownerId);
  const { dateTime: when } = useDates();
  const [openTrace, setOpenTrace] = useState<string | null>(null);
  const items = list.data ?? [];
  const photos = items.filter((a) => a.kind === 'photo');
  const others = items.filter((a) => a.kind !== 'photo');
  const traces = items.filter((a) => a.kind === 'trace');
  const shownTrace = openTrace ?? traces[traces.length - 1]?.id ?? null;

  return (
    <section className="flex flex-col gap-4" aria-label={label}>
      {canUpload && <UploadControl ownerType={ownerType} ownerId={ownerId} camera />}
      {list.isPending && <Loading />}
      {list.isError && <Notice tone="error">{list.error.message}</Notice>}
      {list.data && items.length === 0 && <p className="text-sm text-ink-soft">No photos or files yet.</p>}

      {photos.length > 0 && (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Photos">
          {photos.map((p) => (
            <li key={p.id}>
              <a href={p.url} target="_blank" rel="noreferrer" className="block overflow-hidden rounded-lg border border-line bg-paper">
                {p.previewUrl ? (
                  <img src={p.previewUrl} alt={p.originalName} loading="lazy" className="aspect-[4/3] w-full object-cover" />
                ) : (
                  <span className="flex aspect-[4/3] items-center justify-center text-sm text-ink-soft">No preview</span>
                )}
              </a>
              <p className="mt-1 truncate text-xs text-ink-soft" title={p.originalName}>
                {p.originalName} · {p.createdByName ?? '—'} · {when(p.createdAt)}
              </p>
            </li>
          ))}
        </ul>
      )}

      {others.length > 0 && (
        <ul className="divide-y divide-line rounded-lg border border-line" aria-label="Files">
          {others.map((a) => (
            <FileRow
              key={a.id}
              a={a}
              open={a.id === shownTrace}
              onToggle={a.kind === 'trace' ? () => setOpenTrace(a.id === shownTrace ? '' : a.id) : undefined}
            />
          ))}
        </ul>
      )}

      {shownTrace && (
        <div className="rounded-lg border border-line p-3">
          <h3 className="mb-2 font-semibold">Trace {traces.find((t) => t.id === shownTrace)?.originalName}</h3>
          <TraceViewer
            attachmentId={shownTrace}
            faultId={faultId}
            canSave={canSaveEstimate}
            unitSystem={unitSystem}
            onSaved={onEstimateSaved}
          />
        </div>
      )}
    </section>
  );
}

function FileRow({ a, open, onToggle }: { a: AttachmentDto; open: boolean; onToggle?: (() => void) | undefined }) {
  const { dateTime: when } = useDates();
  return (
    <li className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
      <span className="min-w-0">
        <span className="font-medium">{KIND_LABEL[a.kind]}</span> <span className="break-all">{a.originalName}</span>
        <span className="block text-xs text-ink-soft">
          {formatBytes(a.size)} · {a.createdByName ?? '—'} · {when(a.createdAt)}
        </span>
      </span>
      <span className="flex gap-2">
        {onToggle && (
          <Button variant="ghost" onClick={onToggle} aria-expanded={open}>
            {open ? 'Hide plot' : 'Show plot'}
          </Button>
        )}
        <a
          href={a.url}
          className="inline-flex min-h-touch items-center rounded-lg px-3 font-medium text-brand hover:bg-brand-soft"
          download
        >
          Download
        </a>
      </span>
    </li>
  );
}
