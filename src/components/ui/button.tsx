import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const styles: Record<Variant, string> = {
  primary: 'bg-brand text-white hover:bg-brand/90 disabled:bg-brand/50',
  secondary: 'bg-card text-ink border border-line hover:bg-paper disabled:text-ink-soft',
  danger: 'bg-fail text-white hover:bg-fail/90 disabled:bg-fail/50',
  ghost: 'bg-transparent text-brand hover:bg-brand-soft',
};

export function Button({
  variant = 'primary',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex min-h-touch items-center justify-center gap-2 rounded-lg px-4 font-medium transition-colors disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...props}
    />
  );
}
