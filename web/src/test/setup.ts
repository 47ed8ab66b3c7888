import '@testing-library/jest-dom/vitest';
import { afterEach, beforeEach, vi } from 'vitest';
import { cleanup, configure } from '@testing-library/react';
import { sessionStore } from '@/lib/session-store';
import { resetApiClientForTests } from '@/lib/api-client';
import { resetBootstrapForTests } from '@/lib/auth';

// The first import of a lazy page (PrimeReact's DataTable) can take a few seconds on 2 cores.
configure({ asyncUtilTimeout: 5000 });

// Each test starts from a fresh page load: no session, no refresh in flight, real fetch restored.
beforeEach(() => {
  sessionStore.reset();
  resetApiClientForTests();
  resetBootstrapForTests();
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

// jsdom lacks matchMedia, which PrimeReact's responsive parts ask for.
if (!window.matchMedia) {
  window.matchMedia = (query: string) =>
    ({
      matches: false,
      media: query,
      onchange: null,
      addListener: () => undefined,
      removeListener: () => undefined,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      dispatchEvent: () => false,
    }) as MediaQueryList;
}
