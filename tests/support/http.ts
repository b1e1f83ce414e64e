import { randomBytes } from 'node:crypto';
import { baseUrl } from './browser';

/**
 * A small HTTP client for the running app that keeps its session cookie and,
 * like a browser, sends Origin on state-changing requests. Each client claims
 * its own forwarded address (the test server trusts X-Forwarded-For), so the
 * per-address sign-in limit of one test never blocks another.
 */
export class Http {
  /** The session cookie (`kinloop_session=…`), or null. */
  cookie: string | null = null;
  /** The trusted-device cookie (`kinloop_device=…`) a sign-in left, kept like a browser keeps it. */
  device: string | null = null;
  // An address of the IPv6 documentation range with 64 random bits: never shared by two clients.
  // Tests that need two clients on one address (a shared connection) copy it.
  address = `203.0.113.7, 2001:db8:${randomBytes(8).toString('hex').match(/.{4}/g)!.join(':')}`;

  constructor(readonly origin = baseUrl()) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const h: Record<string, string> = { 'x-forwarded-for': this.address, ...headers };
    const jar = [this.cookie, this.device].filter(Boolean).join('; ');
    if (jar) h.cookie = jar;
    if (method !== 'GET' && method !== 'HEAD' && !('origin' in h)) h.origin = this.origin;
    let payload: BodyInit | undefined;
    if (body instanceof FormData || typeof body === 'string' || body instanceof Uint8Array) {
      payload = body as BodyInit;
    } else if (body !== undefined) {
      h['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(this.origin + path, { method, headers: h, body: payload, redirect: 'manual' });
    const kept = (name: string, current: string | null) => {
      const set = res.headers.getSetCookie().find((c) => c.startsWith(`${name}=`));
      if (!set) return current;
      const value = set.split(';')[0];
      return value === `${name}=` || /expires=Thu, 01 Jan 1970/i.test(set) ? null : value;
    };
    this.cookie = kept('kinloop_session', this.cookie);
    this.device = kept('kinloop_device', this.device);
    return res;
  }

  get = (path: string) => this.request('GET', path);
  post = (path: string, body?: unknown) => this.request('POST', path, body ?? {});
  put = (path: string, body?: unknown) => this.request('PUT', path, body ?? {});
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body ?? {});

  async json<T = any>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
    const res = await this.request(method, path, body);
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  }

  async signIn(email: string, password: string): Promise<this> {
    const res = await this.request('POST', '/api/auth/sign-in', { email, password });
    if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
    return this;
  }
}
