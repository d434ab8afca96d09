import { createWriteStream, type WriteStream } from 'node:fs';
import { stringify } from 'csv-stringify/sync';
import { CAUTION, type CorridorFeature } from '@scarpline/core';
import type { Summary } from './messages';

/** The columns of results.csv: a row per station. */
export const BATCH_COLUMNS = [
  'station',
  'id',
  'case',
  'governing_method',
  'fs',
  'required_fs',
  'pass',
  'status',
  'note',
  'caution',
] as const;

/** One station of the batch as the outputs see it: its summary, or why it has none. */
export interface Row {
  id: string;
  station: number | null;
  summary: Summary | null;
  /** Why the section was not analysed (it did not read, or the solver failed). */
  error: string | null;
  /** The GeoJSON feature the section came from (a GeoJSON corridor only). */
  feature: CorridorFeature | null;
}

/** pass, fail, no-result (no method converged), no-required (no required FS) or error. */
export function status(row: Row): string {
  if (row.error !== null || !row.summary) return 'error';
  const s = row.summary;
  if (s.fs === null) return 'no-result';
  if (s.passes === null) return 'no-required';
  return s.passes ? 'pass' : 'fail';
}

const cell = (v: number | boolean | string | null | undefined): string =>
  v === null || v === undefined
    ? ''
    : typeof v === 'number'
      ? String(Number(v.toPrecision(10)))
      : String(v);

/** A CSV row of results.csv. */
export function csvRow(row: Row): string {
  const s = row.summary;
  return stringify([
    [
      row.station,
      row.id,
      s?.case,
      s?.governing,
      s?.fs,
      s?.requiredFs,
      s?.passes,
      status(row),
      row.error ?? s?.reason ?? '',
      CAUTION,
    ].map(cell),
  ]);
}

export const csvHeader = (): string => stringify([[...BATCH_COLUMNS]]);

/** A write stream that can be awaited when its buffer is full. */
export class Output {
  private readonly stream: WriteStream;
  constructor(readonly path: string) {
    this.stream = createWriteStream(path, { encoding: 'utf8' });
  }
  async write(text: string): Promise<void> {
    if (!this.stream.write(text))
      await new Promise<void>((r) => this.stream.once('drain', () => r()));
  }
  close(): Promise<void> {
    return new Promise<void>((resolve, reject) => {
      this.stream.end((e?: Error | null) => (e ? reject(e) : resolve()));
    });
  }
}

/**
 * results.geojson: a FeatureCollection (RFC 7946) with a feature per station carrying the
 * result (fs, fs_method, fs_required, passes, status, section_id) and the caution. For a
 * GeoJSON corridor each feature is the input line with its own properties kept; for a batch
 * of JSON or YAML, which has no map position, the geometry is null (an unlocated feature,
 * RFC 7946 §3.2): GIS tools join them to the alignment by station.
 */
export function resultsGeoJson(rows: readonly Row[]): string {
  const out = rows.map((row) => {
    const f = row.feature;
    const s = row.summary;
    return {
      type: 'Feature',
      geometry: f?.geometry ?? null,
      properties: {
        // the input's own attributes, flat as GIS tables keep them (settings for Scarpline left out)
        ...Object.fromEntries(
          Object.entries(f?.properties ?? {}).filter(
            ([, v]) => v === null || typeof v !== 'object',
          ),
        ),
        station: row.station,
        section_id: row.id,
        case: s?.case ?? null,
        fs: s?.fs ?? null,
        fs_method: s?.governing ?? null,
        fs_required: s?.requiredFs ?? null,
        passes: s?.passes ?? null,
        status: status(row),
        note: row.error ?? s?.reason ?? null,
        caution: CAUTION,
      },
    };
  });
  return `${JSON.stringify({ type: 'FeatureCollection', caution: CAUTION, features: out }, null, 1)}\n`;
}
