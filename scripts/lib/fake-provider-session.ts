// A signed-in rider's session on a running Crosswatt, for benchmarks: the OAuth
// round trip against the local stand-in provider (login=<handle> approves at once),
// as tests/server/support/sign-in.ts does with supertest, then a CSRF token.

export interface RiderSession {
  /** fetch with the session's cookies and CSRF token. */
  fetch(path: string, init?: RequestInit): Promise<Response>;
}

export async function signInAsRider(baseUrl: string, handle: string): Promise<RiderSession> {
  const cookies = new Map<string, string>();
  const remember = (response: Response) => {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair.indexOf('=');
      cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
  };
  const cookieHeader = () => [...cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  const step = async (url: string) => {
    const response = await fetch(url, { redirect: 'manual', headers: { cookie: cookieHeader() } });
    remember(response);
    return response;
  };
  const start = await step(`${baseUrl}/auth/github?login=${encodeURIComponent(handle)}`);
  const approval = await step(start.headers.get('location')!);
  const callback = new URL(approval.headers.get('location')!, baseUrl);
  const back = await step(`${baseUrl}${callback.pathname}${callback.search}`);
  if (back.status !== 302) throw new Error(`signing in as ${handle} failed: ${back.status}`);
  const tokenResponse = await step(`${baseUrl}/api/csrf-token`);
  const { token } = (await tokenResponse.json()) as { token: string };
  return {
    fetch: (path, init = {}) =>
      fetch(`${baseUrl}${path}`, {
        ...init,
        headers: { ...(init.headers as Record<string, string>), cookie: cookieHeader(), 'X-CSRF-Token': token },
      }),
  };
}
