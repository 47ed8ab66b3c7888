import { useId, useState } from 'react';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputNumber } from 'primereact/inputnumber';
import { InputTextarea } from 'primereact/inputtextarea';
import { Checkbox } from 'primereact/checkbox';
import { Dropdown } from 'primereact/dropdown';
import {
  accessArrangementSchema,
  type AccessArrangementView,
  type Substitution,
} from '@stavemark/shared';
import { notify } from '@/lib/notify';
import { useArrangement, usePutArrangement } from '../api/access-arrangement';
import { PlanProblemAlert, problemOf, type PlanProblem } from './problems';

interface Props {
  candidate: { studentId: string; name: string } | null;
  onHide: () => void;
}

/** A candidate's access arrangement (confidential): extra time, rest breaks, approved substitutions. */
export function ArrangementDialog({ candidate, onHide }: Props) {
  const current = useArrangement(candidate?.studentId ?? null);
  return (
    <Dialog
      header={candidate ? `Access arrangement: ${candidate.name}` : ''}
      visible={candidate !== null}
      onHide={onHide}
      style={{ width: '34rem' }}
      breakpoints={{ '640px': '95vw' }}
    >
      {current.isError && <PlanProblemAlert problem={problemOf(current.error)} />}
      {candidate && current.data && (
        // Keyed by the candidate (not the data: a refetch after saving must not remount the form
        // while its save is settling), so the fields start from the saved arrangement.
        <ArrangementForm
          key={candidate.studentId}
          candidate={candidate}
          saved={current.data}
          onHide={onHide}
        />
      )}
      {candidate && current.isPending && <p className="sm-muted">Loading…</p>}
    </Dialog>
  );
}

function ArrangementForm({
  candidate,
  saved,
  onHide,
}: {
  candidate: { studentId: string; name: string };
  saved: AccessArrangementView;
  onHide: () => void;
}) {
  const id = useId();
  const save = usePutArrangement();
  const [extra, setExtra] = useState(saved.extraTimePercent);
  const [rest, setRest] = useState(saved.restBreakMinutes);
  const [subs, setSubs] = useState<Substitution[]>(saved.substitutions);
  const [notes, setNotes] = useState(saved.notes ?? '');
  const [problem, setProblem] = useState<PlanProblem | null>(null);

  const has = (type: Substitution['type']) => subs.find((s) => s.type === type);
  const toggle = (sub: Substitution, on: boolean) =>
    setSubs((all) =>
      on
        ? [...all.filter((s) => s.type !== sub.type), sub]
        : all.filter((s) => s.type !== sub.type),
    );
  const replace = (sub: Substitution) =>
    setSubs((all) => all.map((s) => (s.type === sub.type ? sub : s)));
  const single = has('single_hand');
  const tempo = has('tempo_percent');
  const octaves = has('max_octaves');

  const submit = () => {
    const input = {
      extraTimePercent: extra,
      restBreakMinutes: rest,
      substitutions: subs,
      ...(notes.trim() ? { notes: notes.trim() } : {}),
    };
    const checked = accessArrangementSchema.safeParse(input);
    if (!checked.success) {
      setProblem({
        message: checked.error.issues[0]?.message ?? 'Check the arrangement.',
        items: [],
      });
      return;
    }
    save.mutate(
      { studentId: candidate.studentId, input: checked.data },
      {
        onSuccess: () => {
          notify({
            severity: 'success',
            summary: `${candidate.name}'s arrangement is saved; slot lengths are updated.`,
          });
          onHide();
        },
        onError: (e) => setProblem(problemOf(e)),
      },
    );
  };

  return (
    <div className="sm-form">
      <p className="sm-muted">
        Confidential: seen by the candidate’s teachers, admins and, while marking, the examiner.
      </p>
      <PlanProblemAlert problem={problem} />
      <div className="sm-plan-row">
        <div className="sm-field">
          <label htmlFor={`${id}-extra`}>Extra time (%)</label>
          <InputNumber
            inputId={`${id}-extra`}
            value={extra}
            onValueChange={(e) => setExtra(e.value ?? 0)}
            min={0}
            max={100}
            suffix=" %"
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-rest`}>Rest breaks (minutes)</label>
          <InputNumber
            inputId={`${id}-rest`}
            value={rest}
            onValueChange={(e) => setRest(e.value ?? 0)}
            min={0}
            max={60}
          />
        </div>
      </div>
      <fieldset className="sm-fieldset">
        <legend>Approved substitutions</legend>
        <div className="sm-check">
          <Checkbox
            inputId={`${id}-hs`}
            checked={!!has('hands_separately')}
            onChange={(e) => toggle({ type: 'hands_separately' }, !!e.checked)}
          />
          <label htmlFor={`${id}-hs`}>Hands separately instead of hands together</label>
        </div>
        <div className="sm-check">
          <Checkbox
            inputId={`${id}-sh`}
            checked={!!single}
            onChange={(e) => toggle({ type: 'single_hand', hand: 'RH' }, !!e.checked)}
          />
          <label htmlFor={`${id}-sh`}>One hand only</label>
          {single?.type === 'single_hand' && (
            <Dropdown
              aria-label="Which hand"
              value={single.hand}
              options={[
                { label: 'Right hand', value: 'RH' },
                { label: 'Left hand', value: 'LH' },
              ]}
              onChange={(e) => replace({ type: 'single_hand', hand: e.value as 'RH' | 'LH' })}
            />
          )}
        </div>
        <div className="sm-check">
          <Checkbox
            inputId={`${id}-tp`}
            checked={!!tempo}
            onChange={(e) => toggle({ type: 'tempo_percent', percent: 80 }, !!e.checked)}
          />
          <label htmlFor={`${id}-tp`}>Slower tempo</label>
          {tempo?.type === 'tempo_percent' && (
            <InputNumber
              aria-label="Tempo in percent of the set tempo"
              value={tempo.percent}
              onValueChange={(e) => replace({ type: 'tempo_percent', percent: e.value ?? 80 })}
              min={50}
              max={99}
              suffix=" %"
            />
          )}
        </div>
        <div className="sm-check">
          <Checkbox
            inputId={`${id}-mo`}
            checked={!!octaves}
            onChange={(e) => toggle({ type: 'max_octaves', octaves: 1 }, !!e.checked)}
          />
          <label htmlFor={`${id}-mo`}>At most</label>
          {octaves?.type === 'max_octaves' && (
            <InputNumber
              aria-label="Largest number of octaves"
              value={octaves.octaves}
              onValueChange={(e) => replace({ type: 'max_octaves', octaves: e.value ?? 1 })}
              min={1}
              max={4}
              suffix=" octave(s)"
            />
          )}
        </div>
      </fieldset>
      <div className="sm-field">
        <label htmlFor={`${id}-notes`}>Notes</label>
        <InputTextarea
          id={`${id}-notes`}
          rows={2}
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
        />
      </div>
      <div className="sm-form-actions">
        <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
        <Button
          type="button"
          label={save.isPending ? 'Saving…' : 'Save arrangement'}
          disabled={save.isPending}
          onClick={submit}
        />
      </div>
    </div>
  );
}
