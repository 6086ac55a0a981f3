import { useForm } from 'react-hook-form';
import { sparesSchema, type SparesInput } from '@shared/schemas/incidents';
import { bodyResolver } from '@/lib/form-resolver';
import { messagesUnder, showServerErrors } from '@/lib/form-errors';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';

interface SparesForm {
  text: string;
}

/** One asset tag a line (or separated by commas or spaces), as a person types a list on a tablet. */
const toBody = ({ text }: SparesForm): SparesInput => ({
  assetTags: text
    .split(/[\s,;]+/)
    .map((t) => t.trim())
    .filter(Boolean),
});

/** The director sets the venue's pool of spares by asset tag; the shared schema checks the list first. */
export function SparesEditor({ current, onSave }: { current: string[]; onSave: (body: SparesInput) => Promise<unknown> }) {
  const form = useForm<SparesForm, unknown, SparesInput>({
    resolver: bodyResolver(sparesSchema, toBody),
    defaultValues: { text: current.join('\n') },
  });
  // The resolver puts the schema's messages at the body's path (assetTags), which no field of the form has.
  const errs = form.formState.errors as Record<string, unknown>;
  const errors = [...messagesUnder(errs.assetTags), ...messagesUnder(form.formState.errors.root)];
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (body) => {
        try {
          await onSave(body);
          form.reset({ text: body.assetTags.join('\n') });
        } catch (err) {
          showServerErrors(form.setError, err, 'The pool could not be saved.');
        }
      })}
    >
      <label htmlFor="spare-tags" className="text-sm font-medium">
        Spare asset tags, one a line
      </label>
      <textarea
        id="spare-tags"
        rows={8}
        spellCheck={false}
        autoCapitalize="characters"
        className="rounded-lg border border-line bg-card p-3 font-mono text-base"
        aria-invalid={errors.length > 0 ? true : undefined}
        {...form.register('text')}
      />
      <p className="text-xs text-ink-soft">
        Items must be in the register. Each new spare gets its kind&apos;s checklist; test it before the event like any position.
      </p>
      {errors.length > 0 && <Notice tone="error">{errors.join(' ')}</Notice>}
      <Button type="submit" className="min-h-14! self-start" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? 'Saving…' : 'Save the spare pool'}
      </Button>
    </form>
  );
}
