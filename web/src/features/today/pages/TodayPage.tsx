import { useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useToday } from '../api/get-today';
import { AdminToday } from '../components/AdminToday';
import { TeacherToday } from '../components/TeacherToday';
import { ExaminerToday } from '../components/ExaminerToday';
import { StudentToday } from '../components/StudentToday';
import { AttentionPanel } from '@/features/progress/components/AttentionPanel';

export function TodayPage() {
  const user = useCurrentUser();
  const today = useToday();
  const firstName = user.displayName.split(' ')[0] ?? user.displayName;

  return (
    <section aria-labelledby="today-title">
      <div className="sm-page-header">
        <div>
          <h1 id="today-title">Today</h1>
          {today.data && (
            <p className="sm-page-subtitle">
              <time dateTime={today.data.date}>{formatPlainDate(today.data.date)}</time> ·{' '}
              {today.data.organisationName} ({today.data.timeZone.replace(/_/g, ' ')} time)
            </p>
          )}
        </div>
        <p className="sm-muted">Hello, {firstName}.</p>
      </div>
      {today.isPending && <PageLoading label="Loading today…" />}
      {today.isError && <ErrorMessage error={today.error} what="today's page" />}
      {today.data && (
        <>
          {today.data.admin && <AdminToday data={today.data.admin} />}
          {today.data.teacher && <TeacherToday data={today.data.teacher} />}
          {today.data.teacher && <AttentionPanel />}
          {today.data.examiner && <ExaminerToday data={today.data.examiner} timeZone={today.data.timeZone} />}
          {today.data.student && <StudentToday data={today.data.student} />}
        </>
      )}
    </section>
  );
}
