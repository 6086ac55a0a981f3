import type { ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router';
import { useDates } from '@/lib/date-format';
import { useVerification } from '@/features/certificates/api/get-verification';
import { VerificationVerdict } from '@/features/certificates/components/certificate-status';
import { VerifyFileCheck } from '@/features/certificates/components/verify-file-check';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Card, Loading, Notice } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { CERTIFICATE_NUMBER_EXAMPLE, normaliseCertificateNumber } from '@shared/domain/certificate-number';

function PublicFrame({ children }: { children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="bg-brand text-white">
        <div className="mx-auto flex max-w-4xl items-center gap-3 px-4 py-3">
          <svg aria-hidden viewBox="0 0 32 32" className="size-7">
            <rect width="32" height="32" rx="6" fill="#f2b33d" />
            <path d="M6 22h20M9 10l14 12M23 10 9 22" stroke="#0f3d3e" strokeWidth="2.5" strokeLinecap="round" />
          </svg>
          <span className="text-lg font-semibold tracking-wide">Stripwarden</span>
          <span className="text-white/75">· Certificate check</span>
        </div>
      </header>
      <main className="mx-auto max-w-4xl px-4 py-8">{children}</main>
    </div>
  );
}

function NumberForm({ initial = '' }: { initial?: string }) {
  const navigate = useNavigate();
  // No check here: the answer page says whether a certificate has the number typed.
  const form = useForm({ defaultValues: { number: initial } });
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={form.handleSubmit(({ number }) => {
        const n = normaliseCertificateNumber(number);
        if (n) navigate(paths.verify(encodeURIComponent(n)));
      })}
    >
      <TextField
        className="min-w-72 flex-1"
        label="Certificate number"
        placeholder={CERTIFICATE_NUMBER_EXAMPLE}
        {...form.register('number')}
        autoCapitalize="characters"
        spellCheck={false}
      />
      <Button type="submit">Check</Button>
    </form>
  );
}

function Details({ number }: { number: string }) {
  const q = useVerification(number);
  // Read anywhere: the venue's clock with its offset.
  const dates = useDates(q.data?.timeZone);
  const when = dates.dateTimeWithOffset;
  if (q.isPending) return <Loading label="Checking…" />;
  if (q.isError) return <Notice tone="error">{q.error.message}</Notice>;
  const v = q.data;
  if (!v)
    return (
      <Notice tone="error">
        No certificate has the number <strong className="font-mono">{number}</strong>. Check the number on the document, or scan its QR
        code.
      </Notice>
    );
  const rows: [string, ReactNode][] = [
    ['Certificate number', <span className="font-mono">{v.number}</span>],
    [
      'Covers',
      v.kind === 'venue'
        ? `The venue (${v.strips.length} ${v.strips.length === 1 ? 'strip' : 'strips'}: ${v.strips.join(', ')})`
        : `One strip: ${v.strips.join(', ')}`,
    ],
    ['Event', `${v.event}, ${dates.calendarRange(v.eventDates.startsOn, v.eventDates.endsOn)}`],
    ['Venue', v.venue],
    ['Organisation', v.organisation],
    ['Signed by', `${v.signedBy}, technical director, ${when(v.signedAt)}`],
    ['Limit profile', `${v.profile.name}, version ${v.profile.version}`],
    ['Tested', `${v.items} items, ${v.readings} readings`],
    ['PDF SHA-256', <span className="break-all font-mono text-sm">{v.pdfSha256}</span>],
    ['Signing key', <span className="break-all font-mono text-sm">{v.keyId}</span>],
  ];
  const detail =
    v.status === 'revoked' && v.revokedAt
      ? `Revoked ${when(v.revokedAt)}${v.revokedReason ? `: ${v.revokedReason}` : ''}.`
      : v.status === 'superseded' && v.supersededAt
        ? `Superseded ${when(v.supersededAt)}${v.successorNumber ? ` by ${v.successorNumber}` : ''}.`
        : v.supersededPendingSince
          ? `Issued ${when(v.issuedAt)}. Its strip changed on ${when(v.supersededPendingSince)} and waits for the technical director's amendment.`
          : `Issued ${when(v.issuedAt)}.`;
  const amendments = v.amendments ?? [];
  const outOfService = v.outOfService ?? [];
  const notCovering = v.notCovering ?? [];
  return (
    <div className="flex flex-col gap-6">
      <VerificationVerdict status={v.status} detail={detail} />
      {notCovering.length > 0 && (
        <div data-testid="not-covering">
          <Notice tone="caution">
            <strong>
              This venue certificate no longer covers{' '}
              {notCovering.length === 1 ? 'one of its strips' : `${notCovering.length} of its strips`}:
            </strong>{' '}
            {notCovering.map((s, i) => (
              <span key={s.number}>
                {i > 0 ? '; ' : ''}
                {s.strip} (its strip certificate <span className="font-mono">{s.number}</span> was revoked
                {s.revokedAt ? ` ${when(s.revokedAt)}` : ''}
                {s.revokedReason ? `: ${s.revokedReason.replace(/[.!]+$/, '')}` : ''})
              </span>
            ))}
            . Do not rely on it for {notCovering.length === 1 ? 'that strip' : 'those strips'}.
          </Notice>
        </div>
      )}
      {v.status === 'superseded' && v.successorNumber && (
        <p data-testid="successor">
          Its successor:{' '}
          <Link className="font-mono font-semibold text-brand underline" to={paths.verify(v.successorNumber)}>
            {v.successorNumber}
          </Link>
        </p>
      )}
      {outOfService.length > 0 && (
        <div data-testid="out-of-service">
          <Notice tone="caution">
            <strong>Out of service now: {outOfService.length === 1 ? 'one strip' : `${outOfService.length} strips`} of this venue</strong> (
            {outOfService.map((s) => `${s.strip}, since ${when(s.since)}`).join('; ')}). This certificate does not cover{' '}
            {outOfService.length === 1 ? 'it' : 'them'} until the technical director amends it.
          </Notice>
        </div>
      )}
      {amendments.length > 0 && (
        <Card data-testid="amendments">
          <h2 className="text-lg font-semibold">Amendments</h2>
          <p className="text-sm text-ink-soft">Strips retested during the event and certified again; the venue certificate stays valid.</p>
          <ul className="mt-2 divide-y divide-line">
            {amendments.map((a) => (
              <li key={a.number} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2">
                <span className="font-semibold">{a.strip}</span>
                <Link className="font-mono text-brand underline" to={paths.verify(a.number)}>
                  {a.number}
                </Link>
                <span className="text-sm text-ink-soft">{when(a.at)}</span>
              </li>
            ))}
          </ul>
        </Card>
      )}
      <Card>
        <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-[12rem_1fr]">
          {rows.map(([k, val]) => (
            <div key={k} className="contents">
              <dt className="text-sm font-medium text-ink-soft">{k}</dt>
              <dd>{val}</dd>
            </div>
          ))}
        </dl>
        <details className="mt-4">
          <summary className="min-h-touch cursor-pointer font-medium text-brand">The signature (JWS)</summary>
          <p className="mt-2 text-sm text-ink-soft">
            An Ed25519 compact JWS over the certificate&apos;s record. Check it with any JOSE library against the public keys at{' '}
            <a className="underline" href="/.well-known/jwks.json">
              /.well-known/jwks.json
            </a>
            .
          </p>
          <textarea
            readOnly
            rows={5}
            className="mt-2 w-full rounded-lg border border-line bg-paper p-2 font-mono text-xs"
            value={v.jws}
            aria-label="JWS"
          />
        </details>
        <p className="mt-4 text-sm text-ink-soft">
          A certificate covers the competition equipment tested, not the building&apos;s electrical installation (mains supply and earthing
          of the hall), which is for licensed electricians under local codes.
        </p>
      </Card>
    </div>
  );
}

/** Public: /verify (type a number) and /verify/:number (the answer). No sign-in. */
export default function VerifyPage() {
  const { number } = useParams();
  const n = number ? decodeURIComponent(number).trim().toUpperCase() : '';
  return (
    <PublicFrame>
      <h1 className="text-2xl font-semibold">Check a certificate</h1>
      <p className="mt-1 text-ink-soft">Enter the number printed on the certificate, or check the PDF file itself.</p>
      <div className="mt-6 flex flex-col gap-8">
        <NumberForm key={n} initial={n} />
        {n && <Details number={n} />}
        <section>
          <h2 className="mb-3 text-lg font-semibold">Is this PDF an original?</h2>
          <VerifyFileCheck expectedNumber={n || undefined} />
        </section>
        <p className="text-sm text-ink-soft">
          <Link className="underline" to={paths.home}>
            Stripwarden
          </Link>{' '}
          issues these certificates for the technical teams of fencing competitions.
        </p>
      </div>
    </PublicFrame>
  );
}
