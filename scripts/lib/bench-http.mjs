// A signed-in HTTP session for the benchmarks: keeps the session cookie and
// sends Origin on the sign-in POST as a browser would. Each GET asks for
// compressed answers as a browser does and is timed from sending the request
// to the last byte of the body on the wire (what travelled: `wireBytes`).
import http from 'node:http';
import zlib from 'node:zlib';

const agent = new http.Agent({ keepAlive: true });

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

  /** GET `path`; resolves with its status, body size (as sent and decompressed) and time, or `timedOut`. */
  time(path, timeoutMs) {
    const started = performance.now();
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        req.destroy();
        resolve({ ms: timeoutMs, status: 0, bytes: 0, wireBytes: 0, timedOut: true });
      }, timeoutMs);
      const req = http.get(this.origin + path, { agent, headers: { cookie: this.cookie ?? '', 'accept-encoding': 'br, gzip' } }, (res) => {
        const chunks = [];
        res.on('data', (c) => chunks.push(c));
        res.on('error', reject);
        res.on('end', () => {
          clearTimeout(timer);
          const ms = performance.now() - started;
          const wire = Buffer.concat(chunks);
          const encoding = res.headers['content-encoding'];
          const body = encoding === 'br' ? zlib.brotliDecompressSync(wire) : encoding === 'gzip' ? zlib.gunzipSync(wire) : wire;
          resolve({ ms, status: res.statusCode, bytes: body.length, wireBytes: wire.length, body });
        });
      });
      req.on('error', (err) => {
        clearTimeout(timer);
        if (req.destroyed && err.code === 'ECONNRESET') return;
        reject(err);
      });
    });
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
