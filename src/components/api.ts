// Browser-side calls to Kinloop's JSON API: the same endpoints the tests use.
import { useCallback, useEffect, useState } from 'react';

export interface ApiErrorBody {
  code: string;
  message: string;
  line?: number;
  fields?: { path: string; message: string }[];
  [key: string]: unknown;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
  /** The message for one form field, when the server named it. */
  field(path: string): string | undefined {
    return this.body.fields?.find((f) => f.path === path)?.message;
  }
}

export async function api<T>(method: string, url: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      credentials: 'same-origin',
      headers: body === undefined ? {} : { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, { code: 'network', message: 'Kinloop could not be reached. Check your connection and try again.' });
  }
  const data = res.status === 204 ? null : await res.json().catch(() => null);
  if (res.status === 401 && !url.startsWith('/api/auth/') && !url.startsWith('/api/invitations/accept')) {
    window.location.assign(`/sign-in?next=${encodeURIComponent(window.location.pathname)}`);
  }
  if (!res.ok) {
    throw new ApiError(res.status, data?.error ?? { code: 'http_' + res.status, message: `The server answered ${res.status}. Try again in a moment.` });
  }
  return data as T;
}

export type Loadable<T> =
  | { state: 'loading' }
  | { state: 'error'; error: ApiError }
  | { state: 'ready'; data: T };

// A GET that several islands of one page ask for at the same moment (the
// client page's overview and charts both show adherence, and both reload it
// after a change) goes to the server once. Only a request started in the last
// 100 ms is shared: one sent before a change must not answer after it.
const SHARE_MS = 100;
const inFlight = new Map<string, { at: number; answer: Promise<unknown> }>();

function sharedGet<T>(url: string): Promise<T> {
  const now = Date.now();
  const running = inFlight.get(url);
  if (running && now - running.at <= SHARE_MS) return running.answer as Promise<T>;
  const answer = api<T>('GET', url).finally(() => {
    if (inFlight.get(url)?.answer === answer) inFlight.delete(url);
  });
  inFlight.set(url, { at: now, answer });
  return answer;
}

/** Loads `url` and reloads on demand; the view shows loading, error and ready states. */
export function useApi<T>(url: string | null): [Loadable<T>, () => void] {
  const [value, setValue] = useState<Loadable<T>>({ state: 'loading' });
  const [tick, setTick] = useState(0);
  useEffect(() => {
    if (!url) return;
    let live = true;
    setValue((v) => (v.state === 'ready' ? v : { state: 'loading' }));
    sharedGet<T>(url).then(
      (data) => live && setValue({ state: 'ready', data }),
      (error: ApiError) => live && setValue({ state: 'error', error }),
    );
    return () => {
      live = false;
    };
  }, [url, tick]);
  const reload = useCallback(() => setTick((t) => t + 1), []);
  return [value, reload];
}
