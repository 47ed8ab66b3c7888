import { useId, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { ProgressBar } from 'primereact/progressbar';
import { Tag } from 'primereact/tag';
import {
  CLASS_IMPORT_MAX_BYTES,
  CLASS_IMPORT_MAX_ROWS,
  CLASS_LIST_COLUMNS,
  type ImportReport,
} from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notify';
import { classesKey, studentsKey } from '../api/keys';
import { downloadFile, importClassList, type TransferProgress } from '../api/transfer';
import { countsText, ImportReportTable } from './ImportReportTable';

interface Props {
  visible: boolean;
  onHide: () => void;
}

type Step =
  | { kind: 'choose' }
  | { kind: 'working'; what: 'check' | 'apply'; progress: TransferProgress }
  | { kind: 'checked'; report: ImportReport }
  | { kind: 'failed'; message: string; report?: ImportReport };

function progressText(what: 'check' | 'apply', p: TransferProgress): string {
  const percent = p.fraction === null ? '' : ` ${Math.round(p.fraction * 100)}%`;
  if (p.phase === 'uploading') return `Uploading the file…${percent}`;
  const doing = what === 'check' ? 'Checking' : 'Importing';
  return p.step ? `${doing}: ${p.step}…${percent}` : `${doing}: waiting for the server…`;
}

/** Choose a file → dry run (every row with its outcome) → import when there are no errors. */
export function ImportDialog({ visible, onHide }: Props) {
  const id = useId();
  const queryClient = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [step, setStep] = useState<Step>({ kind: 'choose' });

  const reset = () => {
    setFile(null);
    setStep({ kind: 'choose' });
    if (input.current) input.current.value = '';
  };
  const close = () => {
    reset();
    onHide();
  };

  const run = async (what: 'check' | 'apply') => {
    if (!file) return;
    setStep({ kind: 'working', what, progress: { phase: 'uploading', fraction: 0 } });
    try {
      const report = await importClassList(file, what === 'check', (progress) =>
        setStep({ kind: 'working', what, progress }),
      );
      if (what === 'check') {
        setStep({ kind: 'checked', report });
        return;
      }
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: classesKey }),
        queryClient.invalidateQueries({ queryKey: studentsKey }),
      ]);
      const mails = report.invitations + report.guardianNotices;
      notify({
        severity: 'success',
        summary: `Imported ${file.name}: ${countsText(report.counts).replace(/, 0 with errors$/, '')}.`,
        detail: mails
          ? `${mails} e-mail${mails === 1 ? '' : 's'} on the way (invitations and notices to guardians).`
          : undefined,
      });
      close();
    } catch (error) {
      const report =
        error instanceof ApiError
          ? ((error.body.details as { report?: ImportReport } | undefined)?.report ?? undefined)
          : undefined;
      const message =
        error instanceof ApiError
          ? error.message
          : 'The server could not be reached. Nothing was imported; try again.';
      setStep({ kind: 'failed', message, report });
    }
  };

  const report =
    step.kind === 'checked' ? step.report : step.kind === 'failed' ? step.report : undefined;
  const canApply = step.kind === 'checked' && step.report.counts.error === 0;
  const toApply = report ? report.counts.new + report.counts.updated : 0;

  const footer = (
    <div className="sm-form-actions">
      <Button type="button" label="Close" severity="secondary" onClick={close} />
      {step.kind === 'checked' && canApply && (
        <Button
          type="button"
          label={
            toApply === 0
              ? 'Nothing to import'
              : `Import ${toApply} ${toApply === 1 ? 'row' : 'rows'}`
          }
          icon="pi pi-check"
          disabled={toApply === 0}
          onClick={() => void run('apply')}
        />
      )}
    </div>
  );

  return (
    <Dialog
      header="Import a class list"
      visible={visible}
      onHide={close}
      style={{ width: 'min(72rem, 96vw)' }}
      footer={footer}
      modal
    >
      <p>
        A CSV file saved from a spreadsheet or the office system, one student per line, at most{' '}
        {CLASS_IMPORT_MAX_ROWS.toLocaleString('en-GB')} rows and{' '}
        {CLASS_IMPORT_MAX_BYTES / 1024 / 1024} MB. The first line names the columns, in any order:
      </p>
      <ul className="sm-import-columns">
        {CLASS_LIST_COLUMNS.map((c) => (
          <li key={c.key}>
            {c.header}
            {c.required ? '' : ' (optional)'}
            {c.key === 'dateOfBirth' ? ' — written YYYY-MM-DD' : ''}
            {c.key === 'guardianEmail' ? ' — needed for every student under 18' : ''}
          </li>
        ))}
      </ul>
      <p className="sm-muted">
        Nothing is imported until you have seen the check and confirmed it; a file with any error
        imports nothing. New students with an e-mail get an invitation, and guardians of children a
        notice.{' '}
        <button
          type="button"
          className="sm-link-button"
          onClick={() =>
            void downloadFile('/classes/import/template', 'class-list-template.csv').catch(() =>
              notify({ severity: 'error', summary: 'The template could not be downloaded.' }),
            )
          }
        >
          Download the template
        </button>
      </p>

      <div className="sm-import-file">
        <label htmlFor={`${id}-file`} className="sm-visually-hidden">
          Class list file (CSV)
        </label>
        <input
          ref={input}
          id={`${id}-file`}
          type="file"
          accept=".csv,text/csv"
          aria-label="Class list file (CSV)"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setStep({ kind: 'choose' });
          }}
        />
        <Button
          type="button"
          label="Check the file"
          icon="pi pi-search"
          disabled={!file || step.kind === 'working'}
          onClick={() => void run('check')}
        />
      </div>

      {step.kind === 'working' && (
        <div className="sm-import-progress" aria-live="polite">
          <p>{progressText(step.what, step.progress)}</p>
          {step.progress.fraction === null ? (
            <ProgressBar mode="indeterminate" style={{ height: '6px' }} aria-label="Working" />
          ) : (
            <ProgressBar
              value={Math.round(step.progress.fraction * 100)}
              showValue={false}
              style={{ height: '6px' }}
              aria-label={step.progress.phase === 'uploading' ? 'Upload progress' : 'Import progress'}
            />
          )}
        </div>
      )}

      {step.kind === 'failed' && <Alert severity="error">{step.message}</Alert>}

      {report && (
        <section aria-label="Check of the file">
          <div className="sm-import-counts">
            <Tag severity="success" value={`${report.counts.new} new`} />
            <Tag severity="info" value={`${report.counts.updated} updated`} />
            <Tag severity="secondary" value={`${report.counts.unchanged} unchanged`} />
            <Tag
              severity="danger"
              value={`${report.counts.error} with ${report.counts.error === 1 ? 'an error' : 'errors'}`}
            />
            {report.newClassCodes.length > 0 && (
              <Tag
                severity="warning"
                value={`New class${report.newClassCodes.length > 1 ? 'es' : ''}: ${report.newClassCodes.join(', ')}`}
              />
            )}
          </div>
          {step.kind === 'checked' && report.counts.error > 0 && (
            <Alert severity="error">
              {report.counts.error === 1
                ? '1 row has an error'
                : `${report.counts.error} rows have errors`}
              , so this file cannot be imported yet. Correct the file, save it, and choose it again.
              Nothing has been imported.
            </Alert>
          )}
          {step.kind === 'checked' && report.counts.error === 0 && (
            <Alert severity="info">
              The file is ready: {countsText(report.counts).replace(/, 0 with errors$/, '')}.
              {report.invitations + report.guardianNotices > 0 &&
                ` Importing sends ${report.invitations} invitation${report.invitations === 1 ? '' : 's'} and ${report.guardianNotices} notice${report.guardianNotices === 1 ? '' : 's'} to guardians.`}
            </Alert>
          )}
          <ImportReportTable report={report} />
        </section>
      )}
    </Dialog>
  );
}
