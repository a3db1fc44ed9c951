import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useSyncExternalStore, type ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { Role, SessionUser } from '@kilocycle/common/types';
import { Forbidden } from '@/components/errors/forbidden';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { signInPath } from '@/config/paths';
import { api, ApiError } from './api-client';
import { clearSession, getSession, setSession, subscribeSession } from './session';

export function useSession() {
  const session = useSyncExternalStore(subscribeSession, getSession, getSession);
  return {
    session,
    user: session?.user ?? null,
    isSignedIn: session !== null,
  };
}

/** The signed-in user; only for components rendered inside `RequireAuth`. */
export function useCurrentUser(): SessionUser {
  const { user } = useSession();
  if (!user) throw new Error('useCurrentUser is used outside RequireAuth');
  return user;
}

export function getMe(): Promise<SessionUser> {
  return api.get<SessionUser>('/auth/me', { notify: false });
}

// Keyed by token so a new sign-in never reuses the previous account's answer.
export const getMeQueryOptions = (accessToken: string | undefined) =>
  queryOptions({
    queryKey: ['auth', 'me', accessToken ?? ''],
    queryFn: getMe,
    enabled: Boolean(accessToken),
    staleTime: 5 * 60_000,
  });

export function logout(): Promise<void> {
  return api.post<void>('/auth/logout', undefined, { notify: false, handleUnauthorized: false });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => {
      try {
        await logout();
      } catch {
        // The session is cleared here whatever the server says: a stale token must not keep anyone signed in.
      }
    },
    onSettled: () => {
      clearSession();
      queryClient.clear();
    },
  });
}

type GuardProps = { children: ReactNode };

/** Renders its children only for a signed-in user whose stored token the server still accepts. */
export function RequireAuth({ children }: GuardProps) {
  const { session } = useSession();
  const location = useLocation();
  const me = useQuery(getMeQueryOptions(session?.accessToken));

  // A name or role changed by an administrator since sign-in takes effect on the next check.
  useEffect(() => {
    if (session && me.data && !sameUser(session.user, me.data)) setSession({ ...session, user: me.data });
  }, [session, me.data]);

  if (!session) {
    return <Navigate to={signInPath(`${location.pathname}${location.search}`)} replace />;
  }
  if (me.isPending) return <FullPageSpinner label="Checking your session" />;
  if (me.isError) {
    if (me.error instanceof ApiError && me.error.status === 401) {
      return <Navigate to={signInPath(`${location.pathname}${location.search}`)} replace />;
    }
    throw me.error;
  }
  return <>{children}</>;
}

function sameUser(a: SessionUser, b: SessionUser) {
  return a.id === b.id && a.email === b.email && a.name === b.name && a.role === b.role && a.organizationId === b.organizationId;
}

type RequireRoleProps = GuardProps & { roles: readonly Role[] };

export function RequireRole({ roles, children }: RequireRoleProps) {
  const user = useCurrentUser();
  if (!roles.includes(user.role)) return <Forbidden />;
  return <>{children}</>;
}
