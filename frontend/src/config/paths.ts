export const paths = {
  home: '/',
  signIn: '/sign-in',
  adminUsers: '/admin/users',
  adminOrganisations: '/admin/organisations',
} as const;

export function signInPath(next?: string) {
  return next && next !== paths.home ? `${paths.signIn}?next=${encodeURIComponent(next)}` : paths.signIn;
}

/** Only same-site paths are followed after sign-in, so `next` cannot send anyone elsewhere. */
export function safeNextPath(next: string | null | undefined) {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.home;
  if (next === paths.signIn || next.startsWith(`${paths.signIn}?`)) return paths.home;
  return next;
}
