import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  RETENTION_DAYS_MAX,
  RETENTION_DAYS_MIN,
  recordingSettingsSchema,
  type RecordingSettingsInput,
  type RecordingSettingsView,
} from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { FieldError } from '@/components/FieldError';
import { PageLoading } from '@/components/PageLoading';
import { formatCount } from '@/lib/format';
import { useRecordingSettings, useUpdateRecordingSettings } from '../api/recording-settings';
import { megabytes } from '../components/time';
import '../recordings.css';

/** The admin's retention period for recordings (issue 6 §6): a shorter period keeps less of minors' data. */
export function RecordingSettingsPage() {
  const q = useRecordingSettings();
  if (q.isPending) return <PageLoading />;
  if (q.isError) return <ErrorMessage error={q.error} what="the recording settings" />;
  return <SettingsForm view={q.data} />;
}

function SettingsForm({ view }: { view: RecordingSettingsView }) {
  const save = useUpdateRecordingSettings();
  const form = useForm<RecordingSettingsInput>({
    resolver: zodResolver(recordingSettingsSchema),
    defaultValues: { retentionDays: view.retentionDays },
  });
  const error = form.formState.errors.retentionDays?.message;
  return (
    <section aria-labelledby="rec-settings-title" className="sm-rec-settings">
      <h1 id="rec-settings-title">Recordings</h1>
      <p className="sm-page-subtitle">
        {formatCount(view.stored, 'recording')} stored · uploads up to {megabytes(view.maxBytes)} each
      </p>
      <form className="sm-sheet sm-rec-settings__form" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <label htmlFor="retention-days" className="sm-rec-upload__label">
          Keep each recording for (days)
        </label>
        <p className="sm-muted" id="retention-help">
          Between {RETENTION_DAYS_MIN} and {RETENTION_DAYS_MAX} days from when it was added. A change applies to the recordings already stored; the hourly
          clean-up then deletes each one past it, file and record.
        </p>
        <div className="sm-rec-upload__row">
          <input
            id="retention-days"
            type="number"
            inputMode="numeric"
            min={RETENTION_DAYS_MIN}
            max={RETENTION_DAYS_MAX}
            aria-describedby={error ? "retention-help retention-error" : "retention-help"}
            aria-invalid={error ? true : undefined}
            {...form.register('retentionDays', { valueAsNumber: true })}
          />
          <button type="submit" className="sm-rec-upload__send" disabled={save.isPending}>
            Save
          </button>
        </div>
        <FieldError id="retention-error" message={error} />
        {save.error && <Alert severity="error">{save.error.message}</Alert>}
        {save.isSuccess && (
          <Alert severity="success">
            Saved: recordings are kept {save.data.retentionDays} days
            {save.data.dueForDeletion > 0 && `; ${formatCount(save.data.dueForDeletion, 'recording')} will be deleted at the next clean-up`}.
          </Alert>
        )}
      </form>
    </section>
  );
}
