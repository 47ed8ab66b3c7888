import { useId, useState } from 'react';
import { Controller, useForm, useWatch, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import { RadioButton } from 'primereact/radiobutton';
import {
  FINGERING_KINDS,
  isInvertibleKind,
  isModalKind,
  MAX_OCTAVES,
  MODES,
  noteCount,
  parseFingering,
  studentFingeringBodySchema,
  type CountedKind,
  type Direction,
  type Hand,
  type Inversion,
  type Mode,
  type StudentFingeringInput,
} from '@stavemark/shared';
import { ApiError } from '@/lib/api-client';
import { Alert } from '@/components/Alert';
import { FieldError } from '@/components/FieldError';
import {
  DIRECTION_LABELS,
  HANDS_LABELS,
  INVERSION_LABELS,
  KIND_LABELS,
  MODE_LABELS,
  octavesLabel,
} from '@/components/music-labels';
import { fingeringTitle, inversionsFor, keyOptions } from './fingering-labels';

/** The form's own fields: the fingering is typed as text ("1-2-3-1-2-3-4-5") and read on check. */
export interface FingeringFields {
  kind: CountedKind;
  key: string;
  mode: Mode | null;
  hand: Hand;
  inversion: Inversion | null;
  octaves: number;
  direction: Direction;
  digitsText: string;
  note: string;
}

const FIELDS = [
  'kind',
  'key',
  'mode',
  'hand',
  'inversion',
  'octaves',
  'direction',
  'note',
] as const;

export function blankFingering(): FingeringFields {
  return {
    kind: 'scale',
    key: 'C',
    mode: 'major',
    hand: 'RH',
    inversion: null,
    octaves: 1,
    direction: 'up_down',
    digitsText: '',
    note: '',
  };
}

/** The body the API takes, from the form's fields (modes and inversions only where they apply). */
export function toBody(f: FingeringFields, digits: number[]) {
  return {
    kind: f.kind,
    key: f.key,
    mode: isModalKind(f.kind) ? f.mode : null,
    hand: f.hand,
    inversion: isInvertibleKind(f.kind) ? f.inversion : null,
    octaves: f.octaves,
    direction: f.direction,
    digits,
    ...(f.note.trim() ? { note: f.note.trim() } : {}),
  };
}

const schemaResolver = zodResolver(studentFingeringBodySchema);

/**
 * Reads the typed fingering, then checks the whole body with the shared schema (the API checks
 * the same): every problem with the digits, their count included, is shown at the fingering field.
 */
export const fingeringResolver: Resolver<FingeringFields, unknown, StudentFingeringInput> = async (
  values,
  context,
  options,
) => {
  let digits: number[];
  try {
    digits = parseFingering(values.digitsText);
  } catch (err) {
    return {
      values: {},
      errors: { digitsText: { type: 'parse', message: (err as Error).message } },
    };
  }
  const result = await (
    schemaResolver as unknown as Resolver<object, unknown, StudentFingeringInput>
  )(toBody(values, digits), context, options as never);
  if (Object.keys(result.errors).length === 0) return result;
  const { digits: digitErrors, ...rest } = result.errors as Record<string, unknown>;
  const errors: Record<string, { type: string; message: string }> = {};
  for (const [field, e] of Object.entries(rest))
    errors[field] = {
      type: 'schema',
      message: (e as { message?: string }).message ?? 'Check this.',
    };
  if (digitErrors) {
    // Zod reports a bad digit at its index and a wrong length on the whole array; show them all.
    const d = digitErrors as { message?: string } & Record<string, { message?: string }>;
    const messages = [
      ...Object.keys(d)
        .filter((k) => /^\d+$/.test(k))
        .sort((a, b) => Number(a) - Number(b))
        .map((k) => d[k]?.message),
      d.message,
    ].filter((m): m is string => !!m);
    errors.digitsText = { type: 'schema', message: messages.join(' ') };
  }
  return { values: {}, errors: errors as never };
};

interface Props {
  defaultValues: FingeringFields;
  /** "Record a fingering" or "Replace the fingering …" */
  title: string;
  /** Saves; throw the API's error to have it shown beside the fields. */
  onSave: (body: StudentFingeringInput) => Promise<void>;
  onCancel: () => void;
}

const kindOptions = FINGERING_KINDS.map((k) => ({ label: KIND_LABELS[k], value: k }));
const modeOptions = MODES.map((m) => ({ label: MODE_LABELS[m], value: m }));
const octaveOptions = Array.from({ length: MAX_OCTAVES }, (_, i) => ({
  label: octavesLabel(i + 1),
  value: i + 1,
}));
const keys = keyOptions();

export function FingeringForm({ defaultValues, title, onSave, onCancel }: Props) {
  const id = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    control,
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FingeringFields, unknown, StudentFingeringInput>({
    resolver: fingeringResolver,
    defaultValues,
    mode: 'onChange',
  });
  const f = useWatch({ control }) as FingeringFields;
  // A change of span re-checks fingers already typed (their count depends on it).
  const recheckDigits: 'digitsText'[] = f.digitsText ? ['digitsText'] : [];
  const modal = isModalKind(f.kind);
  const inversions = inversionsFor(f.kind);
  let expected: number | null = null;
  try {
    expected = noteCount({ kind: f.kind, octaves: f.octaves, direction: f.direction });
  } catch {
    expected = null;
  }
  let typed: number | null = null;
  try {
    typed = parseFingering(f.digitsText ?? '').length;
  } catch {
    typed = null;
  }

  const submit = handleSubmit(async (body) => {
    setFormError(null);
    try {
      await onSave(body);
    } catch (err) {
      if (!(err instanceof ApiError)) {
        setFormError('The server could not be reached. Nothing was saved; try again.');
        return;
      }
      const unplaced: string[] = [];
      for (const d of err.fieldErrors) {
        const field =
          d.path === 'digits' || d.path.startsWith('digits.')
            ? 'digitsText'
            : FIELDS.find((x) => x === d.path);
        if (field) setError(field, { type: 'server', message: d.message });
        else unplaced.push(d.message);
      }
      setFormError(err.fieldErrors.length > 0 && unplaced.length === 0 ? null : err.message);
    }
  });

  return (
    <form onSubmit={submit} noValidate className="sm-form sm-sheet" aria-label={title}>
      <h2 className="sm-section-title">{title}</h2>
      {formError && <Alert severity="error">{formError}</Alert>}
      <div className="sm-grid-4">
        <div className="sm-field">
          <label htmlFor={`${id}-kind`}>Kind</label>
          <Controller
            control={control}
            name="kind"
            rules={{ deps: recheckDigits }}
            render={({ field }) => (
              <Dropdown
                inputId={`${id}-kind`}
                value={field.value}
                options={kindOptions}
                onChange={(e) => field.onChange(e.value)}
                aria-describedby={`${id}-kind-error`}
              />
            )}
          />
          <FieldError id={`${id}-kind-error`} message={errors.kind?.message} />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-key`}>
            {f.kind === 'chromatic' || f.kind === 'diminished_seventh' ? 'Starting note' : 'Key'}
          </label>
          <Controller
            control={control}
            name="key"
            render={({ field }) => (
              <Dropdown
                inputId={`${id}-key`}
                value={field.value}
                options={keys}
                placeholder="Choose a note"
                onChange={(e) => field.onChange(e.value)}
                invalid={!!errors.key}
                aria-describedby={`${id}-key-error`}
              />
            )}
          />
          <FieldError id={`${id}-key-error`} message={errors.key?.message} />
        </div>
        {modal && (
          <div className="sm-field">
            <label htmlFor={`${id}-mode`}>Mode</label>
            <Controller
              control={control}
              name="mode"
              render={({ field }) => (
                <Dropdown
                  inputId={`${id}-mode`}
                  value={field.value}
                  options={modeOptions}
                  placeholder="Choose a mode"
                  onChange={(e) => field.onChange(e.value)}
                  invalid={!!errors.mode}
                  aria-describedby={`${id}-mode-error`}
                />
              )}
            />
            <FieldError id={`${id}-mode-error`} message={errors.mode?.message} />
          </div>
        )}
        {inversions.length > 0 && (
          <div className="sm-field">
            <label htmlFor={`${id}-inversion`}>Inversion</label>
            <Controller
              control={control}
              name="inversion"
              render={({ field }) => (
                <Dropdown
                  inputId={`${id}-inversion`}
                  value={field.value}
                  options={inversions.map((i) => ({ label: INVERSION_LABELS[i], value: i }))}
                  placeholder="None named"
                  showClear
                  onChange={(e) => field.onChange(e.value ?? null)}
                  invalid={!!errors.inversion}
                  aria-describedby={`${id}-inversion-hint ${id}-inversion-error`}
                />
              )}
            />
            <small id={`${id}-inversion-hint`} className="sm-field-hint">
              As the requirement list asks it; leave empty when the list names no inversion.
            </small>
            <FieldError id={`${id}-inversion-error`} message={errors.inversion?.message} />
          </div>
        )}
      </div>
      <div className="sm-grid-4">
        <Controller
          control={control}
          name="hand"
          render={({ field }) => (
            <fieldset className="sm-fieldset">
              <legend>Hand</legend>
              <div className="sm-checks">
                {(['RH', 'LH'] as const).map((h) => (
                  <span key={h} className="sm-check">
                    <RadioButton
                      inputId={`${id}-hand-${h}`}
                      name={`${id}-hand`}
                      value={h}
                      checked={field.value === h}
                      onChange={() => field.onChange(h)}
                    />
                    <label htmlFor={`${id}-hand-${h}`}>{capitalise(HANDS_LABELS[h])}</label>
                  </span>
                ))}
              </div>
            </fieldset>
          )}
        />
        <div className="sm-field">
          <label htmlFor={`${id}-octaves`}>Octaves</label>
          <Controller
            control={control}
            name="octaves"
            rules={{ deps: recheckDigits }}
            render={({ field }) => (
              <Dropdown
                inputId={`${id}-octaves`}
                value={field.value}
                options={octaveOptions}
                onChange={(e) => field.onChange(e.value)}
                aria-describedby={`${id}-octaves-error`}
              />
            )}
          />
          <FieldError id={`${id}-octaves-error`} message={errors.octaves?.message} />
        </div>
        <Controller
          control={control}
          name="direction"
          rules={{ deps: recheckDigits }}
          render={({ field }) => (
            <fieldset className="sm-fieldset sm-span-2">
              <legend>Direction</legend>
              <div className="sm-checks">
                {(['up_down', 'up'] as const).map((d) => (
                  <span key={d} className="sm-check">
                    <RadioButton
                      inputId={`${id}-direction-${d}`}
                      name={`${id}-direction`}
                      value={d}
                      checked={field.value === d}
                      onChange={() => field.onChange(d)}
                    />
                    <label htmlFor={`${id}-direction-${d}`}>
                      {capitalise(DIRECTION_LABELS[d])}
                    </label>
                  </span>
                ))}
              </div>
            </fieldset>
          )}
        />
      </div>
      <div className="sm-field">
        <label htmlFor={`${id}-digits`}>Fingering</label>
        <InputText
          id={`${id}-digits`}
          className="sm-input-full sm-digits"
          autoComplete="off"
          spellCheck={false}
          placeholder="e.g. 1-2-3-1-2-3-4-5"
          invalid={!!errors.digitsText}
          aria-invalid={!!errors.digitsText}
          aria-describedby={`${id}-digits-count ${id}-digits-error`}
          {...register('digitsText')}
        />
        <small id={`${id}-digits-count`} className="sm-field-hint" aria-live="polite">
          {expected === null
            ? 'Choose the span to see how many fingers are needed.'
            : `${fingeringTitle({ ...f, mode: modal ? f.mode : null, inversion: inversions.length ? f.inversion : null })}, ${octavesLabel(f.octaves)} ${DIRECTION_LABELS[f.direction]}: ${expected} notes, one finger each (1 = thumb to 5)${typed === null ? '.' : `; ${typed} typed.`}`}
        </small>
        <FieldError id={`${id}-digits-error`} message={errors.digitsText?.message} />
      </div>
      <div className="sm-field">
        <label htmlFor={`${id}-note`}>Note for the student and examiners (optional)</label>
        <InputTextarea
          id={`${id}-note`}
          rows={2}
          className="sm-input-full"
          invalid={!!errors.note}
          aria-describedby={`${id}-note-error`}
          {...register('note')}
        />
        <FieldError id={`${id}-note-error`} message={errors.note?.message} />
      </div>
      <div className="sm-form-actions">
        <Button type="button" label="Cancel" severity="secondary" onClick={onCancel} />
        <Button
          type="submit"
          label={isSubmitting ? 'Saving…' : 'Save fingering'}
          disabled={isSubmitting}
        />
      </div>
    </form>
  );
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
