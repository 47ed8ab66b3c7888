import { Link, useParams, useSearchParams } from 'react-router-dom';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { Alert } from '@/components/Alert';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { formatPlainDate } from '@/lib/format';
import { useAgreementReport, type ReportScope } from '../api/get-agreement-report';
import { useAgreementScopes } from '../api/get-agreement-scopes';
import { AgreementReportView } from '../components/AgreementReportView';
import '../agreement.css';

/** Pick a sitting or a term; its report below. */
export function AgreementPage() {
  const [params, setParams] = useSearchParams();
  const scopes = useAgreementScopes();
  const term = params.get('term');
  const sitting = params.get('sitting');
  const scope: ReportScope | null = term ? { kind: 'term', id: term } : sitting ? { kind: 'sitting', id: sitting } : null;
  const value = term ? `term:${term}` : sitting ? `sitting:${sitting}` : '';
  return (
    <section aria-labelledby="agreement-title">
      <div className="sm-page-header">
        <div>
          <h1 id="agreement-title">Agreement between examiners</h1>
          <p className="sm-page-subtitle">
            How closely examiners agree when they mark the same candidates, from double-marked sheets that are submitted.
          </p>
        </div>
      </div>
      {scopes.isError && <ErrorMessage error={scopes.error} what="the sittings and terms" />}
      {scopes.data && (
        <div className="sm-scope-picker">
          <div className="sm-field">
            <label htmlFor="agreement-scope">Report on</label>
            <select
              id="agreement-scope"
              className="p-inputtext"
              value={value}
              onChange={(e) => {
                const [kind, id] = e.target.value.split(':');
                setParams(kind && id ? { [kind]: id } : {});
              }}
            >
              <option value="">Choose a term or a sitting…</option>
              {scopes.data.terms.length > 0 && (
                <optgroup label="Terms">
                  {scopes.data.terms.map((t) => (
                    <option key={t.id} value={`term:${t.id}`}>
                      {t.name} ({t.academicYear})
                    </option>
                  ))}
                </optgroup>
              )}
              <optgroup label="Sittings">
                {scopes.data.sittings.map((s) => (
                  <option key={s.id} value={`sitting:${s.id}`}>
                    {formatPlainDate(s.date, 'short')} — {s.title} ({s.doubleMarkedSlots} double-marked)
                  </option>
                ))}
              </optgroup>
            </select>
          </div>
        </div>
      )}
      {scope ? <Report scope={scope} /> : scopes.data && <p className="sm-muted">Choose a term or a sitting to see its report.</p>}
    </section>
  );
}

function Report({ scope }: { scope: ReportScope }) {
  const report = useAgreementReport(scope);
  if (report.isPending) return <PageLoading label="Computing the agreement report…" />;
  if (report.isError) {
    if (report.error instanceof ApiError && report.error.status === 404)
      return (
        <Alert severity="info">
          There is no report here for you: a sitting’s report is for admins, the teacher who planned it and its lead examiner.
        </Alert>
      );
    return <ErrorMessage error={report.error} what="the agreement report" />;
  }
  return (
    <>
      {report.data.scope.kind === 'sitting' && (
        <p className="sm-breadcrumb">
          <Link to={paths.sitting.href(report.data.scope.id)}>{report.data.scope.title}</Link>
        </p>
      )}
      <AgreementReportView report={report.data} />
    </>
  );
}

/** The report of one sitting, reached from the sitting's page. */
export function SittingAgreementPage() {
  const { sittingId = '' } = useParams();
  return (
    <section aria-labelledby="agreement-title">
      <p className="sm-breadcrumb">
        <Link to={paths.agreement.href()}>Agreement</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="agreement-title">Agreement report</h1>
        </div>
      </div>
      <Report scope={{ kind: 'sitting', id: sittingId }} />
    </section>
  );
}
