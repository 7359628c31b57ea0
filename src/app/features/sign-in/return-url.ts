/**
 * The in-app path to go to after signing in. Only paths on this site are accepted ("/x", not
 * "//host" or "https://host"), so a crafted link cannot send a user elsewhere after sign-in.
 */
export function safeReturnUrl(candidate: string | null | undefined): string {
  if (!candidate || !candidate.startsWith('/') || candidate.startsWith('//')) return '/';
  if (candidate.startsWith('/\\') || candidate.startsWith('/sign-in')) return '/';
  return candidate;
}
