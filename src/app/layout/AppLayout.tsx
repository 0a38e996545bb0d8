import { NavLink, Outlet, useLocation } from 'react-router';
import { OrbitabMark } from '../../components/ui/icons.js';
import { useMe } from '../../core/session/me.js';
import { ThemeToggle } from '../theme/ThemeToggle.js';
import { UserMenu } from './UserMenu.js';
import { ConfirmAddress } from '../../features/auth/AccountPage.js';
import { appBarClass, appFrameClass, appMainClass, brandClass, navItemClass, navListClass } from './appBar.js';

const navClass = ({ isActive }: { isActive: boolean }) => navItemClass(isActive);

/** The signed-in frame: a slim top bar, then the page filling the rest of the window. */
export function AppLayout() {
  // The route guard has loaded the user before this renders.
  const user = useMe().data;
  // An open workbook still belongs under "Workbooks".
  const inWorkbooks = /^\/(workbooks\/|$)/.test(useLocation().pathname);
  return (
    <div className={appFrameClass}>
      <header className={appBarClass}>
        <NavLink to="/" className={brandClass}>
          <OrbitabMark />
          Orbitab
        </NavLink>
        <nav aria-label="Main" className={navListClass}>
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
      <main className={appMainClass}>
        <Outlet />
      </main>
    </div>
  );
}
