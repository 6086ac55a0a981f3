import type { FieldValues, Path, UseFormReset, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * A refused save on a react-hook-form form: each field error the server named lands on its field,
 * and the message (or `fallback`, for an error that is not the server's) on the form's root, with
 * the HTTP status as its type (`'412'`: someone else saved first).
 */
export function showServerErrors<T extends FieldValues>(setError: UseFormSetError<T>, err: unknown, fallback: string) {
  if (err instanceof ApiError) for (const e of err.errors) setError(e.path as Path<T>, { message: e.message });
  setError('root', {
    type: err instanceof ApiError ? String(err.status) : 'error',
    message: err instanceof Error ? err.message : fallback,
  });
}

/** The submit handler of a "create" form: save, then clear the form; a refusal shows on its fields. */
export function saveThenReset<T extends FieldValues, V = T>(
  form: { setError: UseFormSetError<T>; reset: UseFormReset<T> },
  save: (values: V) => Promise<unknown>,
  fallback: string,
) {
  return async (values: V) => {
    try {
      await save(values);
      form.reset();
    } catch (err) {
      showServerErrors(form.setError, err, fallback);
    }
  };
}

/**
 * Every message under one place of a form's errors: a field's own, or a list's and its items' (for
 * errors a body-checking resolver puts at paths the form has no single field for).
 */
export function messagesUnder(error: unknown): string[] {
  if (!error || typeof error !== 'object') return [];
  const {
    message,
    ref: _ref,
    type: _type,
    types: _types,
    ...nested
  } = error as { message?: unknown; ref?: unknown; type?: unknown; types?: unknown };
  return [...(typeof message === 'string' ? [message] : []), ...Object.values(nested).flatMap(messagesUnder)];
}
