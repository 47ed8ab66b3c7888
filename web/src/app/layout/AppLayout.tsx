import { NavLink, Outlet } from 'react-router-dom';
import { Button } from 'primereact/button';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { roleLabel } from '@/lib/format';
import { useLogout } from '@/features/auth/api/logout';
import { navItemsFor } from '../navigation';
import { OrganisationSwitcher } from './OrganisationSwitcher';

export function AppLayout() {
  const user = useCurrentUser();
  const roles = activeRoles(user);
  const membership = activeMembership(user);
  const logout = useLogout();

  return (
    <div className="sm-shell">
      <a className="sm-skip-link" href="#main">
        Skip to content
      </a>
      <header className="sm-bar">
        <span className="sm-bar-wordmark">Stavemark</span>
        <nav aria-label="Main" className="sm-bar-nav">
          <ul>
            {navItemsFor(roles).map((item) => (
              <li key={item.to}>
                <NavLink to={item.to} end={item.end ?? false}>
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="sm-bar-account">
          {user.memberships.length > 1 ? (
            <OrganisationSwitcher user={user} />
          ) : (
            <span className="sm-bar-org">{membership?.organisationName}</span>
          )}
          <span className="sm-bar-person">
            <span className="sm-visually-hidden">Signed in as </span>
            <span className="sm-bar-name">{user.displayName}</span>
            <span className="sm-bar-roles">{roles.map(roleLabel).join(', ')}</span>
          </span>
          <Button
            type="button"
            label="Sign out"
            size="small"
            className="sm-bar-signout"
            onClick={() => logout.mutate()}
            disabled={logout.isPending}
          />
        </div>
      </header>
      <main id="main" className="sm-main" tabIndex={-1}>
        {/* Keyed by organisation: a switch remounts the page, so it fetches the new organisation's data. */}
        <Outlet key={user.activeOrganisationId} />
      </main>
    </div>
  );
}
