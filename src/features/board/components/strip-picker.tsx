import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import type { BoardStrip } from '../api/get-board';

/** Type a strip's number (or label) and press Enter to open it. */
export function StripPicker({ strips, onPick }: { strips: BoardStrip[]; onPick: (s: BoardStrip) => void }) {
  const form = useForm({ defaultValues: { text: '' } });
  const error = form.formState.errors.text?.message;
  const find = (q: string) => {
    const t = q.trim().toLowerCase();
    if (!t) return undefined;
    return (
      strips.find((s) => s.label.toLowerCase() === t) ?? strips.find((s) => (s.label.match(/\d+/)?.[0] ?? '') === t.replace(/^0+/, ''))
    );
  };
  return (
    <form
      className="flex flex-wrap items-center gap-2"
      onSubmit={form.handleSubmit(({ text }) => {
        const s = find(text);
        if (s) onPick(s);
        else form.setError('text', { message: `No strip “${text.trim()}” in this venue.` });
      })}
    >
      <label htmlFor="strip-number" className="text-sm font-medium">
        Go to strip number
      </label>
      <input
        id="strip-number"
        inputMode="numeric"
        autoComplete="off"
        className="min-h-touch w-24 rounded-lg border border-line bg-card px-3 text-lg"
        {...form.register('text', { onChange: () => form.clearErrors('text') })}
      />
      <Button type="submit">Open</Button>
      {error && (
        <p role="alert" className="text-sm text-fail">
          {error}
        </p>
      )}
    </form>
  );
}
