import { useId, useState } from 'react';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import type { SittingView } from '@stavemark/shared';
import { notify } from '@/lib/notify';
import { useAddCandidates, type AddCandidatesAnswer } from '../api/add-candidates';
import { useClassOptions } from '../api/get-plan-options';
import { PlanProblemAlert, useAcknowledgingRun } from './problems';

/** Adds a class's students as candidates, each to the list of their grade; says who was left out and why. */
export function AddCandidatesDialog({
  sitting,
  visible,
  onHide,
}: {
  sitting: SittingView;
  visible: boolean;
  onHide: () => void;
}) {
  const id = useId();
  const classes = useClassOptions(visible);
  const add = useAddCandidates();
  const { problem, setProblem, run } = useAcknowledgingRun();
  const [classId, setClassId] = useState<string | null>(null);
  const [listVersionId, setListVersionId] = useState<string | null>(null);
  const [answer, setAnswer] = useState<AddCandidatesAnswer | null>(null);

  const close = () => {
    setProblem(null);
    setAnswer(null);
    setClassId(null);
    onHide();
  };
  const submit = () => {
    if (!classId) return;
    void run(
      (ack) =>
        add.mutateAsync({
          id: sitting.id,
          input: {
            classId,
            ...(listVersionId ? { listVersionId } : {}),
            ...(ack ? { acknowledgeOwnPupil: true } : {}),
          },
        }),
      (res) => {
        setAnswer(res);
        notify({
          severity: 'success',
          summary: `${res.added} candidate${res.added === 1 ? '' : 's'} added.`,
        });
        if (res.skipped.length === 0) close();
      },
    );
  };
  const listOptions = [
    { label: 'The list of each candidate’s grade', value: null },
    ...sitting.papers.map((p) => ({
      label: `${p.name} (grade ${p.grade}) for everyone`,
      value: p.listVersionId,
    })),
  ];
  const footer = (
    <div className="sm-form-actions">
      <Button
        type="button"
        label={answer ? 'Done' : 'Cancel'}
        severity="secondary"
        onClick={close}
      />
      <Button
        type="button"
        label={add.isPending ? 'Adding…' : 'Add candidates'}
        disabled={!classId || add.isPending}
        onClick={submit}
      />
    </div>
  );
  return (
    <Dialog
      header="Add candidates from a class"
      visible={visible}
      onHide={close}
      footer={footer}
      style={{ width: '34rem' }}
      breakpoints={{ '640px': '95vw' }}
    >
      <div className="sm-form">
        <PlanProblemAlert problem={problem} />
        <div className="sm-field">
          <label htmlFor={`${id}-class`}>Class</label>
          <Dropdown
            inputId={`${id}-class`}
            value={classId}
            placeholder="Choose a class"
            options={(classes.data ?? [])
              .filter((c) => c.active)
              .map((c) => ({ label: `${c.name} (${c.memberCount})`, value: c.id }))}
            onChange={(e) => setClassId(e.value as string)}
          />
        </div>
        <div className="sm-field">
          <label htmlFor={`${id}-list`}>List</label>
          <Dropdown
            inputId={`${id}-list`}
            value={listVersionId}
            options={listOptions}
            onChange={(e) => setListVersionId(e.value as string | null)}
          />
        </div>
        {answer && answer.skipped.length > 0 && (
          <div role="status">
            <p>
              {answer.added} added. Not added ({answer.skipped.length}):
            </p>
            <ul className="sm-problem-list">
              {answer.skipped.map((s) => (
                <li key={s.studentId}>
                  {s.name}: {s.reason}
                </li>
              ))}
            </ul>
          </div>
        )}
      </div>
    </Dialog>
  );
}
