/**
 * Stored files: bytes in object storage (storage.ts), metadata in PostgreSQL (StoredFile).
 * storeFile writes both; a batch's submission writes its inputs' objects first (putObjects)
 * and their rows inside its own transaction (recordObjects), so that nothing half-made stays
 * when either fails. sendStoredFile streams a file to a response.
 */
import { createHash, randomUUID } from 'node:crypto';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { Transaction } from 'sequelize';
import { notFound } from '../errors';
import { log } from '../log';
import { Batch, StoredFile, type StoredFileKind } from '../models';
import { deleteObject, getObject, putObject } from '../storage';
import { userRef } from './views';

export interface FileToStore {
  kind: StoredFileKind;
  name: string;
  contentType: string;
  body: Buffer;
  batchId?: number | null;
  sectionId?: number | null;
  createdBy: number;
}

/** An object written to storage whose row is not written yet. */
export interface PutObject {
  objectKey: string;
  kind: StoredFileKind;
  name: string;
  contentType: string;
  size: number;
  sha256: string;
  createdBy: number;
}

/** The content type of an uploaded input, from its name's ending (the sender's says little). */
export function inputContentType(name: string): string {
  const ending = /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase();
  switch (ending) {
    case 'yaml':
    case 'yml':
      return 'application/yaml';
    case 'json':
      return 'application/json';
    case 'geojson':
      return 'application/geo+json';
    case 'xml':
      return 'application/xml';
    case 'csv':
      return 'text/csv';
    default:
      return 'application/octet-stream';
  }
}

/** Writes the objects (all, or none: those written are deleted again when one fails). */
export async function putObjects(files: Omit<FileToStore, 'batchId' | 'sectionId'>[]) {
  const done: PutObject[] = [];
  try {
    for (const f of files) {
      const sha256 = createHash('sha256').update(f.body).digest('hex');
      const objectKey = `${f.kind}/${randomUUID()}`;
      await putObject(objectKey, f.body, f.contentType, sha256);
      done.push({
        objectKey,
        kind: f.kind,
        name: f.name,
        contentType: f.contentType,
        size: f.body.length,
        sha256,
        createdBy: f.createdBy,
      });
    }
  } catch (e) {
    await discardObjects(done);
    throw e;
  }
  return done;
}

/** Deletes objects whose rows were never written (best effort: a failure is logged). */
export async function discardObjects(objects: PutObject[]): Promise<void> {
  for (const o of objects) {
    await deleteObject(o.objectKey).catch((e: unknown) =>
      log.warn({ err: e, key: o.objectKey }, 'could not delete an object left by a failed write'),
    );
  }
}

/** Writes the rows of objects already in storage. */
export async function recordObjects(
  objects: PutObject[],
  owner: { batchId?: number | null; sectionId?: number | null },
  transaction?: Transaction,
): Promise<StoredFile[]> {
  return StoredFile.bulkCreate(
    objects.map((o) => ({
      ...o,
      batchId: owner.batchId ?? null,
      sectionId: owner.sectionId ?? null,
    })),
    { transaction },
  );
}

/** Stores a file: its object, then its row (the object is deleted again if the row fails). */
export async function storeFile(f: FileToStore): Promise<StoredFile> {
  const objects = await putObjects([f]);
  try {
    const [row] = await recordObjects(objects, f);
    return row;
  } catch (e) {
    await discardObjects(objects);
    throw e;
  }
}

/** A file name safe in a Content-Disposition header and on any disk: no separators or controls. */
export function safeFileName(name: string): string {
  const cleaned = name
    .replace(/[\\/:*?"<>|\p{Cc}]+/gu, '-')
    .replace(/\s+/g, ' ')
    .trim();
  return cleaned.slice(0, 200) || 'file';
}

/**
 * Streams the object to the response: content type, length, Content-Disposition with the
 * given download name; a missing object → 404 problem+json; storage unreachable → 503
 * problem+json with Retry-After; never a 500.
 */
export async function sendStoredFile(
  res: Response,
  file: StoredFile,
  downloadName?: string,
): Promise<void> {
  // Storage answers (or fails, as StorageMissing / StorageUnavailable) before any header is sent.
  const object = await getObject(file.objectKey);
  res.status(200);
  res.attachment(safeFileName(downloadName ?? file.name));
  res.type(file.contentType);
  res.set('Content-Length', String(object.contentLength ?? file.size));
  res.set('Cache-Control', 'private, no-cache');
  res.set('X-Content-Type-Options', 'nosniff');
  try {
    await pipeline(object.body, res);
  } catch (e) {
    // Headers are gone: the client sees a connection cut short (its length does not match).
    log.warn({ err: e, key: file.objectKey }, 'a stored file stopped while streaming');
    res.destroy();
  }
}

/** The stored inputs of a batch, oldest first, as the API lists them. */
export async function batchInputs(batchId: number) {
  const rows = await StoredFile.findAll({
    where: { batchId, kind: 'batch-input' },
    order: [['id', 'ASC']],
  });
  return Promise.all(rows.map((f) => fileView(f)));
}

export async function fileView(f: StoredFile) {
  return {
    id: f.id,
    kind: f.kind,
    name: f.name,
    contentType: f.contentType,
    size: f.size,
    sha256: f.sha256,
    createdBy: f.createdBy,
    creator: await userRef(f.createdBy),
    createdAt: f.createdAt,
  };
}

/** An input of the batch (404 when the batch has no such input). */
export async function loadBatchInput(batch: Batch, fileId: number): Promise<StoredFile> {
  const f = await StoredFile.findOne({
    where: { id: fileId, batchId: batch.id, kind: 'batch-input' },
  });
  if (!f) throw notFound('input file');
  return f;
}

/** The download name of a batch's input: what it is, of which batch, when. */
export function inputDownloadName(batch: Batch, f: StoredFile): string {
  const day = f.createdAt.toISOString().slice(0, 10);
  return `${batch.name}-batch-${batch.id}-input-${day}-${f.name}`;
}
