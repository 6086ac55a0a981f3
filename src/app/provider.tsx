import type { ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { queryClient } from '@/lib/query-client';
import { setUnauthenticatedHandler } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/get-me';

// A 401 anywhere means the session ended: forget who we were, and the guard sends us to sign-in.
setUnauthenticatedHandler(() => queryClient.setQueryData(meQueryOptions().queryKey, null));

export function AppProvider({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
