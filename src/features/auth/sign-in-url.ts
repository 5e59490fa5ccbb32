/** Where the Sign in button goes: the server starts the OAuth round trip and brings the person back to `returnTo`. */
export function signInUrl(returnTo?: string): string {
  const safe = returnTo?.startsWith('/') && !returnTo.startsWith('//') && !returnTo.startsWith('/sign-in') ? returnTo : undefined;
  return safe ? `/auth/github?returnTo=${encodeURIComponent(safe)}` : '/auth/github';
}
