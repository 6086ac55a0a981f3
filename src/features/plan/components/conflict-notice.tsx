import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';

/** What a refused plan edit says: a 412 shows both versions and a way to load the current plan. */
export function EditProblem({ error, shownVersion, onReload }: { error: unknown; shownVersion: number; onReload: () => void }) {
  if (!error) return null;
  if (error instanceof ApiError && error.status === 412) {
    const current = typeof error.body.currentVersion === 'number' ? error.body.currentVersion : null;
    const yours = typeof error.body.yourVersion === 'number' ? error.body.yourVersion : shownVersion;
    return (
      <Notice tone="caution">
        <p className="text-base font-semibold">Changed meanwhile — your change was not saved</p>
        <p className="mt-1">
          Someone else changed this plan after you loaded it. You were editing version {yours}
          {current !== null && <>; the plan is now at version {current}</>}.
        </p>
        <p className="mt-1">What you typed is still in the form. Load the current plan, check their changes, then save yours again.</p>
        <Button variant="secondary" className="mt-2" onClick={onReload}>
          Load the current plan{current !== null ? ` (version ${current})` : ''}
        </Button>
      </Notice>
    );
  }
  return <Notice tone="error">{error instanceof Error ? error.message : 'The change could not be saved.'}</Notice>;
}
