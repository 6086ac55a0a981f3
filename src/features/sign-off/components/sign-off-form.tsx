import { useState } from 'react';
import { READING_SYMBOLS } from '@shared/domain/symbols';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router';
import { z } from 'zod';
import { signOffExceptionSchema, signOffSchema } from '@shared/schemas/sign-off';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Card, Notice } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/config/paths';
import type { ReadinessDto } from '../api/get-readiness';
import { useSignOffVenue, type SignOffResult } from '../api/sign-off-venue';
import { ReadinessList } from './readiness-list';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { formatOhm } from '@shared/domain/units';

const confirmSchema = signOffSchema.pick({ password: true, statement: true });
type ConfirmInput = z.infer<typeof confirmSchema>;

export const DEFAULT_STATEMENT_HINT = 'I have reviewed the readings listed in this certificate and sign the venue off for competition.';

type Exception = z.output<typeof signOffExceptionSchema>;

/** Readiness, the exceptions, a statement and the password: the whole sign-off on one screen. */
export function SignOffForm({ readiness, onSigned }: { readiness: ReadinessDto; onSigned: (r: SignOffResult) => void }) {
  const venueId = readiness.venue.id;
  const signOff = useSignOffVenue(venueId);
  const [exceptions, setExceptions] = useState<Exception[]>([]);
  const form = useForm<ConfirmInput>({ resolver: zodResolver(confirmSchema), defaultValues: { password: '', statement: '' } });
  // "Leave it out": one strip and its reason, checked by the schema the sign-off request uses.
  const exceptionForm = useForm<z.input<typeof signOffExceptionSchema>, unknown, Exception>({
    resolver: zodResolver(signOffExceptionSchema),
    defaultValues: { stripId: '', reason: '' },
  });
  const draft = useWatch({ control: exceptionForm.control });
  const draftReady = signOffExceptionSchema.safeParse(draft).success;

  const leftOut = new Set(exceptions.map((e) => e.stripId));
  const blocking = readiness.strips.filter((s) => ['missing', 'failing', 'no-steps'].includes(s.state) && !leftOut.has(s.stripId));
  const certified = readiness.strips.filter((s) => s.state === 'ready' && !leftOut.has(s.stripId));
  const readyNow = blocking.length === 0 && certified.length > 0;
  const candidates = readiness.strips.filter((s) => s.state !== 'withdrawn' && !leftOut.has(s.stripId));
  const signedOff = readiness.venue.status === 'signed-off';

  const addException = exceptionForm.handleSubmit((exception) => {
    setExceptions((list) => [...list, exception]);
    exceptionForm.reset();
  });
  const labelOf = (id: string) => readiness.strips.find((s) => s.stripId === id)?.label ?? id;
  const problem = signOff.error instanceof ApiError ? signOff.error : null;
  const problemIssues = (problem?.body.issues as { message: string }[] | undefined) ?? [];

  return (
    <div className="grid gap-6 lg:grid-cols-[1.5fr_1fr]">
      <div className="flex flex-col gap-6">
        <Card>
          <div className="flex flex-wrap items-center justify-between gap-3">
            <h2 className="text-lg font-semibold">Strip by strip</h2>
            <p className={`text-sm font-medium ${readyNow ? 'text-pass' : 'text-near'}`} role="status">
              {readyNow
                ? `${READING_SYMBOLS.pass.glyph} Ready: ${certified.length} ${certified.length === 1 ? 'strip' : 'strips'} to certify`
                : `${READING_SYMBOLS['not-measured'].glyph} Not ready: ${blocking.length} ${blocking.length === 1 ? 'strip needs' : 'strips need'} attention`}
            </p>
          </div>
          <ReadinessList
            strips={readiness.strips}
            leftOut={leftOut}
            onLeaveOut={readiness.canSignOff && !signedOff ? (stripId) => exceptionForm.reset({ stripId, reason: '' }) : undefined}
          />
        </Card>

        <Card>
          <h2 className="text-lg font-semibold">Near the limit</h2>
          {readiness.nearLimit.length === 0 ? (
            <p className="mt-1 text-sm text-ink-soft">No reading of a certified strip is near its limit.</p>
          ) : (
            <>
              <p className="mt-1 text-sm text-ink-soft">
                These pass and will be certified; they are listed so you can decide to retest or replace the item.
              </p>
              <ul className="mt-3 flex flex-col gap-1 text-sm">
                {readiness.nearLimit.map((n) => (
                  <li key={n.stepId}>
                    <Link className="inline-flex min-h-touch items-center gap-2 text-near underline" to={paths.stripTest(n.stripId)}>
                      {READING_SYMBOLS['near-limit'].glyph} {n.stripLabel}, {n.positionName} {n.assetTag ? `(${n.assetTag})` : ''} ·{' '}
                      {TEST_KIND_LABELS[n.testKind as keyof typeof TEST_KIND_LABELS] ?? n.testKind}{' '}
                      {n.conductors.startsWith('piste') ? '' : n.conductors}: {n.valueText}
                      {n.limitOhm !== null && ` of max ${formatOhm(n.limitOhm)}`}
                    </Link>
                  </li>
                ))}
              </ul>
            </>
          )}
        </Card>
      </div>

      <div className="flex flex-col gap-6">
        <Notice tone="caution">
          The certificates cover the competition equipment tested. The building&apos;s electrical installation — the mains supply and the
          earthing of the hall — is for licensed electricians under local codes and is not part of this sign-off.
        </Notice>
        {!readiness.canSignOff && !signedOff && (
          <Notice tone="info">Only the technical director of this event can sign the venue off. You can follow its readiness here.</Notice>
        )}
        {readiness.canSignOff && !signedOff && (
          <Card>
            <h2 className="text-lg font-semibold">Strips left out</h2>
            <p className="mt-1 text-sm text-ink-soft">
              A strip that is not used, or cannot be made ready, can be left out with a reason. The reason is printed on the venue
              certificate.
            </p>
            {exceptions.length > 0 && (
              <ul className="mt-3 flex flex-col gap-2">
                {exceptions.map((e) => (
                  <li key={e.stripId} className="flex items-start justify-between gap-3 rounded-lg bg-paper px-3 py-2 text-sm">
                    <span>
                      <strong>{labelOf(e.stripId)}</strong>: {e.reason}
                    </span>
                    <button
                      type="button"
                      className="min-h-touch px-2 font-medium text-brand"
                      onClick={() => setExceptions((l) => l.filter((x) => x.stripId !== e.stripId))}
                    >
                      Take back
                    </button>
                  </li>
                ))}
              </ul>
            )}
            <div className="mt-3 flex flex-col gap-3">
              <SelectField label="Strip" id="f-exception-strip" {...exceptionForm.register('stripId')}>
                <option value="">Choose a strip…</option>
                {candidates.map((s) => (
                  <option key={s.stripId} value={s.stripId}>
                    {s.label}
                  </option>
                ))}
              </SelectField>
              <TextField
                label="Reason"
                id="f-exception-reason"
                placeholder="e.g. Reserve strip, not used at this event"
                {...exceptionForm.register('reason')}
                error={exceptionForm.formState.errors.reason?.message}
              />
              <Button variant="secondary" onClick={addException} disabled={!draftReady}>
                Leave it out
              </Button>
            </div>
          </Card>
        )}
        {readiness.canSignOff && !signedOff && (
          <Card>
            <h2 className="text-lg font-semibold">Sign off</h2>
            <form
              className="mt-3 flex flex-col gap-4"
              noValidate
              onSubmit={form.handleSubmit(async (values) => {
                const result = await signOff
                  .mutateAsync({ password: values.password, statement: values.statement || undefined, exceptions })
                  .catch(() => null);
                form.setValue('password', '');
                if (result) onSigned(result);
              })}
            >
              <div className="flex flex-col gap-1">
                <label htmlFor="f-statement" className="text-sm font-medium">
                  Statement on the certificate
                </label>
                <textarea
                  id="f-statement"
                  rows={4}
                  className="w-full rounded-lg border border-line bg-card px-3 py-2 text-base"
                  placeholder={DEFAULT_STATEMENT_HINT}
                  {...form.register('statement')}
                />
                <p className="text-xs text-ink-soft">Left empty, the sentence shown is used.</p>
              </div>
              <TextField
                label="Your password, to confirm"
                type="password"
                autoComplete="current-password"
                {...form.register('password')}
                error={form.formState.errors.password?.message}
              />
              {problem && (
                <Notice tone="error">
                  <p>{problem.message}</p>
                  {problemIssues.length > 0 && (
                    <ul className="mt-2 list-disc pl-5">
                      {problemIssues.slice(0, 8).map((i, k) => (
                        <li key={k}>{i.message}</li>
                      ))}
                    </ul>
                  )}
                </Notice>
              )}
              <Button type="submit" disabled={!readyNow || form.formState.isSubmitting}>
                {form.formState.isSubmitting ? 'Signing and making certificates…' : 'Sign off and issue certificates'}
              </Button>
              {!readyNow && <p className="text-sm text-ink-soft">Sign-off opens once every strip is ready or left out with a reason.</p>}
            </form>
          </Card>
        )}
      </div>
    </div>
  );
}
