import type { PlaybackView } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

/** A fresh signed URL: the player asks when the one it holds has expired. */
export function getPlayback(recordingId: string): Promise<PlaybackView> {
  return apiRequest<PlaybackView>(`/recordings/${encodeURIComponent(recordingId)}/playback`);
}
