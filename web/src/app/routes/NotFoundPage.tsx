import { Link, useLocation } from 'react-router-dom';
import { paths } from '@/config/paths';

export function NotFoundPage() {
  const location = useLocation();
  return (
    <section className="sm-page sm-empty-page" aria-labelledby="not-found-title">
      <h1 id="not-found-title">Page not found</h1>
      <p>
        There is no page at <code>{location.pathname}</code>. The link may be old or mistyped.
      </p>
      <p>
        <Link to={paths.today.href()}>Back to Today</Link>
      </p>
    </section>
  );
}
