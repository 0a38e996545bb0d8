import type { ReactNode } from 'react';

export type NoticeTone = 'info' | 'error' | 'caution' | 'success';

const tones: Record<NoticeTone, string> = {
  info: 'bg-accent-soft border-accent-line text-ink',
  error: 'bg-danger-soft border-danger-line text-ink',
  caution: 'bg-caution-soft border-caution-line text-ink',
  success: 'bg-ok-soft border-line text-ink',
};

const titleTones: Record<NoticeTone, string> = {
  info: 'text-accent',
  error: 'text-danger',
  caution: 'text-caution',
  success: 'text-ok',
};

/** A boxed message. Errors are announced (role=alert); the rest are plain status text. */
export function Notice({ tone = 'info', title, children, className = '' }: { tone?: NoticeTone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-ctl border px-3 py-2 text-ui ${tones[tone]} ${className}`}>
      {title && <p className={`font-semibold ${titleTones[tone]}`}>{title}</p>}
      {children && <div className={title ? 'mt-0.5 text-ink-2' : ''}>{children}</div>}
    </div>
  );
}
