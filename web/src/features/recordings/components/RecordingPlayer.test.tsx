import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { RecordingView } from '@stavemark/shared';
import { json, mockApi } from '@/test/fetch-mock';
import { RecordingPlayer } from './RecordingPlayer';

const recording: RecordingView = {
  id: 'r1',
  purpose: 'slot',
  slotId: 's1',
  studentId: 'st1',
  contentType: 'audio/wav',
  kind: 'audio',
  sizeBytes: 32044,
  durationSeconds: 60,
  originalName: 'take.wav',
  uploadedBy: 'Idris Calloway',
  createdAt: '2026-12-01T10:00:00.000Z',
  expiresAt: '2027-05-30T10:00:00.000Z',
  playbackUrl: '/api/media/first.sig',
  playbackExpiresAt: '2026-12-01T10:05:00.000Z',
  canDelete: false,
};

function renderPlayer() {
  return render(
    <QueryClientProvider client={new QueryClient()}>
      <RecordingPlayer recording={recording} label="recording 1" />
    </QueryClientProvider>,
  );
}

describe('the recording player', () => {
  const seen: string[] = [];
  const onKey = (e: KeyboardEvent) => seen.push(e.key);
  beforeEach(() => {
    seen.length = 0;
    window.addEventListener('keydown', onKey);
    // jsdom does not play media: play/pause only flip the paused state and fire the events.
    vi.spyOn(HTMLMediaElement.prototype, 'play').mockImplementation(function (this: HTMLMediaElement) {
      Object.defineProperty(this, 'paused', { configurable: true, value: false });
      this.dispatchEvent(new Event('play'));
      return Promise.resolve();
    });
    vi.spyOn(HTMLMediaElement.prototype, 'pause').mockImplementation(function (this: HTMLMediaElement) {
      Object.defineProperty(this, 'paused', { configurable: true, value: true });
      this.dispatchEvent(new Event('pause'));
    });
  });
  afterEach(() => {
    window.removeEventListener('keydown', onKey);
    vi.restoreAllMocks();
  });

  it('seeks with the arrow keys on its bar and keeps those keys to itself', () => {
    const { container } = renderPlayer();
    const audio = container.querySelector('audio')!;
    const bar = screen.getByRole('slider', { name: 'Position' });
    fireEvent.keyDown(bar, { key: 'ArrowRight' });
    fireEvent.keyDown(bar, { key: 'ArrowRight' });
    expect(audio.currentTime).toBe(10);
    expect(bar).toHaveAttribute('aria-valuetext', '0:10 of 1:00');
    fireEvent.keyDown(bar, { key: 'ArrowLeft' });
    expect(audio.currentTime).toBe(5);
    fireEvent.keyDown(bar, { key: 'End' });
    expect(audio.currentTime).toBe(60);
    expect(seen).toEqual([]);
  });

  it('lets digits and flag letters through to the desk, from the bar and from its buttons', () => {
    renderPlayer();
    const bar = screen.getByRole('slider', { name: 'Position' });
    const play = screen.getByRole('button', { name: 'Play recording 1' });
    for (const key of ['4', 'f', 'r']) fireEvent.keyDown(bar, { key });
    for (const key of ['7', 's', 'p']) fireEvent.keyDown(play, { key });
    expect(seen).toEqual(['4', 'f', 'r', '7', 's', 'p']);
  });

  it('plays and pauses from its button, and the buttons step 5 s', () => {
    const { container } = renderPlayer();
    const audio = container.querySelector('audio')!;
    fireEvent.click(screen.getByRole('button', { name: 'Play recording 1' }));
    expect(screen.getByRole('button', { name: 'Pause recording 1' })).toBeInTheDocument();
    fireEvent.click(screen.getByRole('button', { name: 'Forward 5 seconds' }));
    fireEvent.click(screen.getByRole('button', { name: 'Forward 5 seconds' }));
    fireEvent.click(screen.getByRole('button', { name: 'Back 5 seconds' }));
    expect(audio.currentTime).toBe(5);
    fireEvent.click(screen.getByRole('button', { name: 'Pause recording 1' }));
    expect(screen.getByRole('button', { name: 'Play recording 1' })).toBeInTheDocument();
  });

  it('asks for a fresh link when the old one fails (expired), and says so if the new one fails too', async () => {
    const api = mockApi({
      'GET /api/recordings/r1/playback': () => json(200, { playbackUrl: '/api/media/second.sig', playbackExpiresAt: '2026-12-01T10:10:00.000Z' }),
    });
    const { container } = renderPlayer();
    const audio = container.querySelector('audio')!;
    expect(audio.getAttribute('src')).toBe('/api/media/first.sig');
    fireEvent.error(audio);
    await waitFor(() => expect(audio.getAttribute('src')).toBe('/api/media/second.sig'));
    expect(api.calls('GET /api/recordings/r1/playback')).toHaveLength(1);
    fireEvent.error(audio);
    expect(await screen.findByRole('alert')).toHaveTextContent(/cannot be played here/);
  });
});
