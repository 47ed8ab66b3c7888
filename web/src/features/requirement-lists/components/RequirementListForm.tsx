import { useId, useState, type ReactNode } from 'react';
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
import { Dropdown } from 'primereact/dropdown';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { MultiSelect } from 'primereact/multiselect';
import {
  allowedKeys,
  ARTICULATIONS,
  BEAT_UNITS,
  DIRECTIONS,
  DYNAMICS,
  HANDS,
  INVERSIONS,
  isCountedKind,
  isInvertibleKind,
  isModalKind,
  MAX_OCTAVES,
  MODES,
  MOTIONS,
  displayNoteName,
  noteValueName,
  REQUEST_KINDS,
  requirementListVersionBodySchema,
  type NoteNameConvention,
  type RequestKind,
  type RequirementLine,
  type RequirementListVersionBody,
} from '@stavemark/shared';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import {
  ARTICULATION_LABELS,
  DIRECTION_LABELS,
  DYNAMIC_LABELS,
  HANDS_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  keyWord,
  lineFigures,
  MODE_LABELS,
  MOTION_LABELS,
  tempoLabel,
} from './labels';
import { LineFiguresView } from './LineFiguresView';
import { SampleDraws } from './SampleDraws';

export type ListFields = z.input<typeof requirementListVersionBodySchema>;
type LineFields = ListFields['lines'][number];

export interface RubricOption {
  /** Rubric version id. */
  value: string;
  label: string;
  kinds: readonly RequestKind[];
}

/** Key and note names in circle-of-fifths order, from the music-theory library, each once. */
const KEY_OPTIONS = [...new Set([...allowedKeys('major'), ...allowedKeys('natural_minor')])].map(
  (k) => ({ label: displayNoteName(k), value: k }),
);
const OCTAVE_CHOICES = Array.from({ length: MAX_OCTAVES }, (_, i) => i + 1);

export function blankLine(kind: RequestKind, rubricVersionId: string): LineFields {
  const counted = isCountedKind(kind);
  return {
    kind,
    label: '',
    keys: [],
    modes: isModalKind(kind) ? ['major'] : [],
    hands: counted ? ['RH', 'LH'] : ['HT'],
    motions: [],
    octaves: counted ? [1] : [],
    articulations: counted ? ['legato'] : [],
    dynamics: [],
    inversions: isInvertibleKind(kind) ? ['root'] : [],
    tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
    rubricVersionId,
    difficultyWeight: 1,
    ...(counted ? {} : { titles: [], durationSeconds: 60 }),
  };
}

interface Props {
  defaultValues: ListFields;
  submitLabel: string;
  rubricOptions: RubricOption[];
  convention: NoteNameConvention;
  onSave: (body: RequirementListVersionBody) => Promise<void>;
  onCancel: () => void;
}

function firstRubricFor(options: RubricOption[], kind: RequestKind): string {
  return options.find((o) => o.kinds.includes(kind))?.value ?? '';
}

export function RequirementListForm({
  defaultValues,
  submitLabel,
  rubricOptions,
  convention,
  onSave,
  onCancel,
}: Props) {
  const id = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    formState: { errors, isSubmitting },
  } = useForm<ListFields, unknown, RequirementListVersionBody>({
    resolver: zodResolver(requirementListVersionBodySchema),
    defaultValues,
    mode: 'onBlur',
  });
  const lines = useFieldArray({ control, name: 'lines' });
  const values = useWatch({ control }) as ListFields;

  // The live preview draws only from a list that passes the same checks the API makes.
  const parsed = requirementListVersionBodySchema.safeParse(values);
  const previewLines: RequirementLine[] | null = parsed.success
    ? parsed.data.lines.map((l, i) => ({ ...l, id: l.id ?? `line-${i + 1}` }))
    : null;
  const kindsInLines = [
    ...new Set((values.lines ?? []).map((l) => l?.kind).filter((k): k is RequestKind => !!k)),
  ];
  const minimums = (values.selectionRule?.minPerKind ?? {}) as Partial<Record<RequestKind, number>>;
  const minimumKinds = REQUEST_KINDS.filter(
    (k) => kindsInLines.includes(k) || (minimums[k] ?? 0) > 0,
  );

  const submit = handleSubmit(async (body) => {
    setFormError(null);
    try {
      await onSave(body);
    } catch (err) {
      if (!(err instanceof ApiError))
        return setFormError('The server could not be reached. Nothing was saved; try again.');
      const details = err.fieldErrors.filter((d) => d.path !== '(body)');
      for (const d of details)
        setError(d.path as Path<ListFields>, { type: 'server', message: d.message });
      setFormError(
        err.status === 400 && details.length === err.fieldErrors.length && details.length > 0
          ? 'Some fields need attention (marked below).'
          : err.message,
      );
    }
  });

  const minError = (errors.selectionRule?.minPerKind as { message?: string } | undefined)?.message;

  return (
    <form onSubmit={submit} noValidate className="sm-form" aria-label="Requirement list">
      {formError && <Alert severity="error">{formError}</Alert>}
      <div className="sm-sheet">
        <div className="sm-grid-4">
          <div className="sm-field sm-span-2">
            <label htmlFor={`${id}-name`}>Name</label>
            <InputText
              id={`${id}-name`}
              invalid={!!errors.name}
              aria-describedby={`${id}-name-error`}
              {...register('name')}
            />
            <FieldError id={`${id}-name-error`} message={errors.name?.message} />
          </div>
          <div className="sm-field">
            <label htmlFor={`${id}-grade`}>Grade</label>
            <InputText
              id={`${id}-grade`}
              invalid={!!errors.grade}
              aria-describedby={`${id}-grade-error`}
              {...register('grade')}
            />
            <FieldError id={`${id}-grade-error`} message={errors.grade?.message} />
          </div>
          <div className="sm-field">
            <label htmlFor={`${id}-total`}>Total marks</label>
            <InputText
              id={`${id}-total`}
              type="number"
              inputMode="numeric"
              invalid={!!errors.totalMarks}
              aria-describedby={`${id}-total-error`}
              {...register('totalMarks', { valueAsNumber: true })}
            />
            <FieldError id={`${id}-total-error`} message={errors.totalMarks?.message} />
          </div>
        </div>
        <fieldset className="sm-fieldset">
          <legend>Selection rule</legend>
          <div className="sm-grid-4">
            <div className="sm-field">
              <label htmlFor={`${id}-count`}>Requests asked</label>
              <InputText
                id={`${id}-count`}
                type="number"
                inputMode="numeric"
                invalid={!!errors.selectionRule?.count}
                aria-describedby={`${id}-count-error`}
                {...register('selectionRule.count', { valueAsNumber: true })}
              />
              <FieldError id={`${id}-count-error`} message={errors.selectionRule?.count?.message} />
            </div>
            {minimumKinds.map((k) => {
              const e = (
                errors.selectionRule?.minPerKind as Record<string, { message?: string }> | undefined
              )?.[k];
              return (
                <div className="sm-field" key={k}>
                  <label htmlFor={`${id}-min-${k}`}>
                    At least, {KIND_LABELS[k].toLowerCase()}s
                  </label>
                  <Controller
                    control={control}
                    name={`selectionRule.minPerKind.${k}` as Path<ListFields>}
                    render={({ field }) => (
                      <InputText
                        id={`${id}-min-${k}`}
                        type="number"
                        inputMode="numeric"
                        min={0}
                        invalid={!!e}
                        value={field.value === undefined ? '0' : String(field.value)}
                        onChange={(ev) =>
                          field.onChange(ev.target.value === '' ? 0 : Number(ev.target.value))
                        }
                        onBlur={field.onBlur}
                      />
                    )}
                  />
                  <FieldError id={`${id}-min-${k}-error`} message={e?.message} />
                </div>
              );
            })}
          </div>
          <FieldError id={`${id}-min-error`} message={minError} />
        </fieldset>
      </div>

      <h2 className="sm-section-title">Lines</h2>
      <p className="sm-muted">
        Each line is a template of what may be asked; the examiner’s requests are drawn from them.
      </p>
      {errors.lines?.message && <Alert severity="error">{errors.lines.message}</Alert>}
      <ol className="sm-lines">
        {lines.fields.map((f, index) => (
          <LineEditor
            key={f.id}
            index={index}
            count={lines.fields.length}
            control={control}
            register={register}
            setValue={setValue}
            errors={errors}
            line={values.lines?.[index] as LineFields | undefined}
            rubricOptions={rubricOptions}
            convention={convention}
            onRemove={() => lines.remove(index)}
            onMove={(to) => lines.move(index, to)}
          />
        ))}
      </ol>
      <span className="sm-row-actions sm-row-actions-start">
        <Button
          type="button"
          icon="pi pi-plus"
          severity="secondary"
          label="Add a scale line"
          onClick={() => lines.append(blankLine('scale', firstRubricFor(rubricOptions, 'scale')))}
        />
        <Button
          type="button"
          icon="pi pi-plus"
          severity="secondary"
          label="Add an arpeggio line"
          onClick={() =>
            lines.append(blankLine('arpeggio', firstRubricFor(rubricOptions, 'arpeggio')))
          }
        />
        <Button
          type="button"
          icon="pi pi-plus"
          severity="secondary"
          label="Add another line"
          onClick={() =>
            lines.append(blankLine('broken_chord', firstRubricFor(rubricOptions, 'broken_chord')))
          }
        />
      </span>

      <SampleDraws
        lines={previewLines}
        rule={parsed.success ? parsed.data.selectionRule : null}
        convention={convention}
      />

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

interface LineProps {
  index: number;
  count: number;
  control: Control<ListFields>;
  register: UseFormRegister<ListFields>;
  setValue: UseFormSetValue<ListFields>;
  errors: FieldErrors<ListFields>;
  /** The line's current values, watched by the form (a nested watch would miss some changes). */
  line: LineFields | undefined;
  rubricOptions: RubricOption[];
  convention: NoteNameConvention;
  onRemove: () => void;
  onMove: (to: number) => void;
}

/** A group of checkboxes bound to an array field. */
function ChoiceGroup<T extends string | number>({
  legend,
  choices,
  label,
  value,
  onChange,
  error,
  idPrefix,
  hint,
}: {
  legend: string;
  choices: readonly T[];
  label: (c: T) => string;
  value: readonly T[] | undefined;
  onChange: (v: T[]) => void;
  error?: string;
  idPrefix: string;
  hint?: ReactNode;
}) {
  const current = value ?? [];
  return (
    <fieldset className="sm-fieldset" aria-describedby={error ? `${idPrefix}-error` : undefined}>
      <legend>{legend}</legend>
      <div className="sm-checks">
        {choices.map((c) => {
          const checked = current.includes(c);
          return (
            <span key={String(c)} className="sm-check">
              <Checkbox
                inputId={`${idPrefix}-${c}`}
                checked={checked}
                onChange={() =>
                  onChange(
                    checked
                      ? current.filter((x) => x !== c)
                      : choices.filter((x) => x === c || current.includes(x)),
                  )
                }
              />
              <label htmlFor={`${idPrefix}-${c}`}>{label(c)}</label>
            </span>
          );
        })}
      </div>
      {hint}
      <FieldError id={`${idPrefix}-error`} message={error} />
    </fieldset>
  );
}

function TitlesField({
  value,
  onChange,
  id,
  error,
}: {
  value: string[] | undefined;
  onChange: (v: string[]) => void;
  id: string;
  error?: string;
}) {
  // Local text so a new, still empty line can be typed; the field gets the non-empty lines.
  const [text, setText] = useState((value ?? []).join('\n'));
  return (
    <div className="sm-field sm-span-2">
      <label htmlFor={id}>Titles that may be asked (one per line)</label>
      <InputTextarea
        id={id}
        rows={3}
        value={text}
        invalid={!!error}
        aria-describedby={`${id}-error`}
        onChange={(e) => {
          setText(e.target.value);
          onChange(
            e.target.value
              .split('\n')
              .map((t) => t.trim())
              .filter((t) => t !== ''),
          );
        }}
      />
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}

function LineEditor({
  index,
  count,
  control,
  register,
  setValue,
  errors,
  line,
  rubricOptions,
  convention,
  onRemove,
  onMove,
}: LineProps) {
  const id = useId();
  const name = `lines.${index}` as const;
  const e = errors.lines?.[index];
  const kind = (line?.kind ?? 'scale') as RequestKind;
  const counted = isCountedKind(kind);
  const title = line?.label?.trim() || `${KIND_LABELS[kind]} line`;
  const figures = lineFigures({
    kind,
    octaves: line?.octaves,
    directions: line?.directions,
    tempo: line?.tempo,
    durationSeconds: line?.durationSeconds,
  });
  const options = rubricOptions.filter((o) => o.kinds.includes(kind));
  const inversionChoices = INVERSIONS.filter(
    (i) => i !== 'third' || kind === 'dominant_seventh' || kind === 'diminished_seventh',
  );
  const set = (field: string, v: unknown) =>
    setValue(`${name}.${field}` as Path<ListFields>, v as never, {
      shouldValidate: true,
      shouldDirty: true,
    });

  const changeKind = (next: RequestKind) => {
    // Keep only what the new kind can use, so the line stays valid where it can.
    const fresh = blankLine(
      next,
      options.some((o) => o.value === line?.rubricVersionId && o.kinds.includes(next))
        ? (line?.rubricVersionId ?? '')
        : firstRubricFor(rubricOptions, next),
    );
    const keep = line ?? fresh;
    setValue(
      name,
      {
        ...fresh,
        label: keep.label,
        tempo: keep.tempo,
        difficultyWeight: keep.difficultyWeight,
        ...(isCountedKind(next) && counted
          ? {
              keys: keep.keys,
              hands: keep.hands,
              motions: keep.motions,
              octaves: keep.octaves,
              articulations: keep.articulations,
              dynamics: keep.dynamics,
              directions: keep.directions,
            }
          : {}),
        ...(isModalKind(next) && isModalKind(kind) ? { modes: keep.modes } : {}),
      },
      { shouldValidate: false, shouldDirty: true },
    );
  };

  return (
    <li className="sm-sheet sm-line" aria-label={`Line ${index + 1}: ${title}`}>
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
            aria-label={`Move line ${index + 1} up`}
            disabled={index === 0}
            onClick={() => onMove(index - 1)}
          />
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-arrow-down"
            aria-label={`Move line ${index + 1} down`}
            disabled={index === count - 1}
            onClick={() => onMove(index + 1)}
          />
          <Button
            type="button"
            size="small"
            text
            severity="danger"
            icon="pi pi-trash"
            aria-label={`Remove line ${index + 1}`}
            disabled={count === 1}
            onClick={onRemove}
          />
        </span>
      </div>
      <div className="sm-grid-4">
        <div className="sm-field">
          <label htmlFor={`${id}-kind`}>Kind</label>
          <Dropdown
            inputId={`${id}-kind`}
            value={kind}
            options={REQUEST_KINDS.map((k) => ({ label: KIND_LABELS[k], value: k }))}
            onChange={(ev) => changeKind(ev.value as RequestKind)}
          />
        </div>
        <div className="sm-field sm-span-2">
          <label htmlFor={`${id}-label`}>Label (optional)</label>
          <InputText
            id={`${id}-label`}
            placeholder="e.g. Minor scales, hands together"
            {...register(`${name}.label`)}
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-weight`}>Difficulty weight</label>
          <InputText
            id={`${id}-weight`}
            type="number"
            inputMode="decimal"
            step="any"
            invalid={!!e?.difficultyWeight}
            aria-describedby={`${id}-weight-error`}
            {...register(`${name}.difficultyWeight`, { valueAsNumber: true })}
          />
          <FieldError id={`${id}-weight-error`} message={e?.difficultyWeight?.message} />
        </div>
        {counted && (
          <div className="sm-field sm-span-4">
            <label htmlFor={`${id}-keys`}>
              {keyWord(kind) === 'keys' ? 'Keys' : 'Starting notes'}
            </label>
            <Controller
              control={control}
              name={`${name}.keys`}
              render={({ field }) => (
                <MultiSelect
                  inputId={`${id}-keys`}
                  value={field.value}
                  options={KEY_OPTIONS}
                  onChange={(ev) =>
                    field.onChange(
                      KEY_OPTIONS.map((o) => o.value).filter((k) =>
                        (ev.value as string[]).includes(k),
                      ),
                    )
                  }
                  display="chip"
                  filter
                  placeholder={`Choose ${keyWord(kind)}`}
                  invalid={!!e?.keys}
                  aria-describedby={`${id}-keys-error`}
                  className="sm-input-full"
                />
              )}
            />
            <FieldError
              id={`${id}-keys-error`}
              message={
                e?.keys?.message ??
                (Array.isArray(e?.keys) ? e.keys.find(Boolean)?.message : undefined)
              }
            />
          </div>
        )}
      </div>
      <div className="sm-grid-2">
        {isModalKind(kind) && (
          <ChoiceGroup
            legend="Modes"
            idPrefix={`${id}-mode`}
            choices={MODES}
            label={(m) => MODE_LABELS[m]}
            value={line?.modes}
            onChange={(v) => set('modes', v)}
            error={e?.modes?.message}
          />
        )}
        <ChoiceGroup
          legend="Hands"
          idPrefix={`${id}-hands`}
          choices={HANDS}
          label={(h) => HANDS_LABELS[h]}
          value={line?.hands}
          onChange={(v) => {
            set('hands', v);
            if (!v.includes('HT') && (line?.motions?.length ?? 0) > 0) set('motions', []);
          }}
          error={e?.hands?.message}
        />
        {counted && line?.hands?.includes('HT') && (
          <ChoiceGroup
            legend="Motion (hands together)"
            idPrefix={`${id}-motion`}
            choices={MOTIONS}
            label={(m) => MOTION_LABELS[m]}
            value={line?.motions}
            onChange={(v) => set('motions', v)}
            error={e?.motions?.message}
            hint={<small className="sm-field-hint">None ticked: similar motion.</small>}
          />
        )}
        {counted && (
          <ChoiceGroup
            legend="Octaves"
            idPrefix={`${id}-oct`}
            choices={OCTAVE_CHOICES}
            label={(o) => String(o)}
            value={line?.octaves}
            onChange={(v) => set('octaves', v)}
            error={e?.octaves?.message}
          />
        )}
        {counted && (
          <ChoiceGroup
            legend="Direction"
            idPrefix={`${id}-dir`}
            choices={DIRECTIONS}
            label={(d) => DIRECTION_LABELS[d]}
            value={line?.directions}
            onChange={(v) => set('directions', v)}
            hint={<small className="sm-field-hint">None ticked: up and down.</small>}
          />
        )}
        {counted && (
          <ChoiceGroup
            legend="Articulation"
            idPrefix={`${id}-art`}
            choices={ARTICULATIONS}
            label={(a) => ARTICULATION_LABELS[a]}
            value={line?.articulations}
            onChange={(v) => set('articulations', v)}
          />
        )}
        <ChoiceGroup
          legend="Dynamics"
          idPrefix={`${id}-dyn`}
          choices={DYNAMICS}
          label={(d) => DYNAMIC_LABELS[d]}
          value={line?.dynamics}
          onChange={(v) => set('dynamics', v)}
        />
        {isInvertibleKind(kind) && (
          <ChoiceGroup
            legend="Positions"
            idPrefix={`${id}-inv`}
            choices={inversionChoices}
            label={(i) => INVERSION_LABELS[i]}
            value={line?.inversions}
            onChange={(v) => set('inversions', v)}
            error={e?.inversions?.message}
          />
        )}
      </div>
      <div className="sm-grid-4">
        <div className="sm-field">
          <label htmlFor={`${id}-bpm`}>Beats per minute</label>
          <InputText
            id={`${id}-bpm`}
            type="number"
            inputMode="decimal"
            step="any"
            invalid={!!e?.tempo?.bpm}
            aria-describedby={`${id}-bpm-error`}
            {...register(`${name}.tempo.bpm`, { valueAsNumber: true })}
          />
          <FieldError id={`${id}-bpm-error`} message={e?.tempo?.bpm?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-unit`}>Beat</label>
          <Controller
            control={control}
            name={`${name}.tempo.beatUnit`}
            render={({ field }) => (
              <Dropdown
                inputId={`${id}-unit`}
                value={field.value}
                options={BEAT_UNITS.map((u) => ({ label: noteValueName(u, convention), value: u }))}
                onChange={(ev) => field.onChange(ev.value)}
              />
            )}
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-npb`}>Notes per beat</label>
          <InputText
            id={`${id}-npb`}
            type="number"
            inputMode="numeric"
            invalid={!!e?.tempo?.notesPerBeat}
            aria-describedby={`${id}-npb-error`}
            {...register(`${name}.tempo.notesPerBeat`, { valueAsNumber: true })}
          />
          <FieldError id={`${id}-npb-error`} message={e?.tempo?.notesPerBeat?.message} />
        </div>
        <div className="sm-field">
          <span className="sm-field-label" aria-hidden="true">
            Tempo
          </span>
          <p className="sm-tempo-words" aria-label="Tempo in words">
            {line?.tempo
              ? tempoLabel(
                  {
                    bpm: Number(line.tempo.bpm),
                    beatUnit: line.tempo.beatUnit,
                    notesPerBeat: Number(line.tempo.notesPerBeat),
                  },
                  convention,
                )
              : '—'}
          </p>
        </div>
        {!counted && (
          <>
            <Controller
              control={control}
              name={`${name}.titles`}
              render={({ field }) => (
                <TitlesField
                  id={`${id}-titles`}
                  value={field.value}
                  onChange={field.onChange}
                  error={e?.titles?.message}
                />
              )}
            />
            <div className="sm-field">
              <label htmlFor={`${id}-duration`}>Playing time (seconds)</label>
              <InputText
                id={`${id}-duration`}
                type="number"
                inputMode="numeric"
                invalid={!!e?.durationSeconds}
                aria-describedby={`${id}-duration-error`}
                {...register(`${name}.durationSeconds`, { valueAsNumber: true })}
              />
              <FieldError id={`${id}-duration-error`} message={e?.durationSeconds?.message} />
            </div>
          </>
        )}
        <div className="sm-field sm-span-2">
          <label htmlFor={`${id}-rubric`}>Marked with</label>
          <Controller
            control={control}
            name={`${name}.rubricVersionId`}
            render={({ field }) => (
              <Dropdown
                inputId={`${id}-rubric`}
                value={field.value}
                options={options}
                onChange={(ev) => field.onChange(ev.value)}
                placeholder={
                  options.length
                    ? 'Choose a rubric'
                    : `No rubric for ${KIND_LABELS[kind].toLowerCase()}s yet`
                }
                invalid={!!e?.rubricVersionId}
                aria-describedby={`${id}-rubric-error`}
              />
            )}
          />
          <FieldError id={`${id}-rubric-error`} message={e?.rubricVersionId?.message} />
        </div>
      </div>
      <LineFiguresView figures={figures} label={title} />
    </li>
  );
}
