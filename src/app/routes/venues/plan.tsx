import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { usePlan } from '@/features/plan/api/get-plan';
import { usePlanningPeople } from '@/features/plan/api/get-planning-people';
import { useUpdateVenue } from '@/features/plan/api/update-venue';
import { useAddStrips } from '@/features/plan/api/add-strips';
import { useUpdateStrip } from '@/features/plan/api/update-strip';
import { useWithdrawStrip } from '@/features/plan/api/withdraw-strip';
import { useReinstateStrip } from '@/features/plan/api/reinstate-strip';
import { useAddStep } from '@/features/plan/api/add-step';
import { useDropStep } from '@/features/plan/api/drop-step';
import { useAddPosition } from '@/features/plan/api/add-position';
import { useRemovePosition } from '@/features/plan/api/remove-position';
import { EditProblem } from '@/features/plan/components/conflict-notice';
import { VenueDetailsForm } from '@/features/plan/components/venue-details-form';
import { BulkStripsForm } from '@/features/plan/components/bulk-strips-form';
import { StripEditor, type StripEditorActions } from '@/features/plan/components/strip-editor';
import { useProfiles } from '@/features/profiles/api/get-profiles';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { venueLabelsUrl } from '@/features/labels/api/label-sheets';

const STATUS = {
  planning: ['ring', 'idle', 'Planning'],
  testing: ['half', 'brand', 'Testing'],
  'signed-off': ['circle', 'pass', 'Signed off'],
} as const;

export default function VenuePlanPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const plan = usePlan(venueId);
  const canEdit = me.data?.role === 'director';
  const people = usePlanningPeople(canEdit);
  const profiles = useProfiles();
  const [selected, setSelected] = useState<string | null>(null);
  const [problem, setProblem] = useState<{ error: unknown; what: string } | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const updateVenue = useUpdateVenue(venueId);
  const addStrips = useAddStrips(venueId);
  const updateStrip = useUpdateStrip(venueId);
  const withdraw = useWithdrawStrip(venueId);
  const reinstate = useReinstateStrip(venueId);
  const addStep = useAddStep(venueId);
  const dropStep = useDropStep(venueId);
  const addPosition = useAddPosition(venueId);
  const removePosition = useRemovePosition(venueId);

  if (plan.isPending) return <Loading />;
  if (plan.isError) return <Notice tone="error">{plan.error.message}</Notice>;
  const p = plan.data;
  const version = p.venue.version;

  /** Runs one edit with the version on screen; says what happened, keeps typed values on failure. */
  async function run(what: string, call: () => Promise<unknown>): Promise<boolean> {
    setProblem(null);
    setDone(null);
    try {
      await call();
      setDone(`${what}: saved.`);
      return true;
    } catch (error) {
      setProblem({ error, what });
      return false;
    }
  }

  const strip = p.strips.find((s) => s.id === selected) ?? p.strips[0];
  const actions: StripEditorActions | null = strip
    ? {
        updateStrip: async (patch) => {
          let refused: { path: string; message: string }[] = [];
          const ok = await run(`${patch.label ?? strip.label}`, () =>
            updateStrip.mutateAsync({ stripId: strip.id, patch, version }).catch((error: unknown) => {
              if (error instanceof ApiError) refused = error.errors;
              throw error;
            }),
          );
          return ok || refused;
        },
        withdraw: (reason) => run(`${strip.label} withdrawn`, () => withdraw.mutateAsync({ stripId: strip.id, reason, version })),
        reinstate: () => run(`${strip.label} reinstated`, () => reinstate.mutateAsync({ stripId: strip.id, version })),
        addStep: (positionId, step) => run('Step added', () => addStep.mutateAsync({ positionId, step, version })),
        dropStep: (stepId) => run('Step dropped', () => dropStep.mutateAsync({ stepId, version })),
        addPosition: (position) =>
          run(`${position.name.trim()} added to ${strip.label}`, () => addPosition.mutateAsync({ stripId: strip.id, position, version })),
        removePosition: (positionId) => {
          const name = strip.positions.find((x) => x.id === positionId)?.name ?? 'Position';
          return run(`${name} removed from ${strip.label}`, () => removePosition.mutateAsync({ positionId, version }));
        },
      }
    : null;
  const [shape, tone, label] = STATUS[p.venue.status];
  const nextNumber = p.strips.length + 1;

  return (
    <>
      <PageHeader
        title={`Plan: ${p.venue.name}`}
        subtitle={
          <>
            <Link className="text-brand underline" to={paths.event(p.event.id)}>
              {p.event.name}
            </Link>{' '}
            · {p.strips.length} strips · plan version {version}
            {!canEdit && ' · read only for your role'}
          </>
        }
        actions={
          <>
            <StatusMark shape={shape} tone={tone} label={label} />
            <Link
              className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
              to={paths.venue(venueId)}
            >
              Venue
            </Link>
            <Link
              className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
              to={paths.venueReadings(venueId)}
            >
              Readings
            </Link>
            {me.data?.role !== 'technician' && (
              <Link
                className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
                to={paths.venueAudit(venueId)}
              >
                Audit trail
              </Link>
            )}
            {me.data?.role !== 'organiser' && (
              <a
                className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium"
                href={venueLabelsUrl(venueId)}
                target="_blank"
                rel="noreferrer"
              >
                Print labels
              </a>
            )}
          </>
        }
      />
      <div className="sticky top-0 z-10 mb-4 flex flex-col gap-2" aria-live="polite">
        {problem && (
          <EditProblem
            error={problem.error}
            shownVersion={version}
            onReload={() => {
              setProblem(null);
              void plan.refetch();
            }}
          />
        )}
        {done && !problem && <Notice tone="success">{done}</Notice>}
        {p.venue.status === 'signed-off' && canEdit && (
          <Notice tone="caution">
            This venue is signed off. Any change to the plan re-opens it and marks its certificates superseded.
          </Notice>
        )}
      </div>
      <div className="grid gap-6 lg:grid-cols-[18rem_1fr]">
        <div className="flex flex-col gap-6">
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Venue</h2>
            <VenueDetailsForm
              plan={p}
              readOnly={!canEdit}
              profiles={
                profiles.data ?? [
                  { name: p.profile.name, lineageId: p.profile.lineageId, versions: [{ id: p.profile.id, version: p.profile.version }] },
                ]
              }
              people={canEdit ? people.data?.technicians : undefined}
              onSave={(v) => run('Venue', () => updateVenue.mutateAsync({ ...v, version }))}
            />
          </Card>
          {canEdit && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold">Add strips</h2>
              <BulkStripsForm
                nextNumber={nextNumber}
                onAdd={(body) => run('Strips added', () => addStrips.mutateAsync({ ...body, version }))}
              />
            </Card>
          )}
        </div>
        <div className="flex flex-col gap-4">
          {p.strips.length === 0 ? (
            <Card>
              <p className="text-ink-soft">No strips yet. {canEdit ? 'Add them in bulk on the left.' : ''}</p>
            </Card>
          ) : (
            <>
              <nav aria-label="Strips" className="flex flex-wrap gap-2">
                {p.strips.map((s) => (
                  <button
                    key={s.id}
                    type="button"
                    aria-current={s.id === strip?.id ? 'true' : undefined}
                    onClick={() => setSelected(s.id)}
                    className={`min-h-touch min-w-touch rounded-lg border px-3 text-sm font-medium ${s.id === strip?.id ? 'border-brand bg-brand text-white' : 'border-line bg-card hover:bg-brand-soft'} ${s.withdrawnAt ? 'line-through opacity-70' : ''}`}
                    title={s.withdrawnAt ? `Withdrawn: ${s.withdrawnReason}` : (s.zone ?? undefined)}
                  >
                    {s.label}
                  </button>
                ))}
              </nav>
              {strip && actions && (
                <Card>
                  <h2 className="mb-3 text-xl font-semibold">
                    {strip.label}
                    {strip.zone && <span className="ml-2 text-base font-normal text-ink-soft">{strip.zone}</span>}
                  </h2>
                  <StripEditor
                    key={strip.id}
                    strip={strip}
                    readOnly={!canEdit}
                    actions={actions}
                    strips={p.strips}
                    loopRequired={p.profile.loopRequired}
                  />
                </Card>
              )}
            </>
          )}
        </div>
      </div>
    </>
  );
}
