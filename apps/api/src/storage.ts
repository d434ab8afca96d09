/**
 * Object storage (S3-compatible, through the AWS SDK): put, get as a stream, head, delete, and
 * the bucket check of /ready. Its failures come out as two kinds only: StorageMissing (no such
 * object) and StorageUnavailable (storage unreachable, refusing, or failing), which the error
 * middleware answers as 404 and 503.
 */
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { config, type S3Config } from './config';

/** No object under the key (it was deleted or never written). */
export class StorageMissing extends Error {
  constructor(readonly key: string) {
    super(`no object ${key} in storage`);
    this.name = 'StorageMissing';
  }
}

/** Storage cannot be reached, refuses us, or fails: try again later. */
export class StorageUnavailable extends Error {
  constructor(
    readonly reason: string,
    options?: { cause?: unknown },
  ) {
    super(`object storage is unavailable: ${reason}`, options);
    this.name = 'StorageUnavailable';
  }
}

const MISSING = new Set(['NoSuchKey', 'NotFound']);

/** The error as one of the two kinds (see the header). */
function classify(err: unknown, key: string): Error {
  const e = err as { name?: string; message?: string; $metadata?: { httpStatusCode?: number } };
  // A missing bucket is storage set up wrong, not a missing file: unavailable.
  if (
    e.name !== 'NoSuchBucket' &&
    (MISSING.has(e.name ?? '') || e.$metadata?.httpStatusCode === 404)
  ) {
    return new StorageMissing(key);
  }
  const status = e.$metadata?.httpStatusCode;
  const reason = [e.name, status ? `HTTP ${status}` : null, e.message].filter(Boolean).join(': ');
  return new StorageUnavailable(reason || String(err), { cause: err });
}

export function makeClient(s3: S3Config): S3Client {
  // The SDK warns once on stderr, in plain text, that its releases after January 2027 want
  // Node 22. The version used here is pinned (package.json) and runs on Node 20; the warning
  // would be the one line of the process's output that is not a JSON log line.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  return new S3Client({
    endpoint: s3.endpoint || undefined,
    region: s3.region,
    forcePathStyle: s3.forcePathStyle,
    ...(s3.credentials ? { credentials: s3.credentials } : {}),
    maxAttempts: s3.maxAttempts,
    requestHandler: {
      connectionTimeout: s3.connectTimeoutMs,
      requestTimeout: s3.requestTimeoutMs,
    },
  });
}

let client: S3Client | null = null;

function s3(): S3Client {
  client ??= makeClient(config.s3);
  return client;
}

const bucket = () => config.s3.bucket;

export interface ObjectHead {
  contentType: string | undefined;
  contentLength: number | undefined;
}

export async function putObject(
  key: string,
  body: Buffer,
  contentType: string,
  sha256: string,
): Promise<void> {
  try {
    await s3().send(
      new PutObjectCommand({
        Bucket: bucket(),
        Key: key,
        Body: body,
        ContentType: contentType,
        ContentLength: body.length,
        Metadata: { sha256 },
      }),
    );
  } catch (e) {
    throw classify(e, key);
  }
}

/** The object as a stream, once storage has answered with it (errors before any byte). */
export async function getObject(key: string): Promise<ObjectHead & { body: Readable }> {
  try {
    const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return {
      body: r.Body as Readable,
      contentType: r.ContentType,
      contentLength: r.ContentLength,
    };
  } catch (e) {
    throw classify(e, key);
  }
}

export async function headObject(key: string): Promise<ObjectHead> {
  try {
    const r = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { contentType: r.ContentType, contentLength: r.ContentLength };
  } catch (e) {
    throw classify(e, key);
  }
}

/** Deletes the object; one already gone is fine. */
export async function deleteObject(key: string): Promise<void> {
  try {
    await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
  } catch (e) {
    const c = classify(e, key);
    if (!(c instanceof StorageMissing)) throw c;
  }
}

/** For /ready: storage answers and the bucket is there (throws StorageUnavailable otherwise). */
export async function checkBucket(): Promise<string> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
    return `bucket ${bucket()} answers`;
  } catch (e) {
    const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
    if (status === 404) throw new StorageUnavailable(`no bucket ${bucket()}`, { cause: e });
    throw classify(e, bucket());
  }
}

/** Closes the client's connections (tests, shutdown). */
export function closeStorage(): void {
  client?.destroy();
  client = null;
}
