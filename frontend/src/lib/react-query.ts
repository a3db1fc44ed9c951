import { QueryClient, type DefaultOptions } from '@tanstack/react-query';

export const queryConfig = {
  queries: {
    retry: false,
    refetchOnWindowFocus: false,
    staleTime: 60_000,
  },
} satisfies DefaultOptions;

export function createQueryClient() {
  return new QueryClient({ defaultOptions: queryConfig });
}
