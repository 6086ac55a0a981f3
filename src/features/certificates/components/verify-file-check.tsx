import { useRef, useState, type DragEvent } from 'react';
import { Link } from 'react-router';
import { paths } from '@/config/paths';
import { Notice } from '@/components/ui/card';
import { useVerifyFile } from '../api/verify-file';

/** Drop or choose a PDF: is it byte for byte a certificate that was issued? */
export function VerifyFileCheck({ expectedNumber }: { expectedNumber?: string }) {
  const check = useVerifyFile();
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const [name, setName] = useState<string | null>(null);
  const send = (file: File | undefined) => {
    if (!file) return;
    setName(file.name);
    check.mutate(file);
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    send(e.dataTransfer.files[0]);
  };
  const result = check.data;
  return (
    <div className="flex flex-col gap-3">
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={`flex flex-col items-center justify-center gap-3 rounded-card border-2 border-dashed p-6 text-center ${over ? 'border-brand bg-brand-soft' : 'border-line bg-paper'}`}
      >
        <p className="text-ink-soft">Drop the certificate PDF here, or</p>
        <label className="inline-flex min-h-touch cursor-pointer items-center rounded-lg border border-line bg-card px-4 font-medium text-brand hover:bg-paper">
          Choose a PDF file
          <input
            ref={input}
            type="file"
            accept="application/pdf,.pdf"
            className="sr-only"
            onChange={(e) => {
              send(e.target.files?.[0]);
              e.target.value = '';
            }}
          />
        </label>
        <p className="text-xs text-ink-soft">The file is compared with the issued certificates and not kept. Up to 10 MB.</p>
      </div>
      {check.isPending && (
        <p role="status" className="text-ink-soft">
          Checking {name}…
        </p>
      )}
      {check.isError && <Notice tone="error">{check.error.message}</Notice>}
      {result?.match === true && (
        <Notice tone={result.certificate.status === 'valid' ? 'success' : 'caution'}>
          <strong>{name}</strong> is exactly certificate{' '}
          <Link className="font-medium underline" to={paths.verify(result.certificate.number)}>
            {result.certificate.number}
          </Link>{' '}
          ({result.certificate.venue}, {result.certificate.event}), now <strong>{result.certificate.status}</strong>.
          {expectedNumber && expectedNumber !== result.certificate.number && ' It is not the certificate shown on this page.'}
        </Notice>
      )}
      {result?.match === false && (
        <Notice tone="error">
          <strong>{name}</strong> is not a certificate that was issued: it may have been changed, even by one byte, or it comes from
          somewhere else. Download the original from the organiser.
        </Notice>
      )}
    </div>
  );
}
