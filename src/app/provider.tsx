import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState, type CSSProperties, type ReactNode } from 'react';
import { Toaster } from 'sonner';
import { createQueryClient } from '../lib/query-client';

export function AppProvider({ children, client }: { children: ReactNode; client?: QueryClient }) {
  const [qc] = useState(() => client ?? createQueryClient());
  return (
    <QueryClientProvider client={qc}>
      {children}
      {/* Toasts sit in the navigation column (bottom left, narrower than its 14rem), never over a
          page's drawing or side panel. */}
      <Toaster position="bottom-left" offset={12} style={{ '--width': '12.5rem' } as CSSProperties} richColors closeButton />
    </QueryClientProvider>
  );
}
