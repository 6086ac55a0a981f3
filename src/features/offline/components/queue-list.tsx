import { useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { StatusMark, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { READING_SYMBOLS } from '@shared/domain/symbols';
import { paths } from '@/config/paths';
import { acknowledge, flush, setAside, tryAgain } from '../stores/outbox';
import type { ProblemKind, QueuedReading } from '../utils/queue';
import { useDates } from '@/lib/date-format';

const verdictLook: Record<string, { shape: MarkShape; tone: MarkTone; label: string }> = {
  pass: { shape: READING_SYMBOLS.pass.shape, tone: 'pass', label: 'Pass (this tablet)' },
  'near-limit': { shape: READING_SYMBOLS['near-limit'].shape, tone: 'near', label: 'Near limit (this tablet)' },
  fail: { shape: READING_SYMBOLS.fail.shape, tone: 'fail', label: 'Fail (this tablet)' },
};

/** What happened, and what the technician can do about it. */
export const PROBLEM_HELP: Record<ProblemKind, { title: string; todo: string }> = {
  'step-removed': {
    title: 'Its step was taken off the checklist',
    todo: 'The technical director removed this step while the reading waited. Record the value on another step of this strip, or set it aside.',
  },
  'not-assigned': {
    title: 'You are no longer assigned to this venue',
    todo: 'Ask the technical director to assign you again, then send it again. Or set it aside.',
  },
  'not-found': {
    title: 'Its step or strip is gone from the plan',
    todo: 'Ask the technical director what happened to this strip. Set the reading aside if it no longer belongs anywhere.',
  },
  refused: {
    title: 'The server did not accept it',
    todo: 'Check the value. If it was mistyped, set it aside and type it again on the testing screen; otherwise send it again.',
  },
  'strip-suspended': {
    title: 'This strip is now out of service until the director amends the venue',
    todo: 'The reading is recorded. The venue was signed off, so a new reading takes its strip out of service; the other strips stay certified. Tell the technical director.',
  },
};

/** A kind this version no longer makes (kept on a tablet from an older one) reads as a plain refusal. */
export function problemHelp(kind: ProblemKind) {
  return PROBLEM_HELP[kind] ?? PROBLEM_HELP.refused;
}

function ItemHead({ item }: { item: QueuedReading }) {
  const v = item.preview ? verdictLook[item.preview.verdict] : null;
  const { shortDateTime: clock } = useDates();
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <Link to={paths.stripTest(item.stripId)} className="font-semibold text-brand underline">
        {item.where}
      </Link>
      <strong className="text-lg tabular-nums" data-testid="queued-value">
        {item.preview?.display ?? item.body.value}
      </strong>
      {v && <StatusMark {...v} size="sm" />}
      <span className="text-xs text-ink-soft">
        typed {clock(item.createdAt)}
        {item.movedFrom ? ` · first typed on ${item.movedFrom}` : ''}
        {item.body.correctionReason ? ` · correction: ${item.body.correctionReason}` : ''}
      </span>
    </div>
  );
}

function SetAsideButton({ item }: { item: QueuedReading }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="secondary" onClick={() => setAsking(true)}>
        Set it aside…
      </Button>
    );
  }
  return (
    <div role="group" aria-label="Confirm" className="flex flex-wrap items-center gap-2 rounded-lg border border-line bg-paper px-3 py-2">
      <span className="text-sm">
        Do not send {item.preview?.display ?? item.body.value} for {item.where}? It stays listed here.
      </span>
      <Button variant="danger" onClick={() => void setAside(item.id)}>
        Yes, do not send it
      </Button>
      <Button variant="ghost" onClick={() => setAsking(false)}>
        Keep it
      </Button>
    </div>
  );
}

/** One reading that needs the technician: what happened, what to do, and the choices. */
export function ProblemCard({ item, moveTo }: { item: QueuedReading; moveTo?: ReactNode }) {
  const kind = item.problem?.kind ?? 'refused';
  const help = problemHelp(kind);
  const notice = item.status === 'notice';
  return (
    <li
      data-testid="problem"
      data-kind={kind}
      className={`rounded-card border-2 bg-card p-4 ${notice ? 'border-brass' : 'border-fail/50'}`}
    >
      <p className="mb-2 flex flex-wrap items-center gap-2">
        <StatusMark
          shape="octagon"
          tone={notice ? 'brass' : 'fail'}
          label={notice ? 'Recorded — read this' : 'Not recorded yet — needs you'}
          size="sm"
        />
        <strong>{help.title}</strong>
      </p>
      <ItemHead item={item} />
      <p className="mt-2 text-sm">{help.todo}</p>
      {item.problem && kind !== 'strip-suspended' && <p className="mt-1 text-xs text-ink-soft">The server said: {item.problem.message}</p>}
      <div className="mt-3 flex flex-wrap items-center gap-2">
        {notice ? (
          <Button onClick={() => void acknowledge(item.id)}>Understood</Button>
        ) : (
          <>
            {kind === 'step-removed' && moveTo}
            {kind !== 'step-removed' && (
              <Button variant="secondary" onClick={() => void tryAgain(item.id)}>
                Send it again
              </Button>
            )}
            <SetAsideButton item={item} />
          </>
        )}
      </div>
    </li>
  );
}

/** Everything on this tablet that the server does not have yet, or that the technician should see. */
export function QueueList({
  items,
  online,
  syncing,
  lastStop,
  moveTo,
}: {
  items: QueuedReading[];
  online: boolean;
  syncing: boolean;
  lastStop: string | null;
  moveTo: (item: QueuedReading) => ReactNode;
}) {
  const needs = items.filter((i) => i.status === 'problem' || i.status === 'notice');
  const waiting = items.filter((i) => i.status === 'waiting');
  const aside = items.filter((i) => i.status === 'set-aside');
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="needs-you">
        <h2 id="needs-you" className="mb-2 text-lg font-semibold">
          Needs you ({needs.length})
        </h2>
        {needs.length === 0 ? (
          <p className="text-sm text-ink-soft">Nothing needs you.</p>
        ) : (
          <ul className="flex flex-col gap-3">
            {needs.map((i) => (
              <ProblemCard key={i.id} item={i} moveTo={moveTo(i)} />
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="waiting">
        <div className="mb-2 flex flex-wrap items-center gap-3">
          <h2 id="waiting" className="text-lg font-semibold">
            Waiting to send ({waiting.length})
          </h2>
          {waiting.length > 0 && (
            <Button variant="secondary" disabled={!online || syncing} onClick={() => void flush({ force: true })}>
              {syncing ? 'Sending…' : 'Send now'}
            </Button>
          )}
        </div>
        {waiting.length > 0 && (
          <p className="mb-2 text-sm text-ink-soft">
            {!online
              ? 'This tablet is offline. They are kept here and sent, in the order typed, when the network is back.'
              : lastStop === 'network' || lastStop === 'server' || lastStop === 'busy'
                ? 'The server did not answer; the tablet tries again by itself, less often each time (at most once a minute).'
                : lastStop === 'signed-out'
                  ? 'Sign in again to send them.'
                  : 'Sending in the order typed.'}
          </p>
        )}
        {waiting.length === 0 ? (
          <p className="text-sm text-ink-soft">Every reading typed on this tablet is on the server.</p>
        ) : (
          <Card className="p-0">
            <ul className="divide-y divide-line">
              {waiting.map((i) => (
                <li key={i.id} className="px-4 py-3" data-testid="waiting">
                  <ItemHead item={i} />
                  {i.attempts > 0 && (
                    <p className="mt-1 text-xs text-ink-soft">
                      Tried {i.attempts} time{i.attempts === 1 ? '' : 's'}.
                    </p>
                  )}
                </li>
              ))}
            </ul>
          </Card>
        )}
      </section>

      {aside.length > 0 && (
        <section aria-labelledby="aside">
          <h2 id="aside" className="mb-2 text-lg font-semibold">
            Set aside, not sent ({aside.length})
          </h2>
          <Card className="p-0">
            <ul className="divide-y divide-line">
              {aside.map((i) => (
                <li key={i.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3" data-testid="set-aside">
                  <div>
                    <ItemHead item={i} />
                    {i.problem && <p className="mt-1 text-xs text-ink-soft">{problemHelp(i.problem.kind).title}.</p>}
                  </div>
                  <Button variant="secondary" onClick={() => void tryAgain(i.id)}>
                    Send it after all
                  </Button>
                </li>
              ))}
            </ul>
          </Card>
        </section>
      )}
    </div>
  );
}
