import { useMe } from '../api/get-me';
import { useUpdatePreferences } from '../api/update-preferences';

/** Metric or imperial display, kept as the user's preference. */
export function UnitToggle() {
  const me = useMe();
  const update = useUpdatePreferences();
  const system = me.data?.unitSystem ?? 'metric';
  return (
    <button
      type="button"
      className="min-h-touch rounded-md border border-white/30 px-3 text-xs font-medium hover:bg-white/10"
      aria-label={`Lengths shown in ${system === 'metric' ? 'metres' : 'feet'}; switch`}
      onClick={() => update.mutate({ unitSystem: system === 'metric' ? 'imperial' : 'metric' })}
    >
      {system === 'metric' ? 'm' : 'ft'}
    </button>
  );
}
