import type { CellValue, SaveResult } from '@stavemark/shared';
import { ApiError, SessionEndedError } from '@/lib/api-client';

/** One change waiting to reach the server (design.md §7). */
export interface QueuedChange {
  changeId: string;
  cell: string;
  value: CellValue;
  /** The cell's version this change is based on; fixed when it is first sent, kept for retries. */
  baseVersion: number | null;
}

export interface CellConflict {
  cell: string;
  yours: CellValue;
  theirs: CellValue;
  /** The server's version, to base the examiner's choice on. */
  version: number;
}

export type QueueState = 'saved' | 'saving' | 'offline';

export interface QueueSnapshot {
  state: QueueState;
  pending: number;
  conflicts: CellConflict[];
  /** Changes the server refused as bad input, with its message (kept, never dropped silently). */
  refused: { change: QueuedChange; message: string }[];
  lastChangeId: string | null;
}

export type SendChange = (change: QueuedChange & { baseVersion: number }) => Promise<SaveResult>;

interface StorageLike {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

/** Storage key: per person and sheet, so a shared tablet keeps each examiner's queue apart. */
export const queueKey = (personId: string, sheetId: string) =>
  `stavemark.marking.v1.${personId}.${sheetId}`;

const isNetworkFailure = (e: unknown) =>
  e instanceof TypeError ||
  (e instanceof ApiError && (e.status >= 500 || e.status === 429)) ||
  (e instanceof DOMException && e.name !== 'AbortError');

/**
 * The client's queue of cell saves. Every change is written to storage before it is sent, so a
 * reload or a dropped connection loses nothing; changes go one at a time in the order made, and
 * a failed send is retried (with back-off, and at once when the browser says it is online)
 * until the server answers.
 */
export class SaveQueue {
  private items: QueuedChange[];
  private versions = new Map<string, number>();
  private listeners = new Set<() => void>();
  private snapshot: QueueSnapshot;
  private draining = false;
  private offline = false;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private retryDelay = 500;
  private stopped = false;
  private lastChangeId: string | null = null;
  private conflicts: CellConflict[] = [];
  private refused: QueueSnapshot['refused'] = [];

  constructor(
    private readonly key: string,
    private readonly send: SendChange,
    private readonly storage: StorageLike = window.localStorage,
    private readonly newId: () => string = () => crypto.randomUUID(),
  ) {
    this.items = this.load();
    this.lastChangeId = this.items.at(-1)?.changeId ?? null;
    this.snapshot = this.makeSnapshot();
  }

  /** The versions the client knows, from the sheet it loaded. */
  seedVersions(cells: { cell: string; version: number }[]): void {
    for (const c of cells)
      if ((this.versions.get(c.cell) ?? -1) < c.version) this.versions.set(c.cell, c.version);
  }

  versionOf(cell: string): number {
    return this.versions.get(cell) ?? 0;
  }

  /** Values still waiting, newest last: the desk shows them over the server's. */
  pendingValues(): Map<string, CellValue> {
    return new Map(this.items.map((i) => [i.cell, i.value]));
  }

  enqueue(cell: string, value: CellValue): QueuedChange {
    const change: QueuedChange = { changeId: this.newId(), cell, value, baseVersion: null };
    this.items.push(change);
    this.lastChangeId = change.changeId;
    this.persist();
    this.emit();
    void this.drain();
    return change;
  }

  /** The examiner's choice after a conflict: a new change based on the server's version. */
  resolve(conflict: CellConflict, value: CellValue): void {
    this.conflicts = this.conflicts.filter((c) => c !== conflict);
    this.versions.set(conflict.cell, conflict.version);
    if (value !== conflict.theirs) this.enqueue(conflict.cell, value);
    else this.emit();
  }

  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  getSnapshot = (): QueueSnapshot => this.snapshot;

  /** Called when the browser comes back online: retry now rather than after the back-off. */
  wake(): void {
    if (this.retryTimer) clearTimeout(this.retryTimer);
    this.retryTimer = null;
    this.retryDelay = 500;
    void this.drain();
  }

  /** Starts (again) after stop(): a remounted desk reuses its queue. */
  resume(): void {
    this.stopped = false;
    void this.drain();
  }

  stop(): void {
    this.stopped = true;
    if (this.retryTimer) clearTimeout(this.retryTimer);
    this.retryTimer = null;
  }

  /** Sends queued changes in order until the queue is empty or the server cannot be reached. */
  async drain(): Promise<void> {
    if (this.draining || this.stopped) return;
    this.draining = true;
    this.emit();
    try {
      while (this.items.length > 0 && !this.stopped) {
        const head = this.items[0]!;
        if (head.baseVersion === null) {
          head.baseVersion = this.versionOf(head.cell);
          this.persist();
        }
        try {
          const result = await this.send({ ...head, baseVersion: head.baseVersion });
          this.offline = false;
          this.retryDelay = 500;
          if (result.status === 'conflict') this.conflicts.push(result);
          else this.versions.set(result.cell, result.version);
        } catch (e) {
          if (e instanceof ApiError && e.status === 409 && isConflictDetails(e.body.details)) {
            const d = e.body.details;
            this.conflicts.push({
              cell: d.cell,
              yours: d.yours,
              theirs: d.theirs,
              version: d.version,
            });
          } else if (isNetworkFailure(e) || e instanceof SessionEndedError) {
            this.offline = true;
            this.scheduleRetry();
            return;
          } else {
            this.refused.push({
              change: head,
              message: e instanceof Error ? e.message : String(e),
            });
          }
        }
        this.items.shift();
        this.persist();
        this.emit();
      }
    } finally {
      this.draining = false;
      this.emit();
    }
  }

  private scheduleRetry(): void {
    if (this.retryTimer || this.stopped) return;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.drain();
    }, this.retryDelay);
    this.retryDelay = Math.min(this.retryDelay * 2, 5000);
  }

  private load(): QueuedChange[] {
    try {
      const raw = this.storage.getItem(this.key);
      const parsed: unknown = raw ? JSON.parse(raw) : [];
      return Array.isArray(parsed) ? (parsed as QueuedChange[]) : [];
    } catch {
      return []; // unreadable storage: nothing was queued that we could read
    }
  }

  private persist(): void {
    if (this.items.length === 0) this.storage.removeItem(this.key);
    else this.storage.setItem(this.key, JSON.stringify(this.items));
  }

  private makeSnapshot(): QueueSnapshot {
    return {
      state: this.offline ? 'offline' : this.items.length > 0 || this.draining ? 'saving' : 'saved',
      pending: this.items.length,
      conflicts: [...this.conflicts],
      refused: [...this.refused],
      lastChangeId: this.lastChangeId,
    };
  }

  private emit(): void {
    this.snapshot = this.makeSnapshot();
    for (const l of this.listeners) l();
  }
}

function isConflictDetails(d: unknown): d is {
  kind: 'cell_conflict';
  cell: string;
  yours: CellValue;
  theirs: CellValue;
  version: number;
} {
  return typeof d === 'object' && d !== null && (d as { kind?: unknown }).kind === 'cell_conflict';
}
