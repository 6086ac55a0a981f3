// Signing a venue off: readiness from the latest readings (sign-off-readiness), the director's
// password re-checked, certificates signed and rendered in memory (sign-off-render), then kept in
// one transaction that freezes the venue (sign-off-persist). The organiser and the director get an
// e-mail with the links.
import { turns } from '../lib/turns';
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { verifyPassword } from '../auth/password';
import { accessService } from './access.service';
import { signOffRepository } from '../db/sign-off.repository';
import { AppError, conflict } from '../lib/app-error';
import { currentSigningKey } from '../signing/signing-keys';
import { verifyUrlFor } from '../signing/certificate-record';
import { certifiedReadingsInTurns, describedIssues, dismissedFaultsOf, readinessInTurns, requireReady } from './sign-off-readiness';
import { DEFAULT_STATEMENT, draftCertificates, renderCertificates, type IssuedCertificate, type SigningContext } from './sign-off-render';
import { persistSignOff } from './sign-off-persist';
import type { SignOffInput } from '../../shared/schemas/sign-off';
import { composeMail, link, p } from '../mail/compose';
import { formatDateTimeWithOffset, SERVER_LOCALE } from '../../shared/format/date-time';

/** The signed-off e-mail to the organiser and the director: the certificates page and each check link. */
async function notify(deps: AppDeps, ctx: SigningContext, issued: IssuedCertificate[]) {
  const { row } = ctx;
  const recipients = [row.event.organiserId, row.event.directorId].filter((x): x is string => !!x);
  const people = signOffRepository(deps.db).usersByIds([...new Set(recipients)]);
  const origin = deps.env.APP_ORIGIN;
  const items = issued.map((c) => ({
    label: `${c.payload.kind === 'venue' ? 'Venue' : c.payload.strips[0].label}: ${c.payload.number}`,
    url: verifyUrlFor(origin, c.payload.number),
  }));
  const when = formatDateTimeWithOffset(ctx.signedAt, { timeZone: row.venue.timeZone, locale: SERVER_LOCALE });
  for (const person of people) {
    const mail = composeMail({
      orgName: ctx.organisation.name,
      origin,
      recipientName: person.name,
      subject: `Signed off: ${row.venue.name}, ${row.event.name}`,
      blocks: [
        p(`${ctx.signer.displayName} signed off ${row.venue.name} for ${row.event.name} on ${when}. The signed certificates are ready.`),
        link('Download them (one PDF each, or all as a ZIP)', `${origin}/venues/${row.venue.id}/certificates`),
        p('Anyone can check a certificate, without signing in, on its verification page:'),
        { kind: 'links', items },
        p("The certificates cover the competition equipment tested, not the building's electrical installation."),
      ],
      // The event's director, who signed.
      contact: { name: ctx.signer.displayName, email: ctx.signer.email, role: 'the technical director of the event' },
    });
    try {
      await deps.mailer.send({ orgId: row.event.orgId, to: person.email, ...mail });
    } catch (err) {
      // The sign-off stands; the certificates page has everything the e-mail links to.
      deps.log.error(`sign-off e-mail to ${person.email} failed`, err);
    }
  }
}

async function signOff(deps: AppDeps, user: AuthUser, venueId: string, input: SignOffInput) {
  const repo = signOffRepository(deps.db);
  const row = accessService(deps.db).requireVenue(user, venueId, 'sign-off');
  const me = repo.user(user.id);
  // Re-entering the password confirms that the person at the screen is the director.
  if (!me?.passwordHash || !(await verifyPassword(input.password, me.passwordHash))) {
    throw new AppError(401, 'wrong-password', 'That password is not right. Nothing was signed.');
  }
  if (row.venue.status === 'signed-off') {
    throw conflict(
      'already-signed-off',
      'This venue is already signed off. A change to its plan re-opens it; a change on one strip puts that strip out of service until its amendment.',
    );
  }
  const exceptions = input.exceptions ?? [];
  // Taken before the snapshot, which is read in turns: what the last check compares.
  const fingerprint = repo.recordFingerprint(venueId);
  // The event loop gets a turn every few milliseconds of a large venue's work, so readings
  // arriving meanwhile wait for one piece, not for all of it.
  const turn = turns();
  const { snap, readiness } = await requireReady(deps.db, venueId, exceptions, turn);
  const readings = await certifiedReadingsInTurns(snap, readiness, turn);
  await turn();
  const certifiedStripIds = new Set(readiness.strips.filter((s) => s.state === 'ready').map((s) => s.stripId));
  const dismissed = dismissedFaultsOf(deps.db, venueId, certifiedStripIds);
  const key = await currentSigningKey(deps.db, deps.env);
  const org = repo.organisation(row.event.orgId)!;
  const ctx: SigningContext = {
    row,
    signer: { ...user, displayName: me.name },
    organisation: { id: org.id, name: org.name },
    profile: repo.profile(row.venue.profileId)!,
    signedAt: new Date().toISOString(),
    statement: input.statement?.trim() || DEFAULT_STATEMENT,
    origin: deps.env.APP_ORIGIN,
    dismissed,
  };
  // Sign and render everything first; only then write, so a failure leaves nothing behind.
  const drafts = await draftCertificates(deps.db, ctx, snap, readiness, readings, turn);
  const issued = await renderCertificates(deps.workers, key, drafts, row.venue.timeZone);
  // The venue certificate's digest is of every certified reading.
  const digest = drafts.find((d) => d.payload.kind === 'venue')!.payload.readings.digest;
  const signOffId = await persistSignOff(deps, {
    user,
    venueId,
    venueVersion: row.venue.version,
    signedAt: ctx.signedAt,
    statement: ctx.statement,
    exceptions,
    readiness,
    digest,
    fingerprint,
    certifiedReadingIds: readings.map((r) => r.readingId),
    keyId: key.kid,
    issued,
    dismissed,
    certifiedStripIds,
  });
  await notify(deps, ctx, issued);
  return {
    signOffId,
    signedAt: ctx.signedAt,
    certificates: issued.map((c) => ({
      number: c.payload.number,
      kind: c.payload.kind,
      ...(c.stripId ? { stripId: c.stripId } : {}),
      status: 'valid' as const,
      pdfSha256: c.sha256,
      verifyUrl: c.payload.verifyUrl,
    })),
  };
}

async function readiness(deps: AppDeps, user: AuthUser, venueId: string) {
  const row = accessService(deps.db).requireVenue(user, venueId, 'read');
  const { readiness } = await readinessInTurns(deps.db, venueId);
  const active = row.venue.status === 'signed-off' ? signOffRepository(deps.db).activeSignOff(venueId) : undefined;
  return {
    venue: { id: row.venue.id, name: row.venue.name, status: row.venue.status },
    event: { id: row.event.id, name: row.event.name, startsOn: row.event.startsOn, endsOn: row.event.endsOn },
    canSignOff: user.role === 'director' && row.event.directorId === user.id,
    signedOff: active ? { signOffId: active.id, signedAt: active.signedAt } : null,
    ...readiness,
    issues: describedIssues(readiness),
  };
}

export function signOffService(deps: AppDeps) {
  return {
    readiness: (user: AuthUser, venueId: string) => readiness(deps, user, venueId),
    signOff: (user: AuthUser, venueId: string, input: SignOffInput) => signOff(deps, user, venueId, input),
  };
}
export type SignOffService = ReturnType<typeof signOffService>;
