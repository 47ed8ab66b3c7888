import type { SittingStatus, SlotOutcome } from '@stavemark/shared';

export const STATUS_LABEL: Record<SittingStatus, string> = {
  draft: 'Draft',
  scheduled: 'Scheduled',
  in_progress: 'In progress',
  marking_closed: 'Marking closed',
  published: 'Published',
};

export const STATUS_SEVERITY: Record<
  SittingStatus,
  'info' | 'success' | 'warning' | 'secondary' | undefined
> = {
  draft: 'secondary',
  scheduled: 'info',
  in_progress: 'warning',
  marking_closed: 'success',
  published: 'success',
};

/** What the button that moves a sitting on says. */
export const STATUS_ACTION: Record<SittingStatus, string> = {
  draft: 'Back to draft',
  scheduled: 'Schedule and send invitations',
  in_progress: 'Start the sitting',
  marking_closed: 'Close marking',
  published: 'Publish',
};

export const OUTCOME_LABEL: Record<SlotOutcome, string> = {
  completed: 'Completed',
  absent: 'Absent',
  withdrawn: 'Withdrawn',
  incomplete: 'Incomplete',
};
