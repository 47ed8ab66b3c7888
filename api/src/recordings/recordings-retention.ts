import { Injectable, Logger } from '@nestjs/common';
import { DataSource, LessThanOrEqual } from 'typeorm';
import { AuditEvent } from '../audit/entities/audit-event.entity.js';
import { now } from '../common/clock.js';
import { StorageService } from '../storage/storage.service.js';
import { Recording } from './entities/recording.entity.js';

/**
 * Deletes recordings whose retention period has passed: the file first, then the row with an audit
 * event in one transaction. File first, so a failure leaves a row pointing at nothing (retried next
 * run; the driver's delete is idempotent) rather than a minor's file nobody can find.
 */
@Injectable()
export class RecordingsRetention {
  private readonly logger = new Logger('RecordingRetention');

  constructor(
    private readonly db: DataSource,
    private readonly storage: StorageService,
  ) {}

  /** Across every organisation (a system job, no caller). Resolves to the number deleted. */
  async purgeExpired(at: Date = now(), batch = 200): Promise<number> {
    let deleted = 0;
    for (;;) {
      const due = await this.db.getRepository(Recording).find({
        where: { expiresAt: LessThanOrEqual(at) },
        order: { expiresAt: 'ASC' },
        take: batch,
      });
      if (due.length === 0) return deleted;
      let progressed = 0;
      for (const rec of due) {
        try {
          await this.storage.delete(rec.storageKey);
        } catch (err) {
          this.logger.warn(`could not delete the file of recording ${rec.id}: ${err instanceof Error ? err.message : String(err)}`);
          continue;
        }
        await this.db.transaction(async (em) => {
          const gone = await em.getRepository(Recording).delete({ id: rec.id, expiresAt: LessThanOrEqual(at) });
          if (!gone.affected) return;
          await em.getRepository(AuditEvent).save(
            em.getRepository(AuditEvent).create({
              organisationId: rec.organisationId,
              actorPersonId: null,
              action: 'recording.deleted_after_retention',
              entity: 'recording',
              entityId: rec.id,
              before: { studentId: rec.studentId, slotId: rec.slotId, contentType: rec.contentType, sizeBytes: rec.sizeBytes, createdAt: rec.createdAt.toISOString(), expiresAt: rec.expiresAt.toISOString() },
              after: null,
            }),
          );
          deleted++;
          progressed++;
        });
      }
      // Every file in the batch failed to go: stop, the next run tries again.
      if (progressed === 0 || due.length < batch) return deleted;
    }
  }
}
