import type { FieldValues, Path, UseFormReset, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * A refused save on a react-hook-form form: each field error the server named lands on its field,
 * and the message (or `fallback`, for an error that is not the server's) on the form's root.
 */
export function showServerErrors<T extends FieldValues>(setError: UseFormSetError<T>, err: unknown, fallback: string) {
  if (err instanceof ApiError) for (const e of err.errors) setError(e.path as Path<T>, { message: e.message });
  setError('root', { message: err instanceof Error ? err.message : fallback });
}

/** The server's message for one field of a refused save, for forms kept in plain state. */
export const fieldErrorOf = (error: unknown, path: string) => (error instanceof ApiError ? error.errors.find((e) => e.path === path)?.message : undefined);

/** The submit handler of a "create" form: save, then clear the form; a refusal shows on its fields. */
export function saveThenReset<T extends FieldValues>(
  form: { setError: UseFormSetError<T>; reset: UseFormReset<T> },
  save: (values: T) => Promise<unknown>,
  fallback: string,
) {
  return async (values: T) => {
    try {
      await save(values);
      form.reset();
    } catch (err) {
      showServerErrors(form.setError, err, fallback);
    }
  };
}
