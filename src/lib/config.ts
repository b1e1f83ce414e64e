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
  /** The owner role's connection, for migrations only; null runs them as the app's role (see DEVELOPERS.md). */
  databaseOwnerUrl: string | null;
  sessionSecret: string;
  s3: { endpoint: string; bucket: string; region: string; accessKeyId: string; secretAccessKey: string };
  smtpUrl: string;
  mailFrom: string;
  mailboxDir: string | null;
  dataDir: string;
  trustProxy: boolean;
  sessionIdleHours: number;
  sessionAbsoluteDays: number;
  /** PostgreSQL schema of the job queue; a separate one isolates a second set of workers. */
  queueSchema: string;
  /** How often the queue looks for jobs whose worker died, in seconds. */
  queueMaintenanceS: number;
  /** Seconds between the last parsed file of a batch and the flag evaluation. */
  flagDelayS: number;
  /** Parse processes each worker runs side by side. */
  parseProcesses: number;
  /** Bytes of ride files one clinic may store. */
  clinicStorageQuotaBytes: number;
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
    databaseOwnerUrl: process.env.DATABASE_OWNER_URL || null,
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
    queueSchema: process.env.KINLOOP_QUEUE_SCHEMA || 'pgboss',
    queueMaintenanceS: int('KINLOOP_QUEUE_MAINTENANCE_S', 30),
    flagDelayS: int('KINLOOP_FLAG_DELAY_S', 10),
    parseProcesses: Math.max(1, Math.floor(int('KINLOOP_PARSE_PROCESSES', 1))),
    clinicStorageQuotaBytes: int('KINLOOP_CLINIC_STORAGE_GB', 100) * 1024 ** 3,
    dbPool: int('KINLOOP_DB_POOL', 10),
    outboxRetryMs: int('KINLOOP_OUTBOX_RETRY_MS', 15_000),
  };
  return cached;
}
