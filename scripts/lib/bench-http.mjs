// A signed-in HTTP session for the benchmarks: keeps the session cookie and
// sends Origin on the sign-in POST as a browser would. Each GET is timed from
// sending the request to the last byte of the body.

export class BenchSession {
  constructor(port) {
    this.origin = `http://127.0.0.1:${port}`;
    this.cookie = null;
  }

  async signIn(email, password) {
    const res = await fetch(`${this.origin}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: this.origin },
      body: JSON.stringify({ email, password }),
    });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('kinloop_session='));
    if (res.status !== 200 || !set) throw new Error(`sign-in of ${email} on ${this.origin} failed: ${res.status} ${await res.text()}`);
    this.cookie = set.split(';')[0];
    return this;
  }

  /** GET `path`; resolves with its status, body size and time, or `timedOut`. */
  async time(path, timeoutMs) {
    const started = performance.now();
    try {
      const res = await fetch(this.origin + path, { headers: { cookie: this.cookie ?? '' }, redirect: 'manual', signal: AbortSignal.timeout(timeoutMs) });
      const body = Buffer.from(await res.arrayBuffer());
      return { ms: performance.now() - started, status: res.status, bytes: body.length, body };
    } catch (err) {
      if (err.name === 'TimeoutError' || err.name === 'AbortError') return { ms: timeoutMs, status: 0, bytes: 0, timedOut: true };
      throw err;
    }
  }

  async json(path) {
    const r = await this.time(path, 120_000);
    if (r.status !== 200) throw new Error(`GET ${path} answered ${r.status || 'nothing (timed out)'}`);
    return JSON.parse(r.body.toString('utf8'));
  }

  async html(path) {
    const r = await this.time(path, 120_000);
    if (r.status !== 200) throw new Error(`GET ${path} answered ${r.status || 'nothing (timed out)'}`);
    return r.body.toString('utf8');
  }
}
