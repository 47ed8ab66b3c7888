import { AsyncLocalStorage } from 'node:async_hooks';
import type { Role } from '@stavemark/shared';

/** Who is calling, set by the auth guard after the token and membership are checked. */
export interface Caller {
  personId: string;
  membershipId: string;
  organisationId: string;
  roles: Role[];
  timeZone: string;
}

interface Store {
  caller?: Caller;
}

const storage = new AsyncLocalStorage<Store>();

/** Express middleware: one store per request, filled in by the guard. */
export function requestContextMiddleware(_req: unknown, _res: unknown, next: () => void): void {
  storage.run({}, next);
}

export const RequestContext = {
  setCaller(caller: Caller): void {
    const store = storage.getStore();
    if (!store) throw new Error('No request context: is requestContextMiddleware installed?');
    store.caller = caller;
  },
  caller(): Caller | undefined {
    return storage.getStore()?.caller;
  },
  requireCaller(): Caller {
    const c = storage.getStore()?.caller;
    if (!c) throw new Error('No signed-in caller in this context');
    return c;
  },
  /** Runs work as a given caller (seed, jobs, tests). */
  runAs<T>(caller: Caller, fn: () => T): T {
    return storage.run({ caller }, fn);
  },
};
