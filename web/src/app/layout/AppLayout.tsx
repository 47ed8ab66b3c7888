import { NavLink, Outlet } from 'react-router-dom';
import { Button } from 'primereact/button';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { roleLabel } from '@/lib/format';
import { useLogout } from '@/features/auth/api/logout';
import { navEntriesFor } from '../navigation';
import { NavMenu } from './NavMenu';
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
            {navEntriesFor(roles).map((entry) =>
              entry.kind === 'group' ? (
                <NavMenu key={entry.label} label={entry.label} items={entry.items} />
              ) : (
                <li key={entry.item.to}>
                  <NavLink to={entry.item.to} end={entry.item.end ?? false}>
                    {entry.item.label}
                  </NavLink>
                </li>
              ),
            )}
          </ul>
        </nav>
        <div className="sm-bar-account">
          {user.memberships.length > 1 && <OrganisationSwitcher user={user} />}
          <span className="sm-bar-person">
            <span className="sm-visually-hidden">Signed in as </span>
            <span className="sm-bar-name">{user.displayName}</span>
            {/* The organisation under the name (one organisation: no switcher), so the bar keeps to one row. */}
            <span className="sm-bar-meta">
              <span className="sm-bar-roles">{roles.map(roleLabel).join(', ')}</span>
              {user.memberships.length === 1 && <span className="sm-bar-org">{membership?.organisationName}</span>}
            </span>
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
