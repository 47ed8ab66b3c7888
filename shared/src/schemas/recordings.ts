// Recordings of a slot or of practice (issue 6 §6; design.md §3, §8): audio or video kept for a
// retention period, played back through short-lived signed URLs, for minors only with a
// guardian's consent on record.
import { z } from 'zod';

/** Largest recording accepted, in MB (a 20-minute phone video at a modest bitrate). */
export const RECORDING_MAX_MB_DEFAULT = 200;

export const RETENTION_DAYS_MIN = 7;
export const RETENTION_DAYS_MAX = 1095;
/** Default retention: about half a school year, long enough for marking, moderation and review. */
export const RETENTION_DAYS_DEFAULT = 180;

export const RECORDING_PURPOSES = ['slot', 'practice'] as const;
export type RecordingPurpose = (typeof RECORDING_PURPOSES)[number];

/** The text fields that may travel with the uploaded file (multipart form). */
export const recordingUploadFieldsSchema = z.strictObject({
  /** What the recording browser measured, when it knows; a WAV's is read from its header instead. */
  durationSeconds: z.coerce
    .number({ error: 'durationSeconds must be a number of seconds.' })
    .min(0, 'durationSeconds cannot be negative.')
    .max(6 * 3600, 'A recording is at most six hours long.')
    .optional(),
});
export type RecordingUploadFields = z.infer<typeof recordingUploadFieldsSchema>;

export const recordingSettingsSchema = z.strictObject({
  retentionDays: z
    .number({ error: 'retentionDays must be a whole number of days.' })
    .int('retentionDays must be a whole number of days.')
    .min(RETENTION_DAYS_MIN, `Keep recordings at least ${RETENTION_DAYS_MIN} days.`)
    .max(RETENTION_DAYS_MAX, `Keep recordings at most ${RETENTION_DAYS_MAX} days (three years).`),
});
export type RecordingSettingsInput = z.infer<typeof recordingSettingsSchema>;

export const recordedExamSchema = z.strictObject({
  recordedExam: z.boolean({ error: 'recordedExam must be true or false.' }),
});
export type RecordedExamInput = z.infer<typeof recordedExamSchema>;

export interface RecordingView {
  id: string;
  purpose: RecordingPurpose;
  slotId: string | null;
  studentId: string;
  contentType: string;
  kind: 'audio' | 'video';
  sizeBytes: number;
  durationSeconds: number | null;
  originalName: string;
  uploadedBy: string | null;
  createdAt: string;
  /** When the retention job deletes it (file and record). */
  expiresAt: string;
  /** Same-origin URL for a media element; expires at `playbackExpiresAt` (ask /playback again). */
  playbackUrl: string;
  playbackExpiresAt: string;
  /** The caller may delete it (its uploader, the student's teacher, an admin). */
  canDelete: boolean;
}

export interface SlotRecordingsView {
  slotId: string;
  /** The caller may add a recording to this slot now. */
  canUpload: boolean;
  /** Why not, in words, when canUpload is false and the caller could otherwise upload. */
  uploadBlockedReason: string | null;
  recordedExam: boolean;
  maxBytes: number;
  items: RecordingView[];
}

export interface PlaybackView {
  playbackUrl: string;
  playbackExpiresAt: string;
}

export interface RecordingSettingsView {
  retentionDays: number;
  maxBytes: number;
  /** Recordings stored now, and how many the next retention run will delete. */
  stored: number;
  dueForDeletion: number;
}
