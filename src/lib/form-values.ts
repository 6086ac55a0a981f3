import type { UseFormRegisterReturn } from 'react-hook-form';

/** A typed decimal for a `setValueAs`: empty is null, a decimal comma is read as a point. */
export const decimalOrNull = (v: unknown) => {
  if (v === null || v === undefined) return null;
  const text = String(v).trim();
  return text === '' ? null : Number(text.replace(',', '.'));
};

/** Empty text is null, for optional text the API clears with null. */
export const textOrNull = (v: unknown) => (v === '' || v === undefined ? null : v);

/**
 * Upper-cases what is typed into a registered input as it is typed (asset tags), keeping the caret
 * where it was.
 */
export function typedUpperCase<N extends string>(field: UseFormRegisterReturn<N>): UseFormRegisterReturn<N> {
  return {
    ...field,
    onChange: (e) => {
      const input = e.target as HTMLInputElement;
      const upper = input.value.toUpperCase();
      if (upper !== input.value) {
        const { selectionStart, selectionEnd } = input;
        input.value = upper;
        input.setSelectionRange(selectionStart, selectionEnd);
      }
      return field.onChange(e);
    },
  };
}

/**
 * `resetOptions` of a form that shows the server's copy through `values`: a newer copy (after a
 * reload) replaces only the fields the person has not touched, so what was typed is never lost;
 * the complaints and the "saved" state stay until the next submit.
 */
export const keepTyped = { keepDirtyValues: true, keepErrors: true, keepIsSubmitSuccessful: true } as const;
