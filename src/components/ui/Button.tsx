import type { ButtonHTMLAttributes } from 'react';

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-on-accent border-accent hover:bg-accent-strong hover:border-accent-strong',
  secondary: 'bg-surface text-ink border-line-strong hover:bg-hover',
  ghost: 'bg-transparent text-ink-2 border-transparent hover:bg-hover hover:text-ink',
  danger: 'bg-danger text-on-accent border-danger hover:bg-danger-strong hover:border-danger-strong',
};

/** Compact buttons (28px high) for a dense desktop-tool layout. */
export function Button({
  variant = 'secondary',
  busy = false,
  className = '',
  children,
  disabled,
  type = 'button',
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant; busy?: boolean }) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex h-7 shrink-0 items-center justify-center gap-1.5 rounded-ctl border px-2.5 text-ui font-medium whitespace-nowrap transition-colors disabled:opacity-55 ${variants[variant]} ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}

/** A square icon-only button; `label` is its accessible name and tooltip. */
export function IconButton({
  label,
  className = '',
  children,
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { label: string }) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      className={`inline-flex size-7 items-center justify-center rounded-ctl text-ink-2 hover:bg-hover hover:text-ink ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}
