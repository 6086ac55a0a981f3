import { useMe } from '../api/get-me';
import { useUpdatePreferences } from '../api/update-preferences';

const CHOICES = [
  { system: 'metric', short: 'm', long: 'metres' },
  { system: 'imperial', short: 'ft', long: 'feet' },
] as const;

/** Metric or imperial display, kept as the user's preference: a labelled pair of radio buttons. */
export function UnitToggle() {
  const me = useMe();
  const update = useUpdatePreferences();
  const current = me.data?.unitSystem ?? 'metric';
  return (
    <fieldset className="flex items-center gap-2 text-sm">
      <legend className="float-left mr-2 font-medium">Lengths</legend>
      <div className="flex rounded-md border border-white/40">
        {CHOICES.map((c) => (
          <label
            key={c.system}
            className="flex min-h-touch min-w-11 cursor-pointer items-center justify-center px-2 font-semibold first:rounded-l-md last:rounded-r-md has-checked:bg-white has-checked:text-brand has-focus-visible:outline-2 has-focus-visible:outline-brass"
          >
            <input
              type="radio"
              name="unit-system"
              className="sr-only"
              value={c.system}
              checked={current === c.system}
              aria-label={c.long}
              onChange={() => update.mutate({ unitSystem: c.system })}
            />
            <span aria-hidden>{c.short}</span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
