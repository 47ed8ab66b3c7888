import { useId, useState } from 'react';
import {
  Controller,
  useFieldArray,
  useForm,
  useWatch,
  type Control,
  type FieldErrors,
  type Path,
  type UseFormRegister,
  type UseFormSetValue,
} from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import {
  REQUEST_KINDS,
  rubricBodySchema,
  type RequestKind,
  type RubricBody,
} from '@stavemark/shared';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import {
  formatWeightShare,
  isTensionCriterion,
  KIND_LABELS,
  keyFromLabel,
  spreadBands,
  undescribedMarks,
} from './labels';
import { HealthCaution } from './HealthCaution';

export type RubricFields = z.input<typeof rubricBodySchema>;
type Criterion = RubricFields['criteria'][number];

export function blankCriterion(maxMark = 5): Criterion {
  return {
    key: '',
    label: '',
    description: '',
    weight: 1,
    maxMark,
    descriptors: spreadBands(maxMark, 3).map((b) => ({ ...b, text: '' })),
  };
}

export function blankRubric(): RubricFields {
  return { name: '', kinds: [], criteria: [blankCriterion()] };
}

interface Props {
  defaultValues: RubricFields;
  submitLabel: string;
  /** Saves; throw the API's error to have it shown beside the fields. */
  onSave: (body: RubricBody) => Promise<void>;
  onCancel: () => void;
}

/** Writes the API's field errors ("criteria.1.weight") onto the form; returns what is left over. */
function placeErrors(
  error: unknown,
  setError: (path: Path<RubricFields>, e: { type: string; message: string }) => void,
): string | null {
  if (!(error instanceof ApiError))
    return 'The server could not be reached. Nothing was saved; try again.';
  const details = error.fieldErrors.filter((d) => d.path !== '(body)');
  for (const d of details)
    setError(d.path as Path<RubricFields>, { type: 'server', message: d.message });
  return details.length > 0 && details.length === error.fieldErrors.length && error.status === 400
    ? null
    : error.message;
}

export function RubricForm({ defaultValues, submitLabel, onSave, onCancel }: Props) {
  const id = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    formState: { errors, isSubmitting },
  } = useForm<RubricFields, unknown, RubricBody>({
    resolver: zodResolver(rubricBodySchema),
    defaultValues,
    mode: 'onBlur',
  });
  const criteria = useFieldArray({ control, name: 'criteria' });
  // One watch of the whole form, handed down: nested watches can miss changes to their fields.
  const watched = (useWatch({ control }) as RubricFields).criteria;
  const totalWeight = (watched ?? []).reduce(
    (s, c) => s + (Number(c?.weight) > 0 ? Number(c?.weight) : 0),
    0,
  );

  const submit = handleSubmit(async (body) => {
    setFormError(null);
    try {
      await onSave(body);
    } catch (err) {
      setFormError(placeErrors(err, setError));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="sm-form sm-rubric-form" aria-label="Rubric">
      {formError && <Alert severity="error">{formError}</Alert>}
      <div className="sm-sheet sm-form">
        <div className="sm-field">
          <label htmlFor={`${id}-name`}>Name</label>
          <InputText
            id={`${id}-name`}
            invalid={!!errors.name}
            aria-invalid={!!errors.name}
            aria-describedby={`${id}-name-error`}
            {...register('name')}
          />
          <FieldError id={`${id}-name-error`} message={errors.name?.message} />
        </div>
        <Controller
          control={control}
          name="kinds"
          render={({ field, fieldState }) => (
            <fieldset className="sm-fieldset" aria-describedby={`${id}-kinds-error`}>
              <legend>Used for</legend>
              <div className="sm-checks">
                {REQUEST_KINDS.map((k) => {
                  const checked = field.value.includes(k);
                  return (
                    <span key={k} className="sm-check">
                      <Checkbox
                        inputId={`${id}-kind-${k}`}
                        checked={checked}
                        onChange={() =>
                          field.onChange(
                            checked
                              ? field.value.filter((v: RequestKind) => v !== k)
                              : [...field.value, k],
                          )
                        }
                      />
                      <label htmlFor={`${id}-kind-${k}`}>{KIND_LABELS[k]}</label>
                    </span>
                  );
                })}
              </div>
              <FieldError
                id={`${id}-kinds-error`}
                message={
                  fieldState.error?.message ??
                  (fieldState.error as { root?: { message?: string } } | undefined)?.root?.message
                }
              />
            </fieldset>
          )}
        />
      </div>

      <h2 className="sm-section-title">Criteria</h2>
      {errors.criteria?.message && <Alert severity="error">{errors.criteria.message}</Alert>}
      <ol className="sm-criteria">
        {criteria.fields.map((f, index) => (
          <CriterionEditor
            key={f.id}
            index={index}
            count={criteria.fields.length}
            control={control}
            register={register}
            setValue={setValue}
            errors={errors}
            totalWeight={totalWeight}
            c={watched?.[index]}
            onRemove={() => criteria.remove(index)}
            onMove={(to) => criteria.move(index, to)}
          />
        ))}
      </ol>
      <div>
        <Button
          type="button"
          icon="pi pi-plus"
          label="Add a criterion"
          severity="secondary"
          onClick={() => criteria.append(blankCriterion())}
          disabled={criteria.fields.length >= 20}
        />
      </div>
      <div className="sm-form-actions">
        <Button type="button" label="Cancel" severity="secondary" onClick={onCancel} />
        <Button
          type="submit"
          label={isSubmitting ? 'Saving…' : submitLabel}
          disabled={isSubmitting}
        />
      </div>
    </form>
  );
}

interface CriterionProps {
  index: number;
  count: number;
  control: Control<RubricFields>;
  register: UseFormRegister<RubricFields>;
  setValue: UseFormSetValue<RubricFields>;
  errors: FieldErrors<RubricFields>;
  totalWeight: number;
  /** The criterion's current values. */
  c: Criterion | undefined;
  onRemove: () => void;
  onMove: (to: number) => void;
}

function CriterionEditor({
  index,
  count,
  control,
  register,
  setValue,
  errors,
  totalWeight,
  c,
  onRemove,
  onMove,
}: CriterionProps) {
  const id = useId();
  const name = `criteria.${index}` as const;
  const e = errors.criteria?.[index];
  const descriptors = useFieldArray({ control, name: `${name}.descriptors` });
  const maxMark = Number(c?.maxMark);
  const gaps = undescribedMarks(
    maxMark,
    (c?.descriptors ?? []).map((d) => ({ min: Number(d?.min), max: Number(d?.max) })),
  );
  const title = c?.label?.trim() || `Criterion ${index + 1}`;

  const spread = () => {
    const bands = spreadBands(maxMark, descriptors.fields.length);
    const texts = (c?.descriptors ?? []).map((d) => d?.text ?? '');
    setValue(
      `${name}.descriptors`,
      bands.map((b, i) => ({ ...b, text: texts[i] ?? '' })),
      { shouldDirty: true },
    );
  };
  const labelField = register(`${name}.label`, {
    onBlur: (ev: { target: { value: string } }) => {
      // Suggest the key from the label while the key is still empty.
      if (!c?.key) setValue(`${name}.key`, keyFromLabel(ev.target.value), { shouldDirty: true });
    },
  });

  return (
    <li className="sm-sheet sm-criterion" aria-label={title}>
      <div className="sm-criterion-head">
        <h3>
          {index + 1}. {title}
        </h3>
        <span className="sm-row-actions">
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-arrow-up"
            aria-label={`Move ${title} up`}
            disabled={index === 0}
            onClick={() => onMove(index - 1)}
          />
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-arrow-down"
            aria-label={`Move ${title} down`}
            disabled={index === count - 1}
            onClick={() => onMove(index + 1)}
          />
          <Button
            type="button"
            size="small"
            text
            severity="danger"
            icon="pi pi-trash"
            aria-label={`Remove ${title}`}
            disabled={count === 1}
            onClick={onRemove}
          />
        </span>
      </div>
      <div className="sm-grid-4">
        <div className="sm-field sm-span-2">
          <label htmlFor={`${id}-label`}>Label</label>
          <InputText
            id={`${id}-label`}
            invalid={!!e?.label}
            aria-describedby={`${id}-label-error`}
            {...labelField}
          />
          <FieldError id={`${id}-label-error`} message={e?.label?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-key`}>Key</label>
          <InputText
            id={`${id}-key`}
            invalid={!!e?.key}
            aria-describedby={`${id}-key-hint ${id}-key-error`}
            {...register(`${name}.key`)}
          />
          <small id={`${id}-key-hint`} className="sm-field-hint">
            Stays the same across versions, e.g. note_accuracy.
          </small>
          <FieldError id={`${id}-key-error`} message={e?.key?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-weight`}>Weight</label>
          <InputText
            id={`${id}-weight`}
            type="number"
            inputMode="decimal"
            step="any"
            min={0}
            invalid={!!e?.weight}
            aria-describedby={`${id}-weight-hint ${id}-weight-error`}
            {...register(`${name}.weight`, { valueAsNumber: true })}
          />
          <small id={`${id}-weight-hint`} className="sm-field-hint">
            Share of the request’s score: {formatWeightShare(Number(c?.weight), totalWeight)}
          </small>
          <FieldError id={`${id}-weight-error`} message={e?.weight?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-max`}>Maximum mark</label>
          <InputText
            id={`${id}-max`}
            type="number"
            inputMode="numeric"
            min={1}
            max={10}
            invalid={!!e?.maxMark}
            aria-describedby={`${id}-max-error`}
            {...register(`${name}.maxMark`, { valueAsNumber: true })}
          />
          <FieldError id={`${id}-max-error`} message={e?.maxMark?.message} />
        </div>
        <div className="sm-field sm-span-3">
          <label htmlFor={`${id}-description`}>What it assesses (optional)</label>
          <InputTextarea
            id={`${id}-description`}
            rows={2}
            autoResize
            {...register(`${name}.description`)}
          />
        </div>
      </div>
      {c && isTensionCriterion({ key: c.key ?? '', label: c.label ?? '' }) && <HealthCaution />}

      <fieldset className="sm-fieldset sm-levels-edit">
        <legend>Level descriptors</legend>
        {e?.descriptors?.message && (
          <FieldError id={`${id}-levels-error`} message={e.descriptors.message} />
        )}
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">From mark</th>
              <th scope="col">To mark</th>
              <th scope="col">Descriptor</th>
              <th scope="col">
                <span className="sm-visually-hidden">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {descriptors.fields.map((d, di) => {
              const de = e?.descriptors?.[di];
              const rowError =
                de?.message ?? de?.min?.message ?? de?.max?.message ?? de?.text?.message;
              return (
                <tr key={d.id}>
                  <td>
                    <InputText
                      type="number"
                      inputMode="numeric"
                      className="sm-input-narrow"
                      aria-label={`${title}, level ${di + 1}: from mark`}
                      invalid={!!de?.min || !!de?.message}
                      {...register(`${name}.descriptors.${di}.min`, { valueAsNumber: true })}
                    />
                  </td>
                  <td>
                    <InputText
                      type="number"
                      inputMode="numeric"
                      className="sm-input-narrow"
                      aria-label={`${title}, level ${di + 1}: to mark`}
                      invalid={!!de?.max || !!de?.message}
                      {...register(`${name}.descriptors.${di}.max`, { valueAsNumber: true })}
                    />
                  </td>
                  <td className="sm-grow-cell">
                    <InputText
                      aria-label={`${title}, level ${di + 1}: descriptor`}
                      invalid={!!de?.text}
                      className="sm-input-full"
                      {...register(`${name}.descriptors.${di}.text`)}
                    />
                    {rowError && <small className="sm-field-error">{rowError}</small>}
                  </td>
                  <td>
                    <Button
                      type="button"
                      size="small"
                      text
                      severity="danger"
                      icon="pi pi-times"
                      aria-label={`Remove level ${di + 1} of ${title}`}
                      disabled={descriptors.fields.length === 1}
                      onClick={() => descriptors.remove(di)}
                    />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        {gaps.length > 0 && (
          <small className="sm-field-hint">
            No descriptor yet for {gaps.length === 1 ? 'mark' : 'marks'} {gaps.join(', ')}.
          </small>
        )}
        <span className="sm-row-actions sm-row-actions-start">
          <Button
            type="button"
            size="small"
            severity="secondary"
            icon="pi pi-plus"
            label="Add a level"
            disabled={descriptors.fields.length > Number(c?.maxMark)}
            onClick={() => {
              const top = Math.max(
                -1,
                ...(c?.descriptors ?? []).map((x) => Number(x?.max)).filter(Number.isFinite),
              );
              const next = Math.min(top + 1, Math.max(0, maxMark || 0));
              descriptors.append({ min: next, max: next, text: '' });
            }}
          />
          <Button
            type="button"
            size="small"
            severity="secondary"
            label="Spread levels over 0 to the maximum"
            disabled={!(maxMark >= 1 && maxMark <= 10)}
            onClick={spread}
          />
        </span>
      </fieldset>
    </li>
  );
}
