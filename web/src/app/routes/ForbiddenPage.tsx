import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';

export function ForbiddenPage() {
  return (
    <section className="sm-page sm-empty-page" aria-labelledby="forbidden-title">
      <h1 id="forbidden-title">Not open to your role</h1>
      <p>
        This page belongs to another role in this organisation. If you need it, ask your
        administrator.
      </p>
      <p>
        <Link to={paths.today.href()}>Back to Today</Link>
      </p>
    </section>
  );
}
