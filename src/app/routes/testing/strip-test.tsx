import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { FAULT_SYMBOLS, STRIP_SYMBOLS } from '@shared/domain/symbols';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { formatLength } from '@shared/domain/units';
import { FAULT_KIND_LABELS, FAULT_STATUS_LABELS } from '@shared/schemas/faults';
import { useMe } from '@/features/auth/api/get-me';
import { useStrip } from '@/features/testing/api/get-strip';
import { StepRow, stepTitle, type JudgedPreview, type QueuedView, type ReadingInput } from '@/features/testing/components/step-row';
import { EntryGrid } from '@/features/testing/components/entry-grid';
import { StripBar } from '@/features/testing/components/strip-bar';
import { readView, saveView, type TestingView } from '@/features/testing/utils/view-preference';
import type { StripPosition, StripStep } from '@/features/testing/api/get-strip';
import { useSyncSummary } from '@/features/offline/hooks/use-outbox';
import { syncLook, syncWords } from '@/features/offline/components/sync-indicator';
import { useOutbox } from '@/features/offline/hooks/use-outbox';
import { enqueueReading, recordLeadNull } from '@/features/offline/stores/outbox';
import { newReadingId } from '@/features/offline/utils/reading-id';
import { problemHelp } from '@/features/offline/components/queue-list';
import { SafetyNotice } from '@/features/testing/components/safety-notice';
import { LeadNull } from '@/features/testing/components/lead-null';
import { stripForCode } from '@/features/labels/utils/strip-for-code';
import { readLeadNull, safetyAcknowledged, saveLeadNull } from '@/features/testing/utils/session';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { ProgressBar, StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import type { LeadNullRecord } from '@shared/schemas/lead-nulls';
import { useDates } from '@/lib/date-format';
import type { CreateIncidentInput } from '@shared/schemas/incidents';
import { useVenueIncidents } from '@/features/incidents/api/get-venue-incidents';
import { useSpares } from '@/features/incidents/api/get-spares';
import { QueuedIncidentMark } from '@/features/offline/components/queued-incident-mark';
import { enqueueIncident } from '@/features/offline/stores/outbox';
import { Button } from '@/components/ui/button';

// Off the way to the first reading (their form library is not needed to measure), and fetched as
// soon as the strip is on screen: a tablet that then loses the network still opens them.
const loadIncidentCard = () => import('@/features/incidents/components/incident-card');
const loadOpenIncidentPanel = () => import('@/features/incidents/components/open-incident-panel');
// The label scanner too: fetched when a tap opens it.
const LabelScanner = lazy(() => import('@/features/labels/components/label-scanner').then((m) => ({ default: m.LabelScanner })));
const IncidentCard = lazy(() => loadIncidentCard().then((m) => ({ default: m.IncidentCard })));
const OpenIncidentPanel = lazy(() => loadOpenIncidentPanel().then((m) => ({ default: m.OpenIncidentPanel })));

/** The testing screen: walk a strip's positions and steps with the keyboard alone. */
export default function StripTestPage() {
  const { stripId = '' } = useParams();
  const [search] = useSearchParams();
  const retestPosition = search.get('position');
  const strip = useStrip(stripId);
  const me = useMe();
  const outbox = useOutbox();
  const dates = useDates();
  const [lead, setLead] = useState<LeadNullRecord | null>(null);
  // This person's null of this session (kept in the tab; a shared tablet never uses another's).
  useEffect(() => setLead(readLeadNull(me.data?.id)), [me.data?.id]);
  const inputs = useRef<Map<string, HTMLInputElement>>(new Map());
  const nextStripLink = useRef<HTMLAnchorElement>(null);
  const [ready, setReady] = useState(() => safetyAcknowledged());
  // The first focus waits for the tablet's queue too (read from IndexedDB a moment after an offline
  // reload): until then a step whose reading waits to send looks unmeasured and would take it.
  const focusReady = ready && outbox.loaded;
  const focusedFor = useRef<string | null>(null);
  const sync = useSyncSummary();
  const [chosenView, setChosenView] = useState<TestingView | null>(null);
  const view = chosenView ?? readView(me.data?.id);
  const [focusRequest, setFocusRequest] = useState(0);
  // The repaired fault being retested here, kept once seen: when it closes it leaves the strip's
  // list of unclosed faults, and the screen must still say so.
  const [retestFault, setRetestFault] = useState<{ id: string; positionId: string; since: string | null } | null>(null);

  const navigate = useNavigate();
  const [scanning, setScanning] = useState(false);
  const canWrite = me.data?.role === 'technician' || me.data?.role === 'director';
  const data = strip.data;
  // Competition days: the strip's open incident (or one opened on this tablet, not sent yet).
  // The spare pool is no strip of the competition: its spares are tested, never reported on.
  const competing = !data?.sparePool && (data?.venueStatus === 'signed-off' || data?.status === 'out-of-service');
  const incidents = useVenueIncidents(data?.venueId ?? '', { enabled: !!data && competing });
  useEffect(() => {
    if (!competing) return;
    // Failing offline is no harm: the service worker's copy is tried when the card is shown.
    loadIncidentCard().catch(() => undefined);
    loadOpenIncidentPanel().catch(() => undefined);
  }, [competing]);
  // An open one, else one resolved and waiting for the director's amendment (the strip is still out).
  const stripIncidents = incidents.data?.incidents.filter((i) => i.stripId === stripId) ?? [];
  const openIncident =
    stripIncidents.find((i) => i.status === 'open') ?? stripIncidents.find((i) => i.status === 'resolved' && !i.amendment) ?? null;
  const queuedIncident =
    outbox.incidents.find((i) => i.stripId === stripId && i.userId === me.data?.id && i.status !== 'set-aside') ?? null;
  const spares = useSpares(data?.venueId ?? '', { enabled: openIncident?.status === 'open' });
  const [reporting, setReporting] = useState(false);
  const flat = useMemo(() => (data ? data.positions.flatMap((p) => p.steps.map((s) => ({ step: s, position: p }))) : []), [data]);
  // Readings of this strip typed on this tablet and not on the server yet: the newest per step.
  const queued = useMemo(() => {
    const byStep = new Map<string, QueuedView>();
    for (const i of outbox.items) {
      if (i.stripId !== stripId || i.status === 'set-aside' || i.userId !== me.data?.id) continue;
      byStep.set(i.body.stepId, {
        status: i.status === 'waiting' ? (outbox.syncing ? 'sending' : 'waiting') : i.status,
        display: i.preview?.display ?? i.body.value,
        verdict: i.preview?.verdict ?? null,
        title: i.problem ? problemHelp(i.problem.kind).title : undefined,
      });
    }
    return byStep;
  }, [outbox.items, outbox.syncing, stripId, me.data?.id]);
  const waitingHere = [...queued.values()].filter((q) => q.status === 'waiting' || q.status === 'sending').length;
  const measuredHere = flat.filter((f) => f.step.latest || queued.has(f.step.id)).length;

  const seenRepaired = data?.openFaults.find((f) => f.positionId === retestPosition && f.status === 'repaired');
  if (seenRepaired && retestFault?.id !== seenRepaired.id)
    setRetestFault({ id: seenRepaired.id, positionId: seenRepaired.positionId, since: seenRepaired.repairedAt });
  const retestClosed = !!retestFault && !!data && !data.openFaults.some((f) => f.id === retestFault.id);
  const retestSince = retestFault?.positionId === retestPosition ? (retestFault?.since ?? null) : null;
  const isRetested = (positionId: string, step: StripStep) =>
    positionId === retestPosition && !!retestSince && !!step.latest && step.latest.takenAt >= retestSince;

  const submitReading = useCallback(
    async (position: StripPosition, step: StripStep, input: ReadingInput, preview: JudgedPreview) => {
      if (!me.data || !data) throw new Error('not signed in');
      await enqueueReading({
        body: { id: newReadingId(), takenAt: new Date().toISOString(), ...input },
        userId: me.data.id,
        venueId: data.venueId,
        stripId: data.id,
        where: `${data.label} · ${position.name} · ${stepTitle(step)}`,
        preview,
        // The null goes with the reading until the server is known to have it.
        ...(lead && input.leadNullId === lead.id ? { leadNull: lead } : {}),
      });
    },
    [me.data, data, lead],
  );

  const focusStep = useCallback((stepId: string | undefined) => {
    if (!stepId) return nextStripLink.current?.focus();
    const el = inputs.current.get(stepId);
    el?.focus();
    el?.scrollIntoView({ block: 'center', behavior: 'smooth' });
  }, []);

  // On arrival (after the safety notice): the first step of the retest, else the first not yet measured.
  useEffect(() => {
    if (view === 'grid' || !data || !focusReady || !canWrite || focusedFor.current === data.id + (retestPosition ?? '')) return;
    focusedFor.current = data.id + (retestPosition ?? '');
    const target = retestPosition
      ? flat.find((f) => f.position.id === retestPosition)
      : (flat.find((f) => !f.step.latest && !queued.has(f.step.id)) ?? flat[0]);
    // Wait a frame so the inputs are mounted.
    requestAnimationFrame(() => focusStep(target?.step.id));
  }, [view, data, focusReady, canWrite, retestPosition, flat, focusStep, queued]);

  if ((strip.isPending && strip.fetchStatus === 'paused') || (strip.isError && !strip.data && !(strip.error instanceof ApiError))) {
    return (
      <Notice tone="caution">
        This strip is not on this tablet yet, and there is no network. Strips are kept on the tablet once their venue is opened online; go
        back to a strip that was, or wait for the network.
      </Notice>
    );
  }
  if (strip.isPending) return <Loading />;
  if (strip.isError && !strip.data) return <Notice tone="error">{strip.error.message}</Notice>;
  if (!data) return null;
  // No answer from the server: keep working on the copy kept on this tablet.
  const stale = strip.isError || (!outbox.online && strip.isStale);
  if (!data.profile)
    return <Notice tone="error">This venue has no limit profile yet; the technical director must choose one before testing.</Notice>;
  const profile = {
    name: data.profile.name,
    version: data.profile.version,
    rules: data.profile.rules,
    loopRequired: data.profile.loopRequired,
  };
  const unit = me.data?.unitSystem ?? 'metric';
  let n = 0;
  // Each caution once per item kind: on the first step of its kind on this strip.
  const cautionSteps = new Set<string>();
  const cautionSeen = new Set<string>();
  for (const f of flat) {
    const k = `${f.position.equipmentKind} ${f.step.testKind}`;
    if ((f.step.testKind === 'insulation' || f.step.testKind === 'piste-earth') && !cautionSeen.has(k)) {
      cautionSeen.add(k);
      cautionSteps.add(f.step.id);
    }
  }
  const stripLook = STRIP_SYMBOLS[data.status];
  const syncShown = { state: sync.state, words: syncWords(sync), ...syncLook[sync.state] };
  const switchView = (v: TestingView) => {
    if (me.data) saveView(me.data.id, v);
    setChosenView(v);
    setFocusRequest((x) => x + 1);
  };
  // The grid links each fault from its cell, so its list of faults would only cost a screen's height.
  const notices = (faultList: boolean) => (
    <>
      {stale && (
        <div className="mb-4">
          <Notice tone="caution">
            {outbox.online ? 'No answer from the server' : 'Offline'}: this is the copy of the strip kept on this tablet, as of{' '}
            {dates.time(strip.dataUpdatedAt)}. Keep testing; readings are kept and sent later.
          </Notice>
        </div>
      )}
      {waitingHere > 0 && (
        <div className="mb-4">
          <Notice tone="info">
            {waitingHere} reading{waitingHere === 1 ? '' : 's'} of this strip {waitingHere === 1 ? 'is' : 'are'} kept on this tablet,
            waiting to send
            {outbox.online ? '' : ' (offline: they go when the network is back)'}. Their verdicts come from this tablet until the server
            confirms them.
          </Notice>
        </div>
      )}
      {data.withdrawnReason && <Notice tone="caution">This strip is withdrawn: {data.withdrawnReason}</Notice>}
      {incidentSection}
      {retestPosition && !retestClosed && (
        <div className="mb-4" data-testid="retest-banner">
          <Notice tone="caution">
            Retest after a repair: measure every step of the highlighted item again. The fault closes, and the strip can be clear, only when
            they all pass.
          </Notice>
        </div>
      )}
      {retestClosed && (
        <div className="mb-4" data-testid="retest-done">
          <Notice tone="success">{data.status === 'clear' ? 'Fault closed · strip clear' : 'Fault closed'}</Notice>
        </div>
      )}
      {faultList && data.openFaults.length > 0 && (
        <Card className="mb-4 border-fail/40">
          <h2 className="text-lg font-semibold">Faults on this strip</h2>
          <ul className="mt-2 divide-y divide-line">
            {data.openFaults.map((f) => (
              <li key={f.id} className="flex flex-wrap items-center gap-3 py-2">
                <StatusMark
                  shape={FAULT_SYMBOLS[f.status].shape}
                  tone={FAULT_SYMBOLS[f.status].tone}
                  label={FAULT_STATUS_LABELS[f.status]}
                  size="sm"
                />
                <span>
                  {f.positionName}: {FAULT_KIND_LABELS[f.kind]} ({f.conductors}){f.equipment ? ` · ${f.equipment.assetTag}` : ''}
                </span>
                <Link to={paths.fault(f.id)} className="inline-flex min-h-touch items-center font-medium text-brand underline">
                  {f.status === 'repaired' ? 'See the repair' : 'Locate and repair'}
                </Link>
              </li>
            ))}
          </ul>
        </Card>
      )}
    </>
  );
  const openOnTablet = async (input: CreateIncidentInput) => {
    if (!me.data) throw new Error('Sign in again to open an incident.');
    // Kept on the tablet first, like a reading: it reaches the server once, whenever it can.
    await enqueueIncident({
      body: { ...input, clientId: newReadingId() },
      userId: me.data.id,
      venueId: data.venueId,
      where: `${data.label} · ${input.symptom}`,
    });
    setReporting(false);
  };
  const incidentSection = openIncident ? (
    <Suspense fallback={<Loading />}>
      <IncidentCard
        key={openIncident.id}
        incidentId={openIncident.id}
        canWrite={canWrite}
        positions={data.positions.map((p) => ({
          id: p.id,
          name: p.name,
          equipmentKind: p.equipmentKind,
          assetTag: p.equipment?.assetTag ?? null,
        }))}
        spares={spares.data?.spares ?? []}
      />
    </Suspense>
  ) : queuedIncident ? (
    <div className="mb-4 flex flex-wrap items-center gap-3 rounded-card border-2 border-fail/50 bg-card p-4">
      <QueuedIncidentMark item={queuedIncident} />
      <span>
        {queuedIncident.body.symptom}: opened on this tablet
        {outbox.online ? ', sending…' : ' while offline; it goes when the network is back'}. Keep measuring: the readings follow it.
      </span>
    </div>
  ) : reporting ? (
    <div className="mb-4">
      <Suspense fallback={<Loading />}>
        <OpenIncidentPanel
          strip={{ id: data.id, label: data.label, positions: data.positions.map((p) => ({ id: p.id, name: p.name })) }}
          onOpen={openOnTablet}
          onClose={() => setReporting(false)}
        />
      </Suspense>
    </div>
  ) : canWrite && competing ? (
    <div className="mb-4">
      <Button variant="secondary" className="min-h-14! border-fail/50 text-fail" onClick={() => setReporting(true)}>
        Report a problem on {data.label}
      </Button>
    </div>
  ) : null;
  const viewToggle = (
    <span role="group" aria-label="Layout" className="inline-flex overflow-hidden rounded-lg border border-line">
      {(['grid', 'list'] as const).map((v) => (
        <button
          key={v}
          type="button"
          aria-pressed={view === v}
          onClick={() => switchView(v)}
          className={`min-h-touch px-3 text-sm font-medium ${view === v ? 'bg-brand text-white' : 'bg-card'}`}
        >
          {v === 'grid' ? 'Grid' : 'Step list'}
        </button>
      ))}
    </span>
  );
  const leadNull = canWrite && me.data && (
    <LeadNull
      leadNull={lead}
      userId={me.data.id}
      onChange={(next) => {
        saveLeadNull(next);
        setLead(next);
        if (next) void recordLeadNull(next);
        // Back to the first step not measured: the lead null is usually done before the strip.
        setFocusRequest((x) => x + 1);
        if (view === 'list')
          requestAnimationFrame(() => focusStep((flat.find((f) => !f.step.latest && !queued.has(f.step.id)) ?? flat[0])?.step.id));
      }}
    />
  );

  // Another strip by its label, or by an item's label (the strip that item sits on, in this venue first).
  const scanButton = (
    <button
      type="button"
      onClick={() => setScanning(true)}
      className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-3 font-medium"
    >
      Scan a label
    </button>
  );
  // The service worker has the panel's chunk for a tablet offline (the camera needs https, as it does).
  const scanner = scanning && (
    <Suspense fallback={<Loading label="Opening the scanner" />}>
      <LabelScanner
        title="Open a strip by its label"
        hint="Point the camera at the code on a strip’s label, or on the label of an item on it."
        onClose={() => setScanning(false)}
        onCode={async (code) => {
          const found = await stripForCode(code, data.venueId);
          if ('message' in found) return found.message;
          setScanning(false);
          navigate(paths.stripTest(found.stripId));
          return undefined;
        }}
      />
    </Suspense>
  );

  return (
    <>
      {scanner}
      {canWrite && <SafetyNotice onAcknowledged={() => setReady(true)} />}
      <StripBar label={data.label} done={measuredHere} total={data.counts.total} waiting={waitingHere} sync={syncShown}>
        {viewToggle}
      </StripBar>
      {view === 'grid' ? (
        <>
          <div className="mb-2 flex flex-wrap items-center gap-x-3 gap-y-2">
            <h1 className="text-lg font-semibold">{data.label} — testing</h1>
            <span data-testid="strip-status">
              <StatusMark shape={stripLook.shape} tone={stripLook.tone} label={stripLook.label} />
            </span>
            <span className="text-sm text-ink-soft">
              <Link to={paths.venue(data.venueId)} className="underline">
                {data.venueName}
              </Link>
            </span>
            <span className="ml-auto flex flex-wrap items-center gap-2">
              {scanButton}
              {leadNull}
              {data.previousStripId && (
                <Link
                  to={paths.stripTest(data.previousStripId)}
                  className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-3 text-sm font-medium"
                >
                  ← Previous
                </Link>
              )}
              {data.nextStripId && (
                <Link
                  to={paths.stripTest(data.nextStripId)}
                  className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-3 text-sm font-medium"
                >
                  Next strip →
                </Link>
              )}
            </span>
          </div>
          {notices(false)}
          <EntryGrid
            limitsName={`${data.profile.name} v${data.profile.version}`}
            positions={data.positions}
            profile={profile}
            leadNull={lead}
            canWrite={canWrite}
            faults={data.openFaults}
            queued={queued}
            retest={retestPosition ? { positionId: retestPosition, since: retestSince } : null}
            ready={focusReady}
            focusRequest={focusRequest}
            nextStripId={data.nextStripId}
            boardHref={paths.venueBoard(data.venueId)}
            submit={submitReading}
          />
        </>
      ) : (
        <>
          <PageHeader
            title={`${data.label} — testing`}
            subtitle={
              <>
                <Link to={paths.venue(data.venueId)} className="underline">
                  {data.venueName}
                </Link>
                {data.zone ? ` · ${data.zone}` : ''} · limits: {data.profile.name} v{data.profile.version}
              </>
            }
            actions={
              <>
                {scanButton}
                {data.previousStripId && (
                  <Link
                    to={paths.stripTest(data.previousStripId)}
                    className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
                  >
                    ← Previous strip
                  </Link>
                )}
                {data.nextStripId && (
                  <Link
                    ref={nextStripLink}
                    to={paths.stripTest(data.nextStripId)}
                    className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
                  >
                    Next strip →
                  </Link>
                )}
                <Link
                  to={paths.venueBoard(data.venueId)}
                  className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
                >
                  Status board
                </Link>
              </>
            }
          />

          <Card className="mb-4 grid gap-4 md:grid-cols-[auto_1fr_1fr] md:items-center">
            <div data-testid="strip-status">
              <StatusMark shape={stripLook.shape} tone={stripLook.tone} label={stripLook.label} size="lg" />
            </div>
            <ProgressBar done={data.counts.done} total={data.counts.total} label="This strip: steps measured" />
            <ProgressBar
              done={data.venueProgress.stepsDone}
              total={data.venueProgress.stepsTotal}
              label={`This venue: steps measured (${data.venueProgress.stripsClear} of ${data.venueProgress.stripCount} strips clear)`}
            />
            {canWrite && <div className="md:col-span-3">{leadNull}</div>}
          </Card>

          {notices(true)}
          <div className="flex flex-col gap-4">
            {data.positions.map((position) => (
              <section
                key={position.id}
                aria-label={position.name}
                className={`overflow-hidden rounded-card border border-line bg-card shadow-sm ${retestPosition === position.id ? 'ring-2 ring-brass' : ''}`}
              >
                <header className="flex flex-wrap items-baseline gap-x-3 border-b border-line bg-paper px-4 py-3">
                  <h2 className="text-lg font-semibold">{position.name}</h2>
                  <span className="text-sm text-ink-soft">
                    {position.equipment
                      ? `${position.equipment.assetTag}${position.equipment.lengthM !== null ? ` · ${formatLength(position.equipment.lengthM, unit)}` : ''}`
                      : 'No item attached'}
                  </span>
                </header>
                {position.steps.length === 0 ? (
                  <p className="px-4 py-3 text-sm text-ink-soft">Nothing to measure here with a multimeter.</p>
                ) : (
                  <ol>
                    {position.steps.map((step) => {
                      n += 1;
                      const at = flat.findIndex((f) => f.step.id === step.id);
                      const fault = data.openFaults.find((f) => f.stepId === step.id);
                      return (
                        <StepRow
                          key={step.id}
                          index={n}
                          step={step}
                          ctx={{
                            profile,
                            equipmentKind: position.equipmentKind,
                            testKind: step.testKind,
                            conductors: step.conductors,
                            lengthM: position.equipment?.lengthM ?? null,
                          }}
                          leadNull={lead}
                          canWrite={canWrite}
                          faultId={fault?.id ?? null}
                          highlight={retestPosition === position.id}
                          retested={isRetested(position.id, step)}
                          showCaution={cautionSteps.has(step.id)}
                          queued={queued.get(step.id) ?? null}
                          inputRef={(el) => {
                            if (el) inputs.current.set(step.id, el);
                            else inputs.current.delete(step.id);
                          }}
                          submit={(input, preview) => submitReading(position, step, input, preview)}
                          onRecorded={() => focusStep(flat[at + 1]?.step.id)}
                        />
                      );
                    })}
                  </ol>
                )}
              </section>
            ))}
          </div>
        </>
      )}
    </>
  );
}
