import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { Role } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { hasAnyRole, useSession } from '@/lib/auth';
import { PageLoading } from '@/components/PageLoading';
import { ForbiddenPage } from './ForbiddenPage';

/** Pages behind sign-in; optionally only for some roles of the active organisation. */
export function RequireAuth({ children, roles }: { children: ReactNode; roles?: readonly Role[] }) {
  const session = useSession();
  const location = useLocation();
  if (session.status === 'restoring') return <PageLoading label="Opening Stavemark…" />;
  if (session.status === 'signed-out') {
    return (
      <Navigate
        to={paths.signIn.href()}
        replace
        state={{ from: { pathname: location.pathname, search: location.search } }}
      />
    );
  }
  if (roles && !hasAnyRole(session.user, roles)) return <ForbiddenPage />;
  return <>{children}</>;
}
