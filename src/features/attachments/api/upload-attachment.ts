import { useCallback, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { answerOf, ApiError, problemError, urlOf } from '@/lib/api-client';
import { attachmentsContracts } from '@shared/contracts/attachments';
import {
  ATTACHMENT_EXTENSIONS,
  ATTACHMENT_MAX_BYTES,
  extensionOf,
  type AttachmentCreated,
  type AttachmentOwnerType,
} from '@shared/schemas/attachments';
import { attachmentsQueryOptions } from './get-attachments';
import { formatBytes, newIdempotencyKey } from '../utils/idempotency-key';

export type UploadProgress = { loaded: number; total: number };

/**
 * XMLHttpRequest rather than fetch: it reports upload progress. The Idempotency-Key travels with
 * the request, so a retry after a dropped connection gets the stored answer instead of a duplicate.
 */
export function uploadAttachment(
  ownerType: AttachmentOwnerType,
  ownerId: string,
  file: File,
  idempotencyKey: string,
  onProgress: (p: UploadProgress) => void,
  signal?: AbortSignal,
): Promise<{ status: number; body: AttachmentCreated }> {
  const contract = attachmentsContracts[ownerType].upload;
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(contract.method, urlOf(contract, { id: ownerId }));
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('Idempotency-Key', idempotencyKey);
    xhr.upload.onprogress = (e) => onProgress({ loaded: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.onerror = () =>
      reject(
        new ApiError(0, 'network', 'The connection dropped during the upload. Try again: the same upload is recognised, not stored twice.'),
      );
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    xhr.onload = () => {
      let body: unknown = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON: handled below */
      }
      if (xhr.status < 200 || xhr.status >= 300) return reject(problemError(xhr.status, body));
      try {
        resolve({ status: xhr.status, body: answerOf(contract, body) });
      } catch (err) {
        reject(err);
      }
    };
    signal?.addEventListener('abort', () => xhr.abort());
    const form = new FormData();
    form.append('file', file, file.name);
    xhr.send(form);
  });
}

export type UploadState =
  | { phase: 'idle' }
  | { phase: 'sending'; file: File; progress: UploadProgress }
  | { phase: 'done'; file: File; duplicate: boolean }
  | { phase: 'failed'; file: File; error: ApiError; retryable: boolean };

/** One upload at a time, with progress; `retry` sends the same file with the same key. */
export function useUploadAttachment(ownerType: AttachmentOwnerType, ownerId: string) {
  const qc = useQueryClient();
  const [state, setState] = useState<UploadState>({ phase: 'idle' });
  const pending = useRef<{ file: File; key: string } | null>(null);

  const send = useCallback(
    async (file: File, key: string) => {
      pending.current = { file, key };
      setState({ phase: 'sending', file, progress: { loaded: 0, total: file.size } });
      try {
        const res = await uploadAttachment(ownerType, ownerId, file, key, (progress) => setState({ phase: 'sending', file, progress }));
        pending.current = null;
        setState({ phase: 'done', file, duplicate: res.status === 200 });
        await qc.invalidateQueries({ queryKey: attachmentsQueryOptions(ownerType, ownerId).queryKey });
      } catch (err) {
        const error = err instanceof ApiError ? err : new ApiError(0, 'error', String(err));
        // A refusal (4xx other than 409) will not change on retry; a dropped connection or 5xx may.
        const retryable = error.status === 0 || error.status >= 500 || error.status === 409;
        setState({ phase: 'failed', file, error, retryable });
      }
    },
    [ownerType, ownerId, qc],
  );

  return {
    state,
    /** A new selection gets a new key; a file over its kind's limit is refused before it is sent. */
    start: (file: File) => {
      const known = ATTACHMENT_EXTENSIONS[extensionOf(file.name)];
      if (known && file.size > ATTACHMENT_MAX_BYTES[known.kind]) {
        const error = new ApiError(
          413,
          'file-too-large',
          `The file is larger than the ${formatBytes(ATTACHMENT_MAX_BYTES[known.kind])} allowed for a ${known.kind}.`,
        );
        setState({ phase: 'failed', file, error, retryable: false });
        return;
      }
      void send(file, newIdempotencyKey());
    },
    retry: () => {
      if (pending.current) void send(pending.current.file, pending.current.key);
    },
    reset: () => setState({ phase: 'idle' }),
  };
}
