import { useRef } from 'react';
import { ATTACHMENT_ACCEPT, ATTACHMENT_MAX_BYTES, type AttachmentOwnerType } from '@shared/schemas/attachments';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { useUploadAttachment } from '../api/upload-attachment';
import { formatBytes } from '../utils/idempotency-key';

/**
 * Take a photo with the tablet's camera, or choose a file (photo, scope trace CSV, PDF). Shows the
 * upload's progress; a dropped upload can be sent again and is recognised, not stored twice. Says
 * that the server removes a photo's location and device serial before storing it.
 */
export function UploadControl({
  ownerType,
  ownerId,
  camera = true,
}: {
  ownerType: AttachmentOwnerType;
  ownerId: string;
  camera?: boolean;
}) {
  const { state, start, retry, reset } = useUploadAttachment(ownerType, ownerId);
  const cameraInput = useRef<HTMLInputElement>(null);
  const fileInput = useRef<HTMLInputElement>(null);
  const busy = state.phase === 'sending';

  const pick = (input: HTMLInputElement | null) => {
    const file = input?.files?.[0];
    if (input) input.value = '';
    if (file) start(file);
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-2">
        {camera && (
          <>
            <input
              ref={cameraInput}
              id={`camera-${ownerId}`}
              type="file"
              accept="image/*"
              capture="environment"
              className="sr-only"
              // Reached through the button beside it: out of the tab order, named the same.
              tabIndex={-1}
              aria-label="Take a photo"
              onChange={(e) => pick(e.currentTarget)}
              disabled={busy}
              data-testid="camera-input"
            />
            <Button onClick={() => cameraInput.current?.click()} disabled={busy}>
              Take a photo
            </Button>
          </>
        )}
        <input
          ref={fileInput}
          id={`file-${ownerId}`}
          type="file"
          accept={`${ATTACHMENT_ACCEPT},image/*`}
          className="sr-only"
          tabIndex={-1}
          aria-label="Attach a file"
          onChange={(e) => pick(e.currentTarget)}
          disabled={busy}
          data-testid="file-input"
        />
        <Button variant="secondary" onClick={() => fileInput.current?.click()} disabled={busy}>
          Attach a file
        </Button>
      </div>
      <p className="text-xs text-ink-soft">
        Photos (JPEG, PNG, WebP, HEIC) up to {formatBytes(ATTACHMENT_MAX_BYTES.photo)}, scope traces (CSV: time in s, volts) up to{' '}
        {formatBytes(ATTACHMENT_MAX_BYTES.trace)}, PDFs up to {formatBytes(ATTACHMENT_MAX_BYTES.pdf)}.
      </p>
      <p className="text-xs text-ink-soft" data-testid="photo-privacy">
        Photos are kept without their location (GPS) and the device&apos;s serial number; which way up they are and when they were taken
        stay.
      </p>

      {state.phase === 'sending' && (
        <div className="flex flex-col gap-1" data-testid="upload-progress">
          <div className="flex justify-between text-sm">
            <span className="truncate">Sending {state.file.name}</span>
            <span className="tabular-nums text-ink-soft">
              {formatBytes(state.progress.loaded)} of {formatBytes(state.progress.total)}
            </span>
          </div>
          <div
            role="progressbar"
            aria-label={`Upload of ${state.file.name}`}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={Math.round((100 * state.progress.loaded) / Math.max(1, state.progress.total))}
            className="h-3 w-full overflow-hidden rounded-full bg-line"
          >
            <div
              className="h-full rounded-full bg-brand transition-[width]"
              style={{ width: `${(100 * state.progress.loaded) / Math.max(1, state.progress.total)}%` }}
            />
          </div>
        </div>
      )}
      {state.phase === 'done' && (
        <Notice tone="success">
          {state.duplicate ? `${state.file.name} was already attached here; nothing was added twice.` : `${state.file.name} is attached.`}{' '}
          <button type="button" className="underline" onClick={reset}>
            Dismiss
          </button>
        </Notice>
      )}
      {state.phase === 'failed' && (
        <Notice tone="error">
          <p>
            {state.file.name} was not attached: {state.error.message}
          </p>
          <div className="mt-2 flex gap-2">
            {state.retryable && <Button onClick={retry}>Try again</Button>}
            <Button variant="secondary" onClick={reset}>
              Dismiss
            </Button>
          </div>
        </Notice>
      )}
    </div>
  );
}
