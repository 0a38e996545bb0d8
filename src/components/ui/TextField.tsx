import { useId, type InputHTMLAttributes } from 'react';

/** A labelled input whose error (from the API or a schema) is tied to it for screen readers. */
export function TextField({
  label,
  error,
  hint,
  className = '',
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: string }) {
  const id = useId();
  const describedBy = error ? `${id}-error` : hint ? `${id}-hint` : undefined;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-caption font-medium text-ink-2">
        {label}
      </label>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`h-8 rounded-ctl border bg-surface px-2 text-ui text-ink placeholder:text-ink-3 focus-visible:outline-2 ${
          error ? 'border-danger' : 'border-line-strong hover:border-ink-3'
        }`}
        {...input}
      />
      {error ? (
        <p id={`${id}-error`} className="text-caption text-danger">
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="text-caption text-ink-3">
          {hint}
        </p>
      ) : null}
    </div>
  );
}
