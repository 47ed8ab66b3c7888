import { Injectable } from '@nestjs/common';

/** How far one import has come, as the client polls it while it waits. */
export interface ImportProgress {
  /** reading → checking rows → writing (steps) → done. */
  phase: 'reading' | 'checking' | 'writing' | 'done';
  /** Rows checked, or writing steps done. */
  done: number;
  /** Rows in the file, or writing steps in all. */
  total: number;
  /** What is happening now, in words. */
  step: string;
}

/**
 * Progress of imports running in this API process, keyed by the caller and an id the client
 * chose. Kept in memory for a few minutes: it is only a display; the import's result is its answer.
 * (With several API instances a poll may reach another one, which answers "not known" and the
 * client shows an indeterminate bar.)
 */
@Injectable()
export class ImportProgressBoard {
  private readonly entries = new Map<string, { progress: ImportProgress; at: number }>();

  private key(membershipId: string, id: string): string {
    return `${membershipId}:${id}`;
  }

  set(membershipId: string, id: string, progress: ImportProgress): void {
    const now = Date.now();
    for (const [k, e] of this.entries) if (now - e.at > 10 * 60_000) this.entries.delete(k);
    this.entries.set(this.key(membershipId, id), { progress, at: now });
  }

  get(membershipId: string, id: string): ImportProgress | null {
    return this.entries.get(this.key(membershipId, id))?.progress ?? null;
  }
}
