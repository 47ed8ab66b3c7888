import { fileTypeFromBuffer } from 'file-type';

/** Enough leading bytes for file-type to recognise every audio and video container we accept. */
export const SNIFF_BYTES = 4100;

export interface DetectedType {
  mime: string;
  ext: string;
}

/** Audio and video a browser's media element can play (the desk plays them back). */
export const PLAYABLE_MEDIA: Record<string, string> = {
  'audio/wav': 'wav',
  'audio/mpeg': 'mp3',
  'audio/ogg': 'ogg',
  'audio/opus': 'opus',
  'audio/flac': 'flac',
  'audio/x-flac': 'flac',
  'audio/aac': 'aac',
  'audio/x-m4a': 'm4a',
  'audio/mp4': 'm4a',
  'audio/webm': 'webm',
  'video/webm': 'webm',
  'video/mp4': 'mp4',
  'video/quicktime': 'mov',
  'video/ogg': 'ogv',
};

/**
 * The type from the bytes themselves (magic numbers), never from the name or the client's header.
 * file-type's buffer detection runs on Node 20 (its stream helpers need Node 22's web streams, so
 * we hand it the first bytes only).
 */
export async function detectType(head: Buffer): Promise<DetectedType | null> {
  const t = await fileTypeFromBuffer(head);
  if (!t) return null;
  // file-type says video/webm for every WebM and Matroska file, audio-only ones included.
  return { mime: t.mime, ext: t.ext };
}

/**
 * Duration of a PCM WAV from its header (data size / byte rate), when the header is in `head`.
 * Cheap and exact for WAV; other containers leave it to the browser that recorded them.
 */
export function wavDurationSeconds(head: Buffer, fileSize: number): number | null {
  if (head.length < 12 || head.toString('latin1', 0, 4) !== 'RIFF' || head.toString('latin1', 8, 12) !== 'WAVE') return null;
  let byteRate: number | null = null;
  let off = 12;
  while (off + 8 <= head.length) {
    const id = head.toString('latin1', off, off + 4);
    const size = head.readUInt32LE(off + 4);
    if (id === 'fmt ' && off + 16 <= head.length) byteRate = head.readUInt32LE(off + 16);
    if (id === 'data') {
      if (!byteRate) return null;
      // A streaming writer may leave the size at 0 or 0xFFFFFFFF: use what is really there.
      const dataBytes = size === 0 || size === 0xffffffff || off + 8 + size > fileSize ? fileSize - off - 8 : size;
      return Math.round((dataBytes / byteRate) * 1000) / 1000;
    }
    off += 8 + size + (size % 2);
  }
  return null;
}
