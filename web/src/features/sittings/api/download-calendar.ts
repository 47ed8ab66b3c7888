import {
  API_BASE,
  ApiError,
  refreshSession,
  SESSION_ENDED_NOTICE,
  SessionEndedError,
} from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

/**
 * GET /api/sittings/:id/calendar (text/calendar) handed to the browser as a download. The JSON
 * client cannot read an .ics body, so this fetches the bytes itself, with the same one silent
 * refresh on 401.
 */
export async function downloadCalendar(sittingId: string, fallbackName: string): Promise<void> {
  const get = (token: string | null) =>
    fetch(`${API_BASE}/sittings/${encodeURIComponent(sittingId)}/calendar`, {
      headers: token ? { Authorization: `Bearer ${token}` } : {},
      credentials: 'include',
    });
  const used = sessionStore.getAccessToken();
  let res = await get(used);
  if (res.status === 401 && used) {
    const fresh = (await refreshSession())?.accessToken;
    if (!fresh) {
      sessionStore.end(SESSION_ENDED_NOTICE);
      throw new SessionEndedError();
    }
    res = await get(fresh);
  }
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as {
      message?: string;
      error?: string;
    } | null;
    throw new ApiError({
      statusCode: res.status,
      error: body?.error ?? 'Error',
      message: body?.message ?? `The request failed (${res.status}).`,
    });
  }
  const name =
    /filename="([^"]+)"/.exec(res.headers.get('Content-Disposition') ?? '')?.[1] ?? fallbackName;
  const url = URL.createObjectURL(await res.blob());
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
