import { useEffect, useRef, useState, type ReactNode } from 'react';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { PrimeReactProvider } from 'primereact/api';
import { Toast } from 'primereact/toast';
import { createQueryClient } from '@/lib/query-client';
import { setNoticeListener } from '@/lib/notify';
import { sessionStore } from '@/lib/session-store';

export function AppProvider({
  children,
  queryClient,
}: {
  children: ReactNode;
  queryClient?: QueryClient;
}) {
  const [client] = useState(() => queryClient ?? createQueryClient());
  const toast = useRef<Toast>(null);

  useEffect(() => {
    setNoticeListener((notice) =>
      toast.current?.show({ ...notice, life: notice.severity === 'error' ? 8000 : 4000 }),
    );
    // Cached answers belong to the person who signed out; never show them to the next one.
    const off = sessionStore.onEnd(() => client.clear());
    return () => {
      setNoticeListener(null);
      off();
    };
  }, [client]);

  return (
    <PrimeReactProvider value={{ ripple: false }}>
      <QueryClientProvider client={client}>
        {/* Bottom right: at the top it covered the page header's buttons. */}
        <Toast ref={toast} position="bottom-right" />
        {children}
      </QueryClientProvider>
    </PrimeReactProvider>
  );
}
