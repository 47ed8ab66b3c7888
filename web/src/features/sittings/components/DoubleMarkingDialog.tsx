import { useId, useState } from 'react';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { InputNumber } from 'primereact/inputnumber';
import type { SittingView } from '@stavemark/shared';
import { notify } from '@/lib/notify';
import { useDoubleMarking } from '../api/double-marking';
import { PlanProblemAlert, useAcknowledgingRun } from './problems';

/** Double marking: a share of the slots, spread through the day, gets a second examiner. */
export function DoubleMarkingDialog({
  sitting,
  visible,
  onHide,
}: {
  sitting: SittingView;
  visible: boolean;
  onHide: () => void;
}) {
  const id = useId();
  const [share, setShare] = useState(25);
  const mutation = useDoubleMarking();
  const { problem, setProblem, run } = useAcknowledgingRun();
  const close = () => {
    setProblem(null);
    onHide();
  };
  const submit = () =>
    void run(
      (ack) =>
        mutation.mutateAsync({
          id: sitting.id,
          input: { share, ...(ack ? { acknowledgeOwnPupil: true } : {}) },
        }),
      (res) => {
        const n = res.slots.filter((s) => s.secondExaminer).length;
        notify({
          severity: res.notAssigned.length ? 'warn' : 'success',
          summary: `${n} slot${n === 1 ? '' : 's'} double-marked.`,
          ...(res.notAssigned.length
            ? { detail: res.notAssigned.map((x) => `${x.candidate}: ${x.reason}`).join('; ') }
            : {}),
        });
        close();
      },
    );
  const footer = (
    <div className="sm-form-actions">
      <Button type="button" label="Cancel" severity="secondary" onClick={close} />
      <Button
        type="button"
        label={mutation.isPending ? 'Allocating…' : 'Allocate second examiners'}
        disabled={mutation.isPending}
        onClick={submit}
      />
    </div>
  );
  return (
    <Dialog
      header="Double marking"
      visible={visible}
      onHide={close}
      footer={footer}
      style={{ width: '30rem' }}
      breakpoints={{ '640px': '95vw' }}
    >
      <div className="sm-form">
        <PlanProblemAlert problem={problem} />
        <p>
          Second examiners are shared out so that each pair of examiners marks together about
          equally often, avoiding anyone who teaches the candidate or is examining elsewhere at the
          time. A share of 0 % removes double marking.
        </p>
        <div className="sm-field">
          <label htmlFor={`${id}-share`}>Share of the slots</label>
          <InputNumber
            inputId={`${id}-share`}
            value={share}
            onValueChange={(e) => setShare(e.value ?? 0)}
            min={0}
            max={100}
            suffix=" %"
          />
        </div>
      </div>
    </Dialog>
  );
}
