import { useEffect, useId } from 'react';
import { Controller, useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputNumber } from 'primereact/inputnumber';
import { Checkbox } from 'primereact/checkbox';
import type { z } from 'zod';
import { createSittingSchema, type SittingView } from '@stavemark/shared';
import { FieldError } from '@/components/FieldError';
import { ApiError } from '@/lib/api-client';
import { useExaminers } from '../api/get-examiners';
import { usePublishedLists } from '../api/get-plan-options';
import { useCreateSitting } from '../api/create-sitting';
import { useUpdateSitting } from '../api/update-sitting';
import { PlanProblemAlert, useAcknowledgingRun } from './problems';

type Fields = z.input<typeof createSittingSchema>;
type Output = z.output<typeof createSittingSchema>;
const FIELDS = [
  'title',
  'date',
  'room',
  'dayStart',
  'dayEnd',
  'breaks',
  'writeUpGapMinutes',
  'changeoverMinutes',
  'papers',
  'examinerIds',
] as const;

interface Props {
  visible: boolean;
  onHide: () => void;
  /** Edit this sitting; without it a new one is planned. */
  sitting?: SittingView;
  /** A date to start a new plan on. */
  defaultDate: string;
  onSaved: (sitting: SittingView) => void;
}

function defaults(sitting: SittingView | undefined, date: string): Fields {
  if (!sitting) {
    return {
      title: '',
      date,
      room: '',
      dayStart: '09:00',
      dayEnd: '12:30',
      breaks: [],
      writeUpGapMinutes: 3,
      changeoverMinutes: 2,
      papers: [],
      examinerIds: [],
    };
  }
  return {
    title: sitting.title,
    date: sitting.date,
    room: sitting.room,
    dayStart: sitting.dayStart,
    dayEnd: sitting.dayEnd,
    breaks: sitting.breaks.map((b) => ({ start: b.start, end: b.end, label: b.label ?? '' })),
    writeUpGapMinutes: sitting.writeUpGapMinutes,
    changeoverMinutes: sitting.changeoverMinutes,
    papers: sitting.papers.map((p) => ({
      listVersionId: p.listVersionId,
      slotMinutes: p.slotMinutes,
    })),
    examinerIds: sitting.examiners.map((e) => e.id),
  };
}

/** Plan a sitting, or change one: the day, its breaks, the lists (with a fixed length per grade) and the panel. */
export function PlanSittingDialog({ visible, onHide, sitting, defaultDate, onSaved }: Props) {
  const id = useId();
  const editing = sitting !== undefined;
  const pinned = editing && sitting.status !== 'draft';
  const lists = usePublishedLists(visible);
  const examiners = useExaminers(visible);
  const create = useCreateSitting();
  const update = useUpdateSitting();
  const { problem, setProblem, run } = useAcknowledgingRun();
  const {
    register,
    control,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<Fields, unknown, Output>({
    resolver: zodResolver(createSittingSchema),
    defaultValues: defaults(sitting, defaultDate),
  });
  const breaks = useFieldArray({ control, name: 'breaks' });

  useEffect(() => {
    if (visible) reset(defaults(sitting, defaultDate));
  }, [visible, sitting, defaultDate, reset]);

  const close = () => {
    setProblem(null);
    onHide();
  };

  // Field errors from the API go beside their fields; the rest shows above the form.
  const placeFieldErrors = (e: unknown): never => {
    if (e instanceof ApiError && e.status === 400) {
      for (const d of e.fieldErrors) {
        const field = FIELDS.find((f) => d.path === f || d.path.startsWith(`${f}.`));
        if (field) setError(field, { type: 'server', message: d.message });
      }
    }
    throw e;
  };

  const onSubmit = handleSubmit((values) =>
    run(
      (ack) => {
        const body = {
          ...values,
          breaks: values.breaks.map((b) => ({
            start: b.start,
            end: b.end,
            ...(b.label ? { label: b.label } : {}),
          })),
          ...(ack ? { acknowledgeOwnPupil: true } : {}),
        };
        if (!editing) return create.mutateAsync(body).catch(placeFieldErrors);
        const { papers, writeUpGapMinutes, acknowledgeOwnPupil: _a, ...rest } = body;
        return update
          .mutateAsync({
            id: sitting.id,
            changes: {
              ...rest,
              ...(pinned ? {} : { papers, writeUpGapMinutes }),
              ...(ack ? { acknowledgeOwnPupil: true } : {}),
            },
          })
          .catch(placeFieldErrors);
      },
      (saved) => {
        close();
        onSaved(saved);
      },
    ),
  );

  const saving = create.isPending || update.isPending;
  const footer = (
    <div className="sm-form-actions">
      <Button type="button" label="Cancel" severity="secondary" onClick={close} />
      <Button
        type="submit"
        form={`${id}-form`}
        label={saving ? 'Saving…' : editing ? 'Save changes' : 'Plan the sitting'}
        disabled={saving}
      />
    </div>
  );
  const published = (lists.data ?? []).filter((l) => l.published);

  return (
    <Dialog
      header={editing ? 'Change the plan' : 'Plan a sitting'}
      visible={visible}
      onHide={close}
      footer={footer}
      style={{ width: '44rem' }}
      breakpoints={{ '720px': '96vw' }}
    >
      <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="sm-form">
        <PlanProblemAlert problem={problem} />
        <div className="sm-field">
          <label htmlFor={`${id}-title`}>Title</label>
          <InputText
            id={`${id}-title`}
            placeholder="e.g. Grade 3 mock"
            invalid={!!errors.title}
            aria-invalid={!!errors.title}
            {...register('title')}
          />
          <FieldError id={`${id}-title-error`} message={errors.title?.message} />
        </div>
        <div className="sm-plan-row">
          <div className="sm-field">
            <label htmlFor={`${id}-date`}>Date</label>
            <InputText
              id={`${id}-date`}
              type="date"
              invalid={!!errors.date}
              aria-invalid={!!errors.date}
              {...register('date')}
            />
            <FieldError id={`${id}-date-error`} message={errors.date?.message} />
          </div>
          <div className="sm-field sm-field-grow">
            <label htmlFor={`${id}-room`}>Room</label>
            <InputText
              id={`${id}-room`}
              invalid={!!errors.room}
              aria-invalid={!!errors.room}
              {...register('room')}
            />
            <FieldError id={`${id}-room-error`} message={errors.room?.message} />
          </div>
        </div>
        <div className="sm-plan-row">
          <div className="sm-field">
            <label htmlFor={`${id}-start`}>First slot from</label>
            <InputText
              id={`${id}-start`}
              type="time"
              invalid={!!errors.dayStart}
              aria-invalid={!!errors.dayStart}
              {...register('dayStart')}
            />
            <FieldError id={`${id}-start-error`} message={errors.dayStart?.message} />
          </div>
          <div className="sm-field">
            <label htmlFor={`${id}-end`}>Last slot ends by</label>
            <InputText
              id={`${id}-end`}
              type="time"
              invalid={!!errors.dayEnd}
              aria-invalid={!!errors.dayEnd}
              {...register('dayEnd')}
            />
            <FieldError id={`${id}-end-error`} message={errors.dayEnd?.message} />
          </div>
          <Controller
            control={control}
            name="writeUpGapMinutes"
            render={({ field, fieldState }) => (
              <div className="sm-field">
                <label htmlFor={`${id}-gap`}>Write-up gap (min)</label>
                <InputNumber
                  inputId={`${id}-gap`}
                  value={field.value ?? null}
                  onValueChange={(e) => field.onChange(e.value ?? 0)}
                  min={0}
                  max={30}
                  disabled={pinned}
                  invalid={!!fieldState.error}
                />
                <FieldError id={`${id}-gap-error`} message={fieldState.error?.message} />
              </div>
            )}
          />
          <Controller
            control={control}
            name="changeoverMinutes"
            render={({ field, fieldState }) => (
              <div className="sm-field">
                <label htmlFor={`${id}-change`}>Changeover (min)</label>
                <InputNumber
                  inputId={`${id}-change`}
                  value={field.value ?? null}
                  onValueChange={(e) => field.onChange(e.value ?? 0)}
                  min={0}
                  max={30}
                  invalid={!!fieldState.error}
                />
                <FieldError id={`${id}-change-error`} message={fieldState.error?.message} />
              </div>
            )}
          />
        </div>

        <fieldset className="sm-fieldset">
          <legend>Breaks</legend>
          {breaks.fields.length === 0 && (
            <p className="sm-muted">No breaks. Slots run back to back.</p>
          )}
          {breaks.fields.map((b, i) => (
            <div className="sm-plan-row" key={b.id}>
              <div className="sm-field">
                <label htmlFor={`${id}-b${i}-start`}>Break {i + 1} from</label>
                <InputText
                  id={`${id}-b${i}-start`}
                  type="time"
                  {...register(`breaks.${i}.start`)}
                  invalid={!!errors.breaks?.[i]?.start}
                />
                <FieldError
                  id={`${id}-b${i}-start-error`}
                  message={errors.breaks?.[i]?.start?.message}
                />
              </div>
              <div className="sm-field">
                <label htmlFor={`${id}-b${i}-end`}>to</label>
                <InputText
                  id={`${id}-b${i}-end`}
                  type="time"
                  {...register(`breaks.${i}.end`)}
                  invalid={!!errors.breaks?.[i]?.end}
                />
                <FieldError
                  id={`${id}-b${i}-end-error`}
                  message={errors.breaks?.[i]?.end?.message}
                />
              </div>
              <div className="sm-field sm-field-grow">
                <label htmlFor={`${id}-b${i}-label`}>Label</label>
                <InputText
                  id={`${id}-b${i}-label`}
                  placeholder="e.g. Coffee"
                  {...register(`breaks.${i}.label`)}
                />
              </div>
              <Button
                type="button"
                icon="pi pi-times"
                severity="secondary"
                text
                aria-label={`Remove break ${i + 1}`}
                onClick={() => breaks.remove(i)}
              />
            </div>
          ))}
          <Button
            type="button"
            label="Add a break"
            icon="pi pi-plus"
            size="small"
            severity="secondary"
            onClick={() => breaks.append({ start: '10:30', end: '10:45', label: '' })}
          />
        </fieldset>

        <Controller
          control={control}
          name="papers"
          render={({ field, fieldState }) => {
            const chosen = field.value ?? [];
            const toggle = (listVersionId: string, on: boolean) =>
              field.onChange(
                on
                  ? [...chosen, { listVersionId, slotMinutes: null }]
                  : chosen.filter((p) => p.listVersionId !== listVersionId),
              );
            const setMinutes = (listVersionId: string, slotMinutes: number | null) =>
              field.onChange(
                chosen.map((p) => (p.listVersionId === listVersionId ? { ...p, slotMinutes } : p)),
              );
            return (
              <fieldset className="sm-fieldset" aria-describedby={`${id}-papers-hint`}>
                <legend>Requirement lists</legend>
                <small id={`${id}-papers-hint`} className="sm-field-hint">
                  One per grade. Each candidate takes the list of their grade. Slot lengths are
                  suggested from the list (a full selection at its slowest, plus the write-up gap);
                  fix a length here to override it for that grade.
                </small>
                {lists.isPending && <p className="sm-muted">Loading lists…</p>}
                {published.map((l) => {
                  const v = l.published!;
                  const picked = chosen.find((p) => p.listVersionId === v.id);
                  return (
                    <div className="sm-plan-row sm-plan-paper" key={v.id}>
                      <div className="sm-check">
                        <Checkbox
                          inputId={`${id}-l-${v.id}`}
                          checked={!!picked}
                          disabled={pinned}
                          onChange={(e) => toggle(v.id, !!e.checked)}
                        />
                        <label htmlFor={`${id}-l-${v.id}`}>
                          {l.name}{' '}
                          <span className="sm-muted">
                            (grade {l.grade}, version {v.version})
                          </span>
                        </label>
                      </div>
                      {picked && (
                        <div className="sm-field">
                          <label htmlFor={`${id}-m-${v.id}`}>Fixed length (min, optional)</label>
                          <InputNumber
                            inputId={`${id}-m-${v.id}`}
                            value={picked.slotMinutes ?? null}
                            onValueChange={(e) => setMinutes(v.id, e.value ?? null)}
                            min={2}
                            max={180}
                            disabled={pinned}
                            placeholder="suggested"
                          />
                        </div>
                      )}
                    </div>
                  );
                })}
                {pinned && (
                  <p className="sm-muted">This sitting is scheduled: its lists are pinned.</p>
                )}
                <FieldError
                  id={`${id}-papers-error`}
                  message={
                    fieldState.error?.message ??
                    (fieldState.error as { root?: { message?: string } } | undefined)?.root?.message
                  }
                />
              </fieldset>
            );
          }}
        />

        <Controller
          control={control}
          name="examinerIds"
          render={({ field, fieldState }) => {
            const chosen = field.value ?? [];
            return (
              <fieldset className="sm-fieldset">
                <legend>Examiners</legend>
                <small className="sm-field-hint">
                  The first you tick leads and marks every candidate; others can second-mark (double
                  marking).
                </small>
                <div className="sm-checks">
                  {(examiners.data ?? []).map((e) => (
                    <div className="sm-check" key={e.id}>
                      <Checkbox
                        inputId={`${id}-e-${e.id}`}
                        checked={chosen.includes(e.id)}
                        onChange={(ev) =>
                          field.onChange(
                            ev.checked ? [...chosen, e.id] : chosen.filter((x) => x !== e.id),
                          )
                        }
                      />
                      <label htmlFor={`${id}-e-${e.id}`}>
                        {e.displayName}
                        {chosen[0] === e.id && <span className="sm-muted"> (leads)</span>}
                      </label>
                    </div>
                  ))}
                </div>
                <FieldError id={`${id}-examiners-error`} message={fieldState.error?.message} />
              </fieldset>
            );
          }}
        />
      </form>
    </Dialog>
  );
}
