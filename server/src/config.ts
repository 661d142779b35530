import path from 'node:path';
import { keysFromEnv, type TokenKeys } from './auth/token-keys.js';
import { DEFAULT_SIGN_IN_LIMITS, type SignInLimits } from './auth/sign-in-guards.js';
import type { BackupSchedule } from './db/backup-schedule.js';
import { DEFAULT_REFERENCE_QUOTA, type ReferenceQuota } from './references/reference-quota.js';

/** How the server seeds data at start. */
export type ServerMode = 'demo' | 'production' | 'test';

/** scrypt cost parameters (RFC 7914 names). */
export interface ScryptParams {
  N: number;
  r: number;
  p: number;
}

/** Everything the server reads from its environment. */
export interface ServerConfig {
  port: number;
  databasePath: string;
  mode: ServerMode;
  /** Directory of the built client; served with an SPA fallback when it exists. */
  staticDir: string | null;
  /** Token lifetime in seconds (at most 30 minutes); also the most a token's exp - iat may be. */
  tokenTtlSeconds: number;
  /** The key file the signing keys live in when the environment gives none (mode 600). */
  keyFile: string;
  /** Signing keys given directly (from `TRACELOOM_TOKEN_SECRET`, or by tests); else the key file. */
  tokenKeys?: TokenKeys;
  /** Password hashing cost. Production uses N = 2^17, r = 8, p = 1; tests may lower it. */
  scrypt: ScryptParams;
  /** Sign-in buckets, account backoff and the password-hash cap. */
  signIn: SignInLimits;
  /** Express `trust proxy` (`TRACELOOM_TRUST_PROXY`): false, a hop count, or addresses/names. */
  trustProxy: boolean | number | string;
  /** Largest JSON body accepted, in bytes. */
  bodyLimitBytes: number;
  /** Background runs: worker pool size, limits per run, per-user cap. */
  runs: RunLimits;
  /** Largest reference-table upload accepted, in bytes. */
  uploadLimitBytes: number;
  /** Reference-table quotas per study and per person; `DEFAULT_REFERENCE_QUOTA` when absent. */
  referenceQuota?: ReferenceQuota;
  /** Scheduled backups (`TRACELOOM_BACKUP_DIR`), or null when off. */
  backups: BackupSchedule | null;
  /** Mail: sender, link base, relay. */
  mail: MailSettings;
  /** Previews (`POST /api/compute`) one person may ask for per window. */
  previewLimit?: { limit: number; windowMs: number };
}

/** Where mail goes and how it names the server (`TRACELOOM_MAIL_FROM`, `_PUBLIC_URL`, `_SMTP_URL`). */
export interface MailSettings {
  /** The sender (default `Traceloom <traceloom@localhost>`). */
  from: string;
  /** The address links in mails point to; null: this server on localhost. */
  publicUrl: string | null;
  /** A real SMTP relay (nodemailer URL form); null: the local fake in demo and test mode. */
  smtpUrl: string | null;
}

/** How background runs are executed and bounded. */
export interface RunLimits {
  /** Worker threads computing runs at once. */
  threads: number;
  /** Wall-clock limit of one run; the worker is terminated beyond it. */
  wallClockMs: number;
  /** Queued + running runs one person may have at once. */
  perUserCap: number;
  /** V8 old-generation heap limit of a run's worker, in MB. */
  maxOldGenerationSizeMb: number;
  /** Wall-clock limit of the synchronous preview (`POST /api/compute`), kept under 2 s. */
  previewMs: number;
  /** Progress streams (`GET /api/runs/:id/events`) one person may hold open at once. */
  streamsPerUser?: number;
  /** Progress streams open at once on the whole server. */
  streamsTotal?: number;
  /** Queue mode (`TRACELOOM_QUEUE_URL`): runs go to worker processes through Redis. */
  queueUrl?: string;
  /** Runs handed to the queue at once in queue mode (`TRACELOOM_QUEUE_SLOTS`, default 16). */
  queueSlots?: number;
}

/** The password hashing cost used outside tests (OWASP Password Storage Cheat Sheet minimum). */
export const PRODUCTION_SCRYPT: ScryptParams = { N: 2 ** 17, r: 8, p: 1 };

/** Defaults shared by `loadConfig` and the tests. */
export const DEFAULT_CONFIG: ServerConfig = {
  port: 4300,
  databasePath: path.join('data', 'traceloom.sqlite'),
  mode: 'production',
  staticDir: path.join('dist', 'client', 'browser'),
  tokenTtlSeconds: 30 * 60,
  keyFile: path.join('data', 'traceloom.key'),
  scrypt: PRODUCTION_SCRYPT,
  signIn: DEFAULT_SIGN_IN_LIMITS,
  trustProxy: false,
  bodyLimitBytes: 1024 * 1024,
  runs: {
    threads: 2,
    wallClockMs: 10 * 60 * 1000,
    perUserCap: 2,
    maxOldGenerationSizeMb: 1024,
    previewMs: 1500,
    streamsPerUser: 8,
    streamsTotal: 200,
  },
  uploadLimitBytes: 10 * 1024 * 1024,
  backups: null,
  mail: { from: 'Traceloom <traceloom@localhost>', publicUrl: null, smtpUrl: null },
};

/**
 * `TRACELOOM_TRUST_PROXY`: unset or `false` trusts no proxy (the client address is the peer's);
 * a number trusts that many hops; anything else is Express's list of trusted addresses or
 * names (`loopback`, `10.0.0.0/8, 127.0.0.1`). `true` (trust every hop) is refused: any client
 * could then choose its own address and escape the per-address limits.
 */
export function trustProxyOf(raw: string | undefined): boolean | number | string {
  if (raw === undefined || raw === '' || raw === 'false') return false;
  if (raw === 'true') {
    throw new Error(
      'TRACELOOM_TRUST_PROXY=true would trust any client; give the hop count or the proxy addresses',
    );
  }
  if (/^\d+$/.test(raw)) return Number(raw);
  return raw;
}

/** `TRACELOOM_QUEUE_URL`: a redis:// (or rediss://) address, or undefined when unset. */
export function queueUrlOf(env: NodeJS.ProcessEnv): string | undefined {
  const raw = env.TRACELOOM_QUEUE_URL;
  if (raw === undefined || raw === '') return undefined;
  if (!/^rediss?:\/\/[^\s/]+/.test(raw)) {
    throw new Error(`TRACELOOM_QUEUE_URL must look like redis://host:port, got "${raw}"`);
  }
  return raw;
}

/** A positive integer from the environment, or `fallback` when unset. */
export function positiveInt(env: NodeJS.ProcessEnv, name: string, fallback: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 1) {
    throw new Error(`${name} must be a positive integer, got "${raw}"`);
  }
  return value;
}

/**
 * `TRACELOOM_STUDY_REFERENCE_MB` / `_TABLES` and `TRACELOOM_USER_REFERENCE_MB` / `_TABLES`: the
 * reference-table quotas of a study and of a person (defaults in `DEFAULT_REFERENCE_QUOTA`).
 */
function referenceQuotaOf(env: NodeJS.ProcessEnv): ReferenceQuota {
  const d = DEFAULT_REFERENCE_QUOTA;
  const mb = (name: string, bytes: number) => positiveInt(env, name, bytes / 2 ** 20) * 2 ** 20;
  return {
    ...d,
    studyBytes: mb('TRACELOOM_STUDY_REFERENCE_MB', d.studyBytes),
    studyTables: positiveInt(env, 'TRACELOOM_STUDY_REFERENCE_TABLES', d.studyTables),
    userBytes: mb('TRACELOOM_USER_REFERENCE_MB', d.userBytes),
    userTables: positiveInt(env, 'TRACELOOM_USER_REFERENCE_TABLES', d.userTables),
  };
}

/**
 * Reads `PORT`, `TRACELOOM_DB`, `TRACELOOM_MODE`, `TRACELOOM_STATIC`, and the run and upload
 * limits `TRACELOOM_RUN_WALL_MS`, `TRACELOOM_RUN_THREADS`, `TRACELOOM_RUNS_PER_USER`,
 * `TRACELOOM_UPLOAD_LIMIT`, and the signing keys `TRACELOOM_TOKEN_SECRET`,
 * `TRACELOOM_TOKEN_SECRETS_PREVIOUS`, `TRACELOOM_KEY_FILE` (default: `traceloom.key` beside the
 * database), scheduled backups `TRACELOOM_BACKUP_DIR`, `TRACELOOM_BACKUP_EVERY_HOURS` (24),
 * `TRACELOOM_BACKUP_KEEP` (7), `TRACELOOM_TRUST_PROXY`, mail `TRACELOOM_MAIL_FROM`, `TRACELOOM_PUBLIC_URL`,
 * `TRACELOOM_SMTP_URL`, queue mode `TRACELOOM_QUEUE_URL` with
 * `TRACELOOM_QUEUE_SLOTS` (16); throws a one-line message naming the variable when a value is
 * unusable.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const port = env.PORT === undefined || env.PORT === '' ? DEFAULT_CONFIG.port : Number(env.PORT);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PORT must be an integer from 0 to 65535, got "${env.PORT}"`);
  }
  const mode = (env.TRACELOOM_MODE || 'production') as ServerMode;
  if (!['demo', 'production', 'test'].includes(mode)) {
    throw new Error(`TRACELOOM_MODE must be demo, production or test, got "${env.TRACELOOM_MODE}"`);
  }
  const databasePath = env.TRACELOOM_DB || DEFAULT_CONFIG.databasePath;
  const tokenKeys = keysFromEnv(env);
  return {
    ...DEFAULT_CONFIG,
    port,
    mode,
    databasePath,
    keyFile: env.TRACELOOM_KEY_FILE || path.join(path.dirname(databasePath), 'traceloom.key'),
    ...(tokenKeys ? { tokenKeys } : {}),
    staticDir: env.TRACELOOM_STATIC || DEFAULT_CONFIG.staticDir,
    runs: {
      ...DEFAULT_CONFIG.runs,
      wallClockMs: positiveInt(env, 'TRACELOOM_RUN_WALL_MS', DEFAULT_CONFIG.runs.wallClockMs),
      threads: positiveInt(env, 'TRACELOOM_RUN_THREADS', DEFAULT_CONFIG.runs.threads),
      perUserCap: positiveInt(env, 'TRACELOOM_RUNS_PER_USER', DEFAULT_CONFIG.runs.perUserCap),
      ...(queueUrlOf(env) && {
        queueUrl: queueUrlOf(env),
        queueSlots: positiveInt(env, 'TRACELOOM_QUEUE_SLOTS', 16),
      }),
    },
    uploadLimitBytes: positiveInt(env, 'TRACELOOM_UPLOAD_LIMIT', DEFAULT_CONFIG.uploadLimitBytes),
    referenceQuota: referenceQuotaOf(env),
    ...(env.TRACELOOM_PREVIEWS_PER_10S
      ? {
          previewLimit: {
            limit: positiveInt(env, 'TRACELOOM_PREVIEWS_PER_10S', 40),
            windowMs: 10_000,
          },
        }
      : {}),
    trustProxy: trustProxyOf(env.TRACELOOM_TRUST_PROXY),
    mail: {
      from: env.TRACELOOM_MAIL_FROM || DEFAULT_CONFIG.mail.from,
      publicUrl: env.TRACELOOM_PUBLIC_URL || null,
      smtpUrl: env.TRACELOOM_SMTP_URL || null,
    },
    backups: env.TRACELOOM_BACKUP_DIR
      ? {
          dir: env.TRACELOOM_BACKUP_DIR,
          everyHours: positiveInt(env, 'TRACELOOM_BACKUP_EVERY_HOURS', 24),
          keep: positiveInt(env, 'TRACELOOM_BACKUP_KEEP', 7),
        }
      : null,
  };
}
