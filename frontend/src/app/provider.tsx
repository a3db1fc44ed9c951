import CssBaseline from '@mui/material/CssBaseline';
import { ThemeProvider } from '@mui/material/styles';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { ErrorBoundary } from '@/components/errors/error-boundary';
import { Notifications } from '@/components/notifications';
import { createQueryClient } from '@/lib/react-query';
import { theme } from '@/lib/theme';

type AppProviderProps = { children: ReactNode; queryClient?: QueryClient };

export function AppProvider({ children, queryClient }: AppProviderProps) {
  const [client] = useState(() => queryClient ?? createQueryClient());
  return (
    <ThemeProvider theme={theme}>
      <CssBaseline />
      <ErrorBoundary>
        <QueryClientProvider client={client}>
          {children}
          <Notifications />
        </QueryClientProvider>
      </ErrorBoundary>
    </ThemeProvider>
  );
}
