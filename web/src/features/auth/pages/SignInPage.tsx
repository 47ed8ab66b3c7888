import { Navigate, useLocation } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useSession } from '@/lib/auth';
import { SignInForm } from '../components/SignInForm';
import { Alert } from '@/components/Alert';

interface FromState {
  from?: { pathname: string; search?: string };
}

export function SignInPage() {
  const session = useSession();
  const location = useLocation();
  const from = (location.state as FromState | null)?.from;
  const target =
    from && from.pathname !== paths.signIn.path
      ? `${from.pathname}${from.search ?? ''}`
      : paths.today.href();

  if (session.status === 'signed-in') return <Navigate to={target} replace />;
  const notice = session.status === 'signed-out' ? session.notice : undefined;

  return (
    <main className="sm-signin">
      <div className="sm-signin-card">
        <p className="sm-wordmark">Stavemark</p>
        <p className="sm-signin-tagline">Mock exams and technique records for piano teaching.</p>
        {notice && <Alert severity="info">{notice}</Alert>}
        <SignInForm />
      </div>
    </main>
  );
}
