import type { ReactNode } from 'react';
import { OrbitabMark } from './icons.js';

/** The quiet frame around the sign-in and sign-up forms. */
export function AuthFrame({ title, children, footer }: { title: string; children: ReactNode; footer: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center bg-canvas px-4 py-10">
      <div className="mb-5 flex items-center gap-2">
        <OrbitabMark size={22} />
        <span className="text-title font-semibold tracking-tight">Orbitab</span>
      </div>
      <section aria-labelledby="auth-title" className="w-full max-w-[22rem] rounded-panel border border-line bg-surface px-5 py-5 shadow-sm">
        <h1 id="auth-title" className="mb-4 text-title font-semibold">
          {title}
        </h1>
        {children}
      </section>
      <p className="mt-4 text-ui text-ink-3">{footer}</p>
      <p className="mt-8 max-w-sm text-center text-caption text-ink-3">
        Valence electronic structure for screening small molecules and ions, computed in a shared spreadsheet.
      </p>
    </main>
  );
}
