import { NavLink, Outlet, useLocation } from 'react-router';
import { OrbitabMark } from '../../components/ui/icons.js';
import { useMe } from '../../core/session/me.js';
import { ThemeToggle } from '../theme/ThemeToggle.js';
import { UserMenu } from './UserMenu.js';
import { ConfirmAddress } from '../../features/auth/AccountPage.js';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `flex h-7 items-center rounded-ctl px-2.5 text-ui font-medium ${isActive ? 'bg-accent-soft text-accent' : 'text-ink-2 hover:bg-hover hover:text-ink'}`;

/** The signed-in frame: a slim top bar, then the page filling the rest of the window. */
export function AppLayout() {
  // The route guard has loaded the user before this renders.
  const user = useMe().data;
  // An open workbook still belongs under "Workbooks".
  const inWorkbooks = /^\/(workbooks\/|$)/.test(useLocation().pathname);
  return (
    <div className="flex h-screen flex-col bg-canvas text-ink">
      <header className="flex h-10 shrink-0 items-center gap-4 border-b border-line bg-surface px-3">
        <NavLink to="/" className="flex items-center gap-1.5 rounded-ctl pr-1 text-ui font-semibold tracking-tight text-ink">
          <OrbitabMark />
          Orbitab
        </NavLink>
        <nav aria-label="Main" className="flex items-center gap-0.5">
          <NavLink to="/" className={() => navClass({ isActive: inWorkbooks })}>
            Workbooks
          </NavLink>
          <NavLink to="/functions" className={navClass}>
            Functions
          </NavLink>
          {user?.siteRole === 'admin' && (
            <NavLink to="/admin" end className={navClass}>
              Users
            </NavLink>
          )}
          {user?.siteRole === 'admin' && (
            <NavLink to="/admin/mail" className={navClass}>
              Mail
            </NavLink>
          )}
        </nav>
        <div className="ml-auto flex items-center gap-1">
          <ThemeToggle />
          {user && <UserMenu user={user} />}
        </div>
      </header>
      {user && !user.emailVerified && (
        <div className="shrink-0 border-b border-line bg-surface px-3 py-2">
          <ConfirmAddress email={user.email} />
        </div>
      )}
      <main className="min-h-0 flex-1 overflow-auto">
        <Outlet />
      </main>
    </div>
  );
}
