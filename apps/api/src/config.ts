/** Configuration from the environment, read once at start. */
import os from 'node:os';
import path from 'node:path';

export interface Config {
  env: 'development' | 'test' | 'production';
  databaseUrl: string;
  port: number;
  /** Lifetime of a sign-in token, in hours. */
  sessionHours: number;
  /**
   * Largest JSON body of a batch or a re-run's edits (read off the main thread), largest other
   * JSON body, largest uploaded file, most files of an upload and most bytes of all of them
   * together, in bytes.
   */
  jsonLimit: number;
  bodyLimit: number;
  uploadLimit: number;
  uploadFiles: number;
  uploadTotal: number;
  /**
   * Sections cut from terrain (routes/terrain.ts): the most bytes of an upload (a terrain job
   * with its rasters), of one raster, and the most pixels of one raster.
   */
  terrainTotal: number;
  terrainFileLimit: number;
  terrainPixels: number;
  /**
   * The intake pool that reads submitted files and bodies: threads, most waiting jobs (then
   * 503), time limit per job in milliseconds, memory of a thread in MB.
   */
  intakeThreads: number;
  intakeQueue: number;
  intakeTimeoutMs: number;
  intakeMemoryMb: number;
  /**
   * The report pool that lays out PDF reports (a section's in the API, a corridor's in a
   * worker): threads, most waiting (then 503), time limit per report in milliseconds, memory
   * of a thread in MB.
   */
  reportThreads: number;
  reportQueue: number;
  reportTimeoutMs: number;
  reportMemoryMb: number;
  /**
   * The study pool that computes section studies in a worker (a probabilistic analysis, a
   * sensitivity, a solve, a chunk of realisations): threads, most waiting, time limit per job
   * in milliseconds (the thread is ended there and the study fails), memory of a thread in MB;
   * the most realisations a study may ask for (on the critical surface, and searching again in
   * each), and the realisations of a chunk a worker takes at once when each searches again.
   */
  studyThreads: number;
  studyQueue: number;
  studyTimeoutMs: number;
  studyMemoryMb: number;
  studyRealisations: number;
  studySearchRealisations: number;
  studyChunk: number;
  /** Sign-in attempts per address, and failed ones per account, per window. */
  loginLimit: number;
  loginAccountLimit: number;
  loginWindowMs: number;
  /** How long a password-reset link works, in minutes. */
  resetMinutes: number;
  /** Live-progress streams one user may hold open at once. */
  streamsPerUser: number;
  /**
   * Express's `trust proxy` (TRUST_PROXY: false, true, a hop count, or addresses): who may say
   * with X-Forwarded-* which address and protocol a request came from. HSTS is sent only on a
   * request that came over HTTPS, as this says.
   */
  trustProxy: boolean | number | string;
  /** SMTP: a URL for production; empty means the local fake the app starts. */
  smtpUrl: string;
  smtpFakePort: number;
  mailFrom: string;
  mailTo: string;
  /**
   * Queue: attempts after the first, first retry delay (s), and the time limit of a section's
   * analysis (s): its thread is stopped there and the section ends failed, without retries.
   */
  retryLimit: number;
  retryDelay: number;
  jobTimeout: number;
  workerConcurrency: number;
  /**
   * Section jobs a worker process takes from the queue at once (WORKER_FETCH); it takes more
   * when it is down to its last, so that its analysis thread never waits for the queue.
   */
  workerFetch: number;
  /** How often pg-boss's maintenance runs (expires timed-out jobs), in seconds. */
  queueMaintenance: number;
  /** How often a live-progress stream reads the database, in milliseconds. */
  eventPollMs: number;
  corsOrigin: string;
  /**
   * The web app's production build (index.html and hashed assets), served at / when the folder
   * exists; by default apps/web/dist/browser beside this package.
   */
  webDist: string;
  /** The address people open the web app at, written into invitation e-mails. */
  publicUrl: string;
  // Operations (README "Running in production"): pools, heartbeats, the solver, logs, metrics.
  /** The address the API listens on: 127.0.0.1 by default; 0.0.0.0 behind a load balancer. */
  host: string;
  /** Database connections a process may hold: Sequelize's pool and pg-boss's pool. */
  databasePoolMax: number;
  queuePoolMax: number;
  /** How often a worker writes its heartbeat, and how long without one makes it gone (s). */
  heartbeatSeconds: number;
  workerStaleSeconds: number;
  /** The heap a section's analysis thread may grow to (MB); past it the thread ends. */
  solverMemoryMb: number;
  /** pino's level: fatal, error, warn, info, debug, trace or silent. */
  logLevel: string;
  /** A bearer token /metrics asks for; empty: /metrics answers loopback addresses only. */
  metricsToken: string;
  /**
   * Object storage (S3-compatible) for uploaded inputs and generated reports. The endpoint is
   * AWS_ENDPOINT_URL_S3 (or AWS_ENDPOINT_URL); empty means AWS's own for the region. Credentials
   * come from AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY (/ AWS_SESSION_TOKEN) when set, else
   * from the SDK's usual chain (profile, instance role). Outside production, with no endpoint
   * set, the local fake of scripts/s3.js and its credentials.
   */
  s3: S3Config;
}

export interface S3Config {
  endpoint: string;
  region: string;
  bucket: string;
  /** Path-style addressing (http://host/bucket/key), as most S3-compatible servers want. */
  forcePathStyle: boolean;
  credentials: { accessKeyId: string; secretAccessKey: string; sessionToken?: string } | null;
  /** Attempts of one request (the first and the SDK's retries) and its time limits (ms). */
  maxAttempts: number;
  connectTimeoutMs: number;
  requestTimeoutMs: number;
}

function num(name: string, fallback: number): number {
  const v = process.env[name];
  if (v === undefined || v === '') return fallback;
  const n = Number(v);
  if (!Number.isFinite(n)) throw new Error(`${name} must be a number, got ${v}`);
  return n;
}

function trust(v: string | undefined): boolean | number | string {
  if (v === undefined || v === '' || v === 'false') return false;
  if (v === 'true') return true;
  return /^\d+$/.test(v) ? Number(v) : v;
}

/**
 * Without DATABASE_URL: the checkout's own local cluster (scripts/pg.js, whose port is the
 * checkout's); in production DATABASE_URL must be given.
 */
function localDatabaseUrl(env: Config['env']): string {
  if (env === 'production') throw new Error('DATABASE_URL must be set in production');
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const pg = require('../scripts/pg.js') as { urlFor(database: string): string };
  return pg.urlFor('scarpline');
}

function flag(name: string, fallback: boolean): boolean {
  const v = process.env[name];
  if (v === undefined || v === '') return fallback;
  if (v === 'true' || v === '1') return true;
  if (v === 'false' || v === '0') return false;
  throw new Error(`${name} must be true or false, got ${v}`);
}

/** Object storage from the environment (Config.s3). */
function storage(env: Config['env']): S3Config {
  const given = process.env.AWS_ENDPOINT_URL_S3 || process.env.AWS_ENDPOINT_URL || '';
  const local = !given && env !== 'production';
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const fake = local ? (require('../scripts/s3.js') as LocalFake) : null;
  const keyId = process.env.AWS_ACCESS_KEY_ID;
  const secret = process.env.AWS_SECRET_ACCESS_KEY;
  return {
    endpoint: fake ? fake.endpoint() : given,
    region: process.env.AWS_REGION || process.env.AWS_DEFAULT_REGION || 'us-east-1',
    bucket: process.env.SCARPLINE_S3_BUCKET || (env === 'test' ? 'scarpline-test' : 'scarpline'),
    forcePathStyle: flag('SCARPLINE_S3_FORCE_PATH_STYLE', Boolean(fake || given)),
    credentials: fake
      ? fake.FAKE_CREDENTIALS
      : keyId && secret
        ? {
            accessKeyId: keyId,
            secretAccessKey: secret,
            sessionToken: process.env.AWS_SESSION_TOKEN,
          }
        : null,
    maxAttempts: num('SCARPLINE_S3_ATTEMPTS', 3),
    connectTimeoutMs: num('SCARPLINE_S3_CONNECT_TIMEOUT_MS', 3000),
    requestTimeoutMs: num('SCARPLINE_S3_REQUEST_TIMEOUT_MS', 30000),
  };
}

interface LocalFake {
  endpoint(): string;
  FAKE_CREDENTIALS: { accessKeyId: string; secretAccessKey: string };
}

function read(): Config {
  const env = (process.env.NODE_ENV ?? 'development') as Config['env'];
  const port = num('PORT', 8080);
  return {
    env,
    databaseUrl: process.env.DATABASE_URL || localDatabaseUrl(env),
    port,
    sessionHours: num('SESSION_HOURS', 12),
    jsonLimit: num('JSON_LIMIT', 5 * 1024 * 1024),
    bodyLimit: num('BODY_LIMIT', 100 * 1024),
    uploadLimit: num('UPLOAD_LIMIT', 10 * 1024 * 1024),
    uploadFiles: num('UPLOAD_FILES', 500),
    uploadTotal: num('UPLOAD_TOTAL', 20 * 1024 * 1024),
    terrainTotal: num('TERRAIN_TOTAL', 100 * 1024 * 1024),
    terrainFileLimit: num('TERRAIN_FILE_LIMIT', 64 * 1024 * 1024),
    terrainPixels: num('TERRAIN_PIXELS', 25_000_000),
    intakeThreads: num('INTAKE_THREADS', Math.min(2, os.availableParallelism())),
    intakeQueue: num('INTAKE_QUEUE', 32),
    intakeTimeoutMs: num('INTAKE_TIMEOUT_MS', 30_000),
    intakeMemoryMb: num('INTAKE_MEMORY_MB', 1024),
    reportThreads: num('REPORT_THREADS', 1),
    reportQueue: num('REPORT_QUEUE', 8),
    reportTimeoutMs: num('REPORT_TIMEOUT_MS', 300_000),
    reportMemoryMb: num('REPORT_MEMORY_MB', 2048),
    studyThreads: num('STUDY_THREADS', 1),
    studyQueue: num('STUDY_QUEUE', 8),
    studyTimeoutMs: num('STUDY_TIMEOUT_MS', 600_000),
    studyMemoryMb: num('STUDY_MEMORY_MB', 2048),
    studyRealisations: num('STUDY_REALISATIONS', 100_000),
    studySearchRealisations: num('STUDY_SEARCH_REALISATIONS', 5000),
    studyChunk: Math.max(1, Math.floor(num('STUDY_CHUNK', 50))),
    loginLimit: num('LOGIN_LIMIT', 10),
    loginAccountLimit: num('LOGIN_ACCOUNT_LIMIT', 10),
    loginWindowMs: num('LOGIN_WINDOW_MS', 15 * 60 * 1000),
    resetMinutes: num('RESET_MINUTES', 60),
    streamsPerUser: num('STREAMS_PER_USER', 8),
    trustProxy: trust(process.env.TRUST_PROXY),
    smtpUrl: process.env.SMTP_URL ?? '',
    smtpFakePort: num('SMTP_FAKE_PORT', 0),
    mailFrom: process.env.MAIL_FROM ?? 'scarpline@localhost',
    mailTo: process.env.MAIL_TO ?? '',
    retryLimit: num('JOB_RETRY_LIMIT', 2),
    retryDelay: num('JOB_RETRY_DELAY', 1),
    jobTimeout: num('JOB_TIMEOUT', 120),
    workerConcurrency: num('WORKER_CONCURRENCY', os.availableParallelism()),
    workerFetch: Math.max(1, Math.floor(num('WORKER_FETCH', 4))),
    queueMaintenance: num('QUEUE_MAINTENANCE_SECONDS', 30),
    eventPollMs: num('EVENT_POLL_MS', 500),
    corsOrigin: process.env.CORS_ORIGIN ?? '',
    // src/ or dist/ → the api package → apps/web/dist/browser
    webDist: path.resolve(process.env.WEB_DIST || path.join(__dirname, '../../web/dist/browser')),
    publicUrl: process.env.PUBLIC_URL || `http://127.0.0.1:${port}/`,
    host: process.env.HOST || '127.0.0.1',
    databasePoolMax: num('DATABASE_POOL_MAX', 10),
    queuePoolMax: num('QUEUE_POOL_MAX', 4),
    heartbeatSeconds: num('HEARTBEAT_SECONDS', 5),
    workerStaleSeconds: num('WORKER_STALE_SECONDS', 20),
    solverMemoryMb: num('SOLVER_MEMORY_MB', 2048),
    logLevel: process.env.LOG_LEVEL || (env === 'test' ? 'silent' : 'info'),
    metricsToken: process.env.METRICS_TOKEN ?? '',
    s3: storage(env),
  };
}

export const config: Config = read();
