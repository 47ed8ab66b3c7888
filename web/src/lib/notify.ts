/**
 * A tiny bus from non-React code (the query cache's error hooks) to the one Toast the app
 * renders. Before the Toast mounts, messages are dropped: there is nowhere to show them.
 */
export interface Notice {
  severity: 'error' | 'success' | 'info' | 'warn';
  summary: string;
  detail?: string;
}

type Listener = (notice: Notice) => void;
let listener: Listener | null = null;

export function setNoticeListener(next: Listener | null): void {
  listener = next;
}

export function notify(notice: Notice): void {
  listener?.(notice);
}
