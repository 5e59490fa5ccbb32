// The one way the client talks to the server: JSON in and out, cookies sent,
// the CSRF token attached to every state-changing request, and server errors
// turned into ApiError with the server's own message. No global side effects.
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: { fields?: Record<string, string>; [key: string]: unknown },
  ) {
    super(message);
  }
}

let csrfToken: string | undefined;

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  const res = await fetch('/api/csrf-token', { credentials: 'same-origin' });
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return csrfToken;
}

export function forgetCsrfToken() {
  csrfToken = undefined;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

async function request<T>(method: Method, url: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  let payload: BodyInit | undefined;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  if (method !== 'GET') headers['X-CSRF-Token'] = await getCsrfToken();
  const res = await fetch(url, { method, headers, body: payload, credentials: 'same-origin' });
  if (res.status === 204) return undefined as T;
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    const error = data?.error ?? {};
    // A new session (after sign-in or sign-out) invalidates the token: fetch a fresh one once.
    if (res.status === 403 && error.code === 'csrf_invalid' && !retried) {
      forgetCsrfToken();
      return request<T>(method, url, body, true);
    }
    throw new ApiError(res.status, error.code ?? 'http_error', error.message ?? `Request failed (${res.status})`, error.details);
  }
  return data as T;
}

export const api = {
  get: <T>(url: string) => request<T>('GET', url),
  post: <T>(url: string, body?: unknown) => request<T>('POST', url, body),
  put: <T>(url: string, body?: unknown) => request<T>('PUT', url, body),
  patch: <T>(url: string, body?: unknown) => request<T>('PATCH', url, body),
  delete: <T>(url: string) => request<T>('DELETE', url),
};
