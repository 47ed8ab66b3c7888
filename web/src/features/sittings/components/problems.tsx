import { useCallback, useState } from 'react';
import { confirmDialog } from 'primereact/confirmdialog';
import { Alert } from '@/components/Alert';
import { ApiError } from '@/lib/api-client';

/** A refusal from the sittings API, in words: conflicts listed one by one. */
export interface PlanProblem {
  message: string;
  items: string[];
}

interface ConflictDetails {
  kind: 'conflicts';
  conflicts: { kind: string; message: string }[];
}
interface OwnPupilDetails {
  kind: 'own_pupil';
  warnings: { slotId: string; message: string }[];
}

function detailsOf(error: unknown): ConflictDetails | OwnPupilDetails | null {
  if (!(error instanceof ApiError) || error.status !== 409) return null;
  const d = error.body.details as { kind?: string } | undefined;
  if (d && !Array.isArray(d) && (d.kind === 'conflicts' || d.kind === 'own_pupil'))
    return d as ConflictDetails | OwnPupilDetails;
  return null;
}

export function ownPupilWarnings(error: unknown): string[] | null {
  const d = detailsOf(error);
  return d?.kind === 'own_pupil' ? d.warnings.map((w) => w.message) : null;
}

export function problemOf(error: unknown): PlanProblem {
  const d = detailsOf(error);
  if (d?.kind === 'conflicts') {
    return {
      message:
        d.conflicts.length > 1
          ? `${d.conflicts.length} conflicts: nothing was changed.`
          : 'Conflict: nothing was changed.',
      items: d.conflicts.map((c) => c.message),
    };
  }
  if (error instanceof ApiError) {
    const fields = error.fieldErrors.map((f) => `${f.path}: ${f.message}`);
    return { message: error.message, items: fields.length > 1 ? fields : [] };
  }
  return { message: 'The server could not be reached. Nothing was changed; try again.', items: [] };
}

export function PlanProblemAlert({ problem }: { problem: PlanProblem | null }) {
  if (!problem) return null;
  return (
    <Alert severity="error">
      <strong>{problem.message}</strong>
      {problem.items.length > 0 && (
        <ul className="sm-problem-list">
          {problem.items.map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}

/**
 * Runs a change; if the API answers that an examiner teaches a candidate, asks the person to
 * acknowledge it and runs the change again with the acknowledgement (which the API records).
 * Any other refusal is kept as `problem` for the page to show.
 */
export function useAcknowledgingRun() {
  const [problem, setProblem] = useState<PlanProblem | null>(null);
  const run = useCallback(
    async <T,>(
      change: (acknowledgeOwnPupil: boolean) => Promise<T>,
      onDone?: (result: T) => void,
    ): Promise<void> => {
      setProblem(null);
      const attempt = async (ack: boolean) => {
        try {
          const result = await change(ack);
          onDone?.(result);
        } catch (error) {
          const warnings = ack ? null : ownPupilWarnings(error);
          if (warnings) {
            confirmDialog({
              header: 'An examiner would mark their own pupil',
              message: (
                <div>
                  <ul className="sm-problem-list">
                    {warnings.map((w) => (
                      <li key={w}>{w}</li>
                    ))}
                  </ul>
                  <p>
                    Go ahead only if no other examiner can mark them. Your acknowledgement is
                    recorded.
                  </p>
                </div>
              ),
              acceptLabel: 'Acknowledge and go ahead',
              rejectLabel: 'Cancel',
              rejectClassName: 'p-button-secondary',
              defaultFocus: 'reject',
              accept: () => void attempt(true),
            });
          } else {
            setProblem(problemOf(error));
          }
        }
      };
      await attempt(false);
    },
    [],
  );
  return { problem, setProblem, run };
}
