import { forwardRef, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

interface FieldProps {
  label: string;
  error?: string;
  hint?: ReactNode;
}

const inputClass =
  'min-h-touch w-full rounded-lg border border-line bg-card px-3 text-base text-ink placeholder:text-ink-soft/70 aria-[invalid=true]:border-fail';

export const TextField = forwardRef<HTMLInputElement, FieldProps & InputHTMLAttributes<HTMLInputElement>>(function TextField(
  { label, error, hint, id, className = '', ...props },
  ref,
) {
  const fieldId = id ?? `f-${props.name}`;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={fieldId} className="text-sm font-medium text-ink">
        {label}
      </label>
      <input
        ref={ref}
        id={fieldId}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${fieldId}-error` : hint ? `${fieldId}-hint` : undefined}
        className={inputClass}
        {...props}
      />
      {hint && !error && (
        <p id={`${fieldId}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${fieldId}-error`} role="alert" className="text-xs font-medium text-fail">
          {error}
        </p>
      )}
    </div>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { children: ReactNode }>(
  function SelectField({ label, error, hint, id, className = '', children, ...props }, ref) {
    const fieldId = id ?? `f-${props.name}`;
    return (
      <div className={`flex flex-col gap-1 ${className}`}>
        <label htmlFor={fieldId} className="text-sm font-medium text-ink">
          {label}
        </label>
        <select ref={ref} id={fieldId} aria-invalid={error ? true : undefined} className={inputClass} {...props}>
          {children}
        </select>
        {hint && !error && <p className="text-xs text-ink-soft">{hint}</p>}
        {error && (
          <p role="alert" className="text-xs font-medium text-fail">
            {error}
          </p>
        )}
      </div>
    );
  },
);
