// The soak's HTTP side: a signed-in person's session (a cookie jar and a CSRF
// token) used against any of the web processes, and a tally of every answer.

export interface Answer {
  status: number;
  /** The parsed JSON body, when there is one. */
  body: unknown;
}

export interface FailedRequest {
  at: number;
  web: string;
  what: string;
  status: number | 'no answer';
}

/** Every request the soak made: counts by status, and the 5xx and unanswered ones with their time. */
export class RequestTally {
  total = 0;
  readonly byStatus = new Map<number, number>();
  readonly serverErrors: FailedRequest[] = [];
  readonly unanswered: FailedRequest[] = [];

  record(web: string, what: string, status: number | 'no answer') {
    this.total++;
    if (status === 'no answer') {
      this.unanswered.push({ at: Date.now(), web, what, status });
      return;
    }
    this.byStatus.set(status, (this.byStatus.get(status) ?? 0) + 1);
    if (status >= 500) this.serverErrors.push({ at: Date.now(), web, what, status });
  }
}

/** The web processes in turn: each call to next() gives the other one. */
export class Alternator {
  private turn = 0;
  constructor(private readonly urls: string[]) {}
  next(): string {
    return this.urls[this.turn++ % this.urls.length]!;
  }
}

export class Session {
  private readonly cookies = new Map<string, string>();
  private csrfToken: string | undefined;

  constructor(
    readonly handle: string,
    private readonly tally: RequestTally,
  ) {}

  /** One request; no answer at all (a process killed, PostgreSQL refusing) is `status: 0`. */
  async send(web: string, method: string, path: string, body?: unknown): Promise<Answer> {
    const what = `${method} ${path.replace(/\d+/g, ':n')}`;
    const headers: Record<string, string> = { accept: 'application/json' };
    if (this.cookies.size > 0) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (method !== 'GET') headers['x-csrf-token'] = this.csrfToken ?? '';
    let payload: BodyInit | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    let response: Response;
    try {
      response = await fetch(`${web}${path}`, { method, headers, body: payload, redirect: 'manual', signal: AbortSignal.timeout(60_000) });
    } catch {
      this.tally.record(web, what, 'no answer');
      return { status: 0, body: undefined };
    }
    this.tally.record(web, what, response.status);
    for (const cookie of response.headers.getSetCookie()) {
      const [pair] = cookie.split(';');
      const eq = pair!.indexOf('=');
      this.cookies.set(pair!.slice(0, eq).trim(), pair!.slice(eq + 1).trim());
    }
    const text = await response.text().catch(() => '');
    let parsed: unknown;
    try {
      parsed = text ? JSON.parse(text) : undefined;
    } catch {
      parsed = undefined;
    }
    return { status: response.status, body: response.status >= 300 && response.status < 400 ? response.headers.get('location') : parsed };
  }

  /**
   * The whole OAuth round trip against the fake provider (its `login=` shortcut), then
   * a CSRF token for the new session. Tries the web processes in turn until one signs in.
   */
  async signIn(webs: Alternator, attempts = 20): Promise<void> {
    for (let i = 0; i < attempts; i++) {
      const web = webs.next();
      const start = await this.send(web, 'GET', `/auth/github?login=${encodeURIComponent(this.handle)}`);
      if (start.status !== 302) continue;
      const approval = await fetch(start.body as string, { redirect: 'manual' }).catch(() => undefined);
      const callback = approval?.headers.get('location');
      if (approval?.status !== 302 || !callback) continue;
      const url = new URL(callback);
      const back = await this.send(web, 'GET', `${url.pathname}${url.search}`);
      if (back.status === 302 && (await this.refreshCsrf(web))) return;
    }
    throw new Error(`${this.handle} could not sign in`);
  }

  async refreshCsrf(web: string): Promise<boolean> {
    const answer = await this.send(web, 'GET', '/api/csrf-token');
    if (answer.status !== 200) return false;
    this.csrfToken = (answer.body as { token: string }).token;
    return true;
  }
}
