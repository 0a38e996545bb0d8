import { useEffect, useId, useRef, useState } from 'react';
import { useNavigate } from 'react-router';
import type { PublicUser } from '../../../shared/auth.js';
import { ChevronDownIcon } from '../../components/ui/icons.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useSignOut } from '../../core/session/me.js';

function initials(name: string) {
  const parts = name.trim().split(/\s+/);
  return ((parts[0]?.[0] ?? '') + (parts.length > 1 ? parts[parts.length - 1][0] : '')).toUpperCase() || '?';
}

/** The account button at the right of the top bar: who is signed in, and sign-out. */
export function UserMenu({ user }: { user: PublicUser }) {
  const [open, setOpen] = useState(false);
  const menuId = useId();
  const root = useRef<HTMLDivElement>(null);
  const signOut = useSignOut();
  const navigate = useNavigate();

  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent | KeyboardEvent) => {
      if (e instanceof KeyboardEvent ? e.key === 'Escape' : !root.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', close);
    document.addEventListener('keydown', close);
    return () => {
      document.removeEventListener('mousedown', close);
      document.removeEventListener('keydown', close);
    };
  }, [open]);

  return (
    <div ref={root} className="relative">
      <button
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={menuId}
        onClick={() => setOpen((o) => !o)}
        className="flex h-7 items-center gap-1.5 rounded-ctl pr-1 pl-0.5 text-ink-2 hover:bg-hover hover:text-ink"
      >
        <span aria-hidden="true" className="flex size-6 items-center justify-center rounded-full bg-accent-soft text-caption font-semibold text-accent">
          {initials(user.name)}
        </span>
        <span className="max-w-40 truncate text-ui">{user.name}</span>
        <ChevronDownIcon />
      </button>
      {open && (
        <div id={menuId} role="menu" aria-label="Account" className="absolute top-full right-0 z-30 mt-1 w-64 rounded-panel border border-line bg-surface py-1 shadow-lg">
          <div className="border-b border-line px-3 pt-1.5 pb-2">
            <p className="truncate font-medium">{user.name}</p>
            <p className="truncate text-caption text-ink-3">{user.email}</p>
            <p className="mt-1 text-caption text-ink-3">Site role: {user.siteRole === 'admin' ? 'Admin' : 'Member'}</p>
          </div>
          <button
            type="button"
            role="menuitem"
            autoFocus
            onClick={() => {
              setOpen(false);
              navigate('/account');
            }}
            className="mt-1 w-full px-3 py-1.5 text-left text-ui hover:bg-hover focus-visible:bg-hover"
          >
            Your account
          </button>
          {signOut.isError && <p className="px-3 py-1.5 text-caption text-danger">{sentence(signOut.error.message)}</p>}
          <button
            type="button"
            role="menuitem"
            disabled={signOut.isPending}
            onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in?signedOut=1', { replace: true }) })}
            className="mt-1 w-full px-3 py-1.5 text-left text-ui hover:bg-hover focus-visible:bg-hover"
          >
            {signOut.isPending ? 'Signing out…' : 'Sign out'}
          </button>
        </div>
      )}
    </div>
  );
}
