import { Foundation1764633600000 } from './1764633600000-Foundation.js';

/** Listed by class, not by glob, so tests and dist/ share one list (toolchain.md). Append only. */
export const migrations = [Foundation1764633600000];
