// The one place server code reads its configuration. Plain `process.env`, not
// `astro:env`, because the same modules run in the Astro server, the worker,
// migrations, scripts and tests. scripts/lib/config.mjs sets these for `npm start`.

function required(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set; start Kinloop with \`npm start\` or set it in the environment`);
  return value;
}

function int(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isFinite(n)) throw new Error(`${name} must be a number, got ${raw}`);
  return n;
}

export interface AppConfig {
  port: number;
  publicUrl: string;
  /** Origins whose state-changing requests are accepted. */
  allowedOrigins: string[];
  secureCookies: boolean;
  databaseUrl: string;
  sessionSecret: string;
  s3: { endpoint: string; bucket: string; region: string; accessKeyId: string; secretAccessKey: string };
  smtpUrl: string;
  mailFrom: string;
  mailboxDir: string | null;
  dataDir: string;
  trustProxy: boolean;
  sessionIdleHours: number;
  sessionAbsoluteDays: number;
  runWorkerInServer: boolean;
  /** Connections in the database pool. */
  dbPool: number;
  /** The outbox's first retry delay; later ones double. */
  outboxRetryMs: number;
}

let cached: AppConfig | null = null;

export function config(): AppConfig {
  if (cached) return cached;
  const port = int('PORT', 4321);
  const publicUrl = (process.env.PUBLIC_URL ?? `http://localhost:${port}`).replace(/\/+$/, '');
  cached = {
    port,
    publicUrl,
    allowedOrigins: [...new Set([new URL(publicUrl).origin, `http://127.0.0.1:${port}`, `http://localhost:${port}`])],
    secureCookies: publicUrl.startsWith('https:'),
    databaseUrl: required('DATABASE_URL'),
    sessionSecret: required('SESSION_SECRET'),
    s3: {
      endpoint: required('S3_ENDPOINT'),
      bucket: process.env.S3_BUCKET ?? 'kinloop-rides',
      region: process.env.S3_REGION ?? 'us-east-1',
      // s3rver accepts these fixed credentials; real storage sets its own.
      accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
      secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
    },
    smtpUrl: required('SMTP_URL'),
    mailFrom: process.env.MAIL_FROM ?? 'Kinloop <no-reply@kinloop.test>',
    mailboxDir: process.env.KINLOOP_MAILBOX_DIR || null,
    dataDir: process.env.KINLOOP_DATA_DIR ?? '.data',
    trustProxy: process.env.KINLOOP_TRUST_PROXY === '1',
    sessionIdleHours: int('KINLOOP_SESSION_IDLE_HOURS', 24 * 7),
    sessionAbsoluteDays: int('KINLOOP_SESSION_ABSOLUTE_DAYS', 30),
    runWorkerInServer: process.env.KINLOOP_WORKER !== 'off',
    dbPool: int('KINLOOP_DB_POOL', 10),
    outboxRetryMs: int('KINLOOP_OUTBOX_RETRY_MS', 15_000),
  };
  return cached;
}
