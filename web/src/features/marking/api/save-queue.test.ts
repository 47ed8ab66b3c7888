import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SaveResult } from '@stavemark/shared';
import { ApiError } from '@/lib/api-client';
import { queueKey, SaveQueue, type QueuedChange } from './save-queue';

class MemoryStorage {
  data = new Map<string, string>();
  getItem(k: string) {
    return this.data.get(k) ?? null;
  }
  setItem(k: string, v: string) {
    this.data.set(k, v);
  }
  removeItem(k: string) {
    this.data.delete(k);
  }
}

let n = 0;
const ids = () => `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`;
const applied = (c: QueuedChange & { baseVersion: number }): SaveResult => ({
  status: 'applied',
  cell: c.cell,
  value: c.value,
  version: c.baseVersion + 1,
  changeId: c.changeId,
});
const until = async (cond: () => boolean) => {
  for (let i = 0; i < 200 && !cond(); i++) await new Promise((r) => setTimeout(r, 5));
  expect(cond()).toBe(true);
};

afterEach(() => vi.useRealTimers());

describe('the marking save queue', () => {
  it('sends in order, one at a time, basing each change on the version the previous one made', async () => {
    const sent: (QueuedChange & { baseVersion: number })[] = [];
    const q = new SaveQueue('k', async (c) => (sent.push(c), applied(c)), new MemoryStorage(), ids);
    q.seedVersions([{ cell: 'mark:0:a', version: 3 }]);
    q.enqueue('mark:0:a', 4);
    q.enqueue('mark:0:a', 5);
    q.enqueue('flag:0:slip', 1);
    await until(() => q.getSnapshot().state === 'saved');
    expect(sent.map((s) => [s.cell, s.value, s.baseVersion])).toEqual([
      ['mark:0:a', 4, 3],
      ['mark:0:a', 5, 4],
      ['flag:0:slip', 1, 0],
    ]);
  });

  it('keeps changes through a dropped connection and a reload, then drains with the same change ids', async () => {
    const storage = new MemoryStorage();
    const key = queueKey('person-1', 'sheet-1');
    const down = new SaveQueue(
      key,
      () => Promise.reject(new TypeError('Failed to fetch')),
      storage,
      ids,
    );
    const a = down.enqueue('mark:0:a', 7);
    const b = down.enqueue('comment:overall', 'Even tone');
    await until(() => down.getSnapshot().state === 'offline');
    expect(down.getSnapshot().pending).toBe(2);
    down.stop(); // the page is reloaded

    const sent: string[] = [];
    const up = new SaveQueue(key, async (c) => (sent.push(c.changeId), applied(c)), storage, ids);
    expect(up.getSnapshot()).toMatchObject({ pending: 2, lastChangeId: b.changeId });
    await up.drain();
    expect(sent).toEqual([a.changeId, b.changeId]);
    expect(up.getSnapshot()).toMatchObject({ state: 'saved', pending: 0 });
    expect(storage.getItem(key)).toBeNull();
  });

  it('keeps queues of different people and sheets apart', () => {
    expect(queueKey('p1', 's1')).not.toBe(queueKey('p2', 's1'));
    expect(queueKey('p1', 's1')).not.toBe(queueKey('p1', 's2'));
  });

  it('retries a server error after a back-off and stops at once on wake', async () => {
    vi.useFakeTimers();
    let fail = 2;
    const send = vi.fn(async (c: QueuedChange & { baseVersion: number }) => {
      if (fail-- > 0)
        throw new ApiError({ statusCode: 503, error: 'Service Unavailable', message: 'down' });
      return applied(c);
    });
    const q = new SaveQueue('k', send, new MemoryStorage(), ids);
    q.enqueue('flag:1:restart', 1);
    await vi.advanceTimersByTimeAsync(0);
    expect(q.getSnapshot().state).toBe('offline');
    await vi.advanceTimersByTimeAsync(500);
    expect(send).toHaveBeenCalledTimes(2);
    q.wake();
    await vi.advanceTimersByTimeAsync(0);
    expect(send).toHaveBeenCalledTimes(3);
    expect(q.getSnapshot()).toMatchObject({ state: 'saved', pending: 0 });
  });

  it('turns a conflict into a choice with both values, and a refusal into a visible error', async () => {
    const q = new SaveQueue(
      'k',
      async (c) => {
        if (c.cell === 'mark:0:a')
          throw new ApiError({
            statusCode: 409,
            error: 'Conflict',
            message: 'changed',
            details: { kind: 'cell_conflict', cell: c.cell, yours: c.value, theirs: 2, version: 5 },
          });
        throw new ApiError({
          statusCode: 400,
          error: 'Bad Request',
          message: 'Evenness is marked out of 5.',
        });
      },
      new MemoryStorage(),
      ids,
    );
    q.enqueue('mark:0:a', 4);
    q.enqueue('mark:0:b', 9);
    await until(() => q.getSnapshot().pending === 0);
    const snap = q.getSnapshot();
    expect(snap.conflicts).toEqual([{ cell: 'mark:0:a', yours: 4, theirs: 2, version: 5 }]);
    expect(snap.refused.map((r) => r.message)).toEqual(['Evenness is marked out of 5.']);
    expect(q.versionOf('mark:0:a')).toBe(0);
    q.resolve(snap.conflicts[0]!, 2); // keep theirs: nothing to send
    expect(q.versionOf('mark:0:a')).toBe(5);
    expect(q.getSnapshot().pending).toBe(0);
  });
});
