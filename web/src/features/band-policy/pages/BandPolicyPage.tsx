import { useState } from 'react';
import { useFieldArray, useForm, type UseFormRegisterReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Button } from 'primereact/button';
import {
  bandPolicyBodySchema,
  type BandPolicyBody,
  type BandPolicyVersionView,
  type BandPolicyView,
} from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { FieldError } from '@/components/FieldError';
import { PageLoading } from '@/components/PageLoading';
import { activeMembership, activeRoles, useCurrentUser } from '@/lib/auth';
import { applyApiErrors } from '@/lib/form-errors';
import { formatDateInZone } from '@/lib/format';
import { useBandPolicy, useCreateBandPolicyVersion } from '../api/band-policy';
import './band-policy.css';

/**
 * The organisation's band policy (design.md §4.1): teachers read it, an admin changes it as a new
 * version. Sittings pin the version they were scheduled with, so a change never moves a result
 * already given.
 */
export function BandPolicyPage() {
  const q = useBandPolicy();
  const user = useCurrentUser();
  const timeZone = activeMembership(user)?.timeZone ?? 'Europe/London';
  const isAdmin = activeRoles(user).includes('admin');
  if (q.isPending) return <PageLoading />;
  if (q.isError) return <ErrorMessage error={q.error} what="the band policy" />;
  return (
    <section aria-labelledby="band-policy-title" className="sm-band-policy">
      <div>
        <h1 id="band-policy-title">Band policy</h1>
        <p className="sm-page-subtitle">
          Version {q.data.current.version} · bands from the rounded total as a share of the paper’s
          marks
        </p>
      </div>
      <CurrentPolicy policy={q.data.current} />
      {isAdmin && <NewVersionForm view={q.data} />}
      <History versions={q.data.versions} timeZone={timeZone} />
    </section>
  );
}

/** Each band with the range of percentages it covers, highest first. */
function ranges(
  policy: Pick<BandPolicyBody, 'bands' | 'below'>,
): { label: string; range: string }[] {
  const bands = [...policy.bands].sort((a, b) => b.minPercent - a.minPercent);
  const rows = bands.map((b, i) => ({
    label: b.label,
    range:
      i === 0
        ? `${b.minPercent} % and above`
        : `${b.minPercent} % to below ${bands[i - 1]!.minPercent} %`,
  }));
  const lowest = bands.at(-1);
  rows.push({
    label: policy.below.label,
    range: lowest ? `below ${lowest.minPercent} %` : 'every total',
  });
  return rows;
}

function CurrentPolicy({ policy }: { policy: BandPolicyVersionView }) {
  return (
    <div className="sm-sheet">
      <h2>Current bands</h2>
      <table className="sm-table" aria-label="Current bands">
        <thead>
          <tr>
            <th scope="col">Band</th>
            <th scope="col">Total as a share of the marks</th>
          </tr>
        </thead>
        <tbody>
          {ranges(policy).map((r) => (
            <tr key={r.label}>
              <th scope="row">{r.label}</th>
              <td>{r.range}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

const slug = (label: string) =>
  label
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .replace(/^(\d)/, 'b_$1')
    .slice(0, 40) || 'band';

function NewVersionForm({ view }: { view: BandPolicyView }) {
  const save = useCreateBandPolicyVersion();
  const [problem, setProblem] = useState<string | null>(null);
  const initial: BandPolicyBody = {
    bands: view.current.bands.map((b) => ({
      key: b.key,
      label: b.label,
      minPercent: b.minPercent,
    })),
    below: { key: view.current.below.key, label: view.current.below.label },
  };
  const form = useForm<BandPolicyBody>({
    resolver: zodResolver(bandPolicyBodySchema),
    defaultValues: initial,
  });
  const bands = useFieldArray({ control: form.control, name: 'bands' });
  const errors = form.formState.errors;
  const onSubmit = form.handleSubmit((body) => {
    setProblem(null);
    save.mutate(body, {
      onSuccess: (v) =>
        form.reset({
          bands: v.current.bands.map((b) => ({
            key: b.key,
            label: b.label,
            minPercent: b.minPercent,
          })),
          below: v.current.below,
        }),
      onError: (e) => setProblem(applyApiErrors(e, form.setError, ['bands', 'below'])),
    });
  });
  const listError = errors.bands?.message ?? errors.bands?.root?.message;

  return (
    <form
      className="sm-sheet sm-band-policy__form"
      noValidate
      onSubmit={onSubmit}
      aria-labelledby="new-version-title"
    >
      <h2 id="new-version-title">Change the bands</h2>
      <p className="sm-muted">
        Saving makes version {view.current.version + 1}. Sittings already scheduled keep the version
        they pinned; sittings scheduled from now on use the new one. List the bands from the highest
        threshold down. The key names a band in exports and comparisons: keep it when you only
        rename a band.
      </p>
      <table className="sm-band-policy__rows">
        <thead>
          <tr>
            <th scope="col">Band</th>
            <th scope="col">Lowest share (%)</th>
            <th scope="col">Key</th>
            <th scope="col">
              <span className="sm-visually-hidden">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {bands.fields.map((field, i) => {
            const e = errors.bands?.[i];
            return (
              <tr key={field.id}>
                <td>
                  <RowField
                    label={`Band ${i + 1}: name`}
                    errorId={`band-${i}-label-error`}
                    error={e?.label?.message}
                    registration={form.register(`bands.${i}.label`)}
                  />
                </td>
                <td>
                  <RowField
                    label={`Band ${i + 1}: lowest share (%)`}
                    errorId={`band-${i}-min-error`}
                    error={e?.minPercent?.message}
                    number
                    registration={form.register(`bands.${i}.minPercent`, { valueAsNumber: true })}
                  />
                </td>
                <td>
                  <RowField
                    label={`Band ${i + 1}: key`}
                    errorId={`band-${i}-key-error`}
                    error={e?.key?.message}
                    registration={form.register(`bands.${i}.key`)}
                  />
                </td>
                <td>
                  <Button
                    type="button"
                    icon="pi pi-times"
                    text
                    severity="secondary"
                    aria-label={`Remove band ${i + 1}`}
                    disabled={bands.fields.length <= 1}
                    onClick={() => bands.remove(i)}
                  />
                </td>
              </tr>
            );
          })}
          <tr>
            <td>
              <RowField
                label="Below every threshold: name"
                errorId="below-label-error"
                error={errors.below?.label?.message}
                registration={form.register('below.label')}
              />
            </td>
            <td className="sm-muted">below the last</td>
            <td>
              <RowField
                label="Below every threshold: key"
                errorId="below-key-error"
                error={errors.below?.key?.message}
                registration={form.register('below.key')}
              />
            </td>
            <td />
          </tr>
        </tbody>
      </table>
      <FieldError id="bands-error" message={listError} />
      <div className="sm-row-actions">
        <Button
          type="button"
          label="Add a band"
          icon="pi pi-plus"
          severity="secondary"
          disabled={bands.fields.length >= 10}
          onClick={() => {
            const label = 'New band';
            const last = form.getValues('bands').at(-1);
            bands.append({
              label,
              key: slug(`${label} ${bands.fields.length + 1}`),
              minPercent: Math.max(1, Math.round((last?.minPercent ?? 60) / 2)),
            });
          }}
        />
        <Button
          type="submit"
          label={`Save as version ${view.current.version + 1}`}
          loading={save.isPending}
        />
      </div>
      {problem && <Alert severity="error">{problem}</Alert>}
      {save.isSuccess && !form.formState.isDirty && (
        <Alert severity="success">
          Saved as version {save.data.current.version}. Sittings scheduled from now on use it.
        </Alert>
      )}
    </form>
  );
}

/** One input of the bands table, with its message under it (linked by aria-describedby). */
function RowField({
  label,
  errorId,
  error,
  number,
  registration,
}: {
  label: string;
  errorId: string;
  error: string | undefined;
  number?: boolean;
  registration: UseFormRegisterReturn;
}) {
  return (
    <>
      <input
        {...(number ? { type: 'number', inputMode: 'decimal' as const, step: 'any' } : {})}
        aria-label={label}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        {...registration}
      />
      <FieldError id={errorId} message={error} />
    </>
  );
}

function History({ versions, timeZone }: { versions: BandPolicyVersionView[]; timeZone: string }) {
  return (
    <div className="sm-sheet">
      <h2>Versions</h2>
      <table className="sm-table" aria-label="Versions of the band policy">
        <thead>
          <tr>
            <th scope="col">Version</th>
            <th scope="col">Bands (lowest share)</th>
            <th scope="col">Made</th>
          </tr>
        </thead>
        <tbody>
          {[...versions]
            .sort((a, b) => b.version - a.version)
            .map((v) => (
              <tr key={v.id}>
                <th scope="row">{v.version}</th>
                <td>
                  {[...v.bands.map((b) => `${b.label} ${b.minPercent} %`), v.below.label].join(
                    ' · ',
                  )}
                </td>
                <td>
                  {formatDateInZone(v.createdAt, timeZone)}
                  {v.createdBy ? ` by ${v.createdBy.displayName}` : ''}
                </td>
              </tr>
            ))}
        </tbody>
      </table>
    </div>
  );
}
