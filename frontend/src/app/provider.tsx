import { useState } from 'react';
import type { ReactNode } from 'react';
import { PrimeReactProvider } from 'primereact/api';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { NotifyProvider } from '@/components/notify';
import { AuthProvider } from '@/features/auth/auth-provider';
import { isApiError } from '@/lib/api-client';

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // A 4xx answer will not change by asking again; a dropped connection might.
        retry: (failureCount, error) =>
          failureCount < 2 && !(isApiError(error) && error.status >= 400 && error.status < 500),
      },
      mutations: { retry: false },
    },
  });
}

/** Everything the screens need around them: PrimeReact's settings, the query cache, the session, toasts. */
export function AppProvider({ children, queryClient }: { children: ReactNode; queryClient?: QueryClient }) {
  const [client] = useState(() => queryClient ?? createQueryClient());
  return (
    <PrimeReactProvider value={{ ripple: false, cssTransition: true }}>
      <QueryClientProvider client={client}>
        <AuthProvider>
          <NotifyProvider>{children}</NotifyProvider>
        </AuthProvider>
      </QueryClientProvider>
    </PrimeReactProvider>
  );
}
