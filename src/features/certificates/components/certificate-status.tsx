import type { CertificateStatus } from '../api/get-certificates';

const LABELS: Record<CertificateStatus, string> = { valid: 'Valid', superseded: 'Superseded', revoked: 'Revoked' };
const TONES: Record<CertificateStatus, string> = {
  valid: 'bg-pass-soft text-pass border-pass/40',
  superseded: 'bg-idle-soft text-idle border-idle/40',
  revoked: 'bg-fail-soft text-fail border-fail/40',
};

/** A shape for each status, so it reads without colour: a tick, a circular arrow, a cross. */
const SHAPES: Record<CertificateStatus, { strokeWidth: string; paths: string[]; ring?: boolean }> = {
  valid: { strokeWidth: '3', ring: true, paths: ['M7 12.5l3.2 3.2L17 9'] },
  superseded: { strokeWidth: '2.4', paths: ['M20 12a8 8 0 1 1-2.4-5.7', 'M20 4v5h-5'] },
  revoked: { strokeWidth: '2.4', paths: ['M8 2h8l6 6v8l-6 6H8l-6-6V8z', 'M9 9l6 6M15 9l-6 6'] },
};

export function StatusShape({ status, className = 'size-4' }: { status: CertificateStatus; className?: string }) {
  const shape = SHAPES[status];
  return (
    <svg
      aria-hidden
      viewBox="0 0 24 24"
      className={className}
      fill="none"
      stroke="currentColor"
      strokeWidth={shape.strokeWidth}
      strokeLinecap="round"
      strokeLinejoin="round"
    >
      {shape.ring && <circle cx="12" cy="12" r="10" strokeWidth="2" />}
      {shape.paths.map((d) => (
        <path key={d} d={d} />
      ))}
    </svg>
  );
}

export function CertificateStatusBadge({ status }: { status: CertificateStatus }) {
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-medium ${TONES[status]}`}>
      <StatusShape status={status} />
      {LABELS[status]}
    </span>
  );
}

const BIG: Record<CertificateStatus, { title: string; text: string }> = {
  valid: { title: 'Valid certificate', text: 'This certificate was issued by Stripwarden and is in force.' },
  superseded: {
    title: 'Superseded',
    text: 'This certificate was issued, but the venue changed after it was signed (a new reading, a repair or a swap). A later sign-off replaces it.',
  },
  revoked: { title: 'Revoked', text: 'This certificate was withdrawn by the technical director or an administrator. Do not rely on it.' },
};

/** The answer of the public check, in big plain words. */
export function VerificationVerdict({ status, detail }: { status: CertificateStatus; detail?: string }) {
  const tone = {
    valid: 'border-pass bg-pass-soft text-pass',
    superseded: 'border-idle bg-idle-soft text-idle',
    revoked: 'border-fail bg-fail-soft text-fail',
  }[status];
  return (
    <div role="status" className={`flex items-center gap-5 rounded-card border-2 p-6 ${tone}`}>
      <StatusShape status={status} className="size-16 shrink-0" />
      <div>
        <p className="text-3xl font-semibold">{BIG[status].title}</p>
        <p className="mt-1 text-base text-ink">{BIG[status].text}</p>
        {detail && <p className="mt-1 text-sm text-ink-soft">{detail}</p>}
      </div>
    </div>
  );
}
