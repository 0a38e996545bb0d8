import type { ReactNode } from 'react';

/** The frame of a list or settings page: a title row with actions, then the content. */
export function Page({ title, description, actions, children, width = 'max-w-5xl' }: { title: string; description?: ReactNode; actions?: ReactNode; children: ReactNode; width?: string }) {
  return (
    <div className={`mx-auto w-full ${width} px-6 py-5`}>
      <div className="mb-4 flex items-end justify-between gap-4">
        <div className="min-w-0">
          <h1 className="text-heading font-semibold tracking-tight">{title}</h1>
          {description && <p className="mt-0.5 text-ui text-ink-3">{description}</p>}
        </div>
        {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
      </div>
      {children}
    </div>
  );
}

/** Placeholder rows while a list loads, sized like the real rows so nothing jumps. */
export function LoadingRows({ rows = 4, label }: { rows?: number; label: string }) {
  return (
    <div role="status" aria-label={label} className="flex flex-col gap-px overflow-hidden rounded-panel border border-line bg-line">
      {Array.from({ length: rows }, (_, i) => (
        <div key={i} className="h-9 animate-pulse bg-surface" />
      ))}
    </div>
  );
}
