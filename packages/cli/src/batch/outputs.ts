import { createWriteStream, type WriteStream } from 'node:fs';
import {
  exportCollection,
  exportFeature,
  fsText,
  VERDICT_SHORT,
  type CorridorFeature,
  type ExportRecord,
} from '@scarpline/core';

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
 * results.geojson: the core's results table as a FeatureCollection (RFC 7946), a feature per
 * row: per station one per case, then the station's. For a GeoJSON corridor each feature is
 * the input line with its own flat properties kept (in WGS 84 longitude and latitude when the
 * corridor names its projected system, the projected positions in the properties); for a batch of JSON or YAML, which has no
 * map position, the geometry is null (an unlocated feature, RFC 7946 §3.2): GIS tools join
 * them to the alignment by station.
 */
export function resultsGeoJson(
  name: string,
  stations: readonly { records: readonly ExportRecord[]; feature: CorridorFeature | null }[],
): string {
  const features = stations.flatMap(({ records, feature }) =>
    records.map((record) =>
      exportFeature(record, {
        // a line in the corridor's named system is written in WGS 84 (RFC 7946)
        geometry: feature?.line ?? feature?.geometry ?? null,
        input: feature?.properties,
      }),
    ),
  );
  return `${JSON.stringify(exportCollection(name, features), null, 1)}\n`;
}

/** The station's row of its rows (the last; a station without a result has only that one). */
export const stationRow = (records: readonly ExportRecord[]): ExportRecord =>
  records[records.length - 1];

/**
 * A station's line of the table `scarpline batch` prints: its governing method, FS and
 * requirement, and its verdict over every case; when the section has several cases, how many
 * and the governing one; the note when there is no FS to compare.
 *
 * @example stationLine(stationRecords(result)) // → '     1240  wcb@1240  spencer  1.213  1.3  below  (2 cases; governing: end of construction)'
 */
export function stationLine(records: readonly ExportRecord[]): string {
  const r = stationRow(records);
  const st = r.station === null ? '—' : String(r.station);
  const fs = r.fs === null ? '—' : fsText(r.fs);
  const v = r.verdict ?? 'no-fs';
  const cases = records.length - 1;
  const governing = cases > 1 && r.case !== null ? `  (${cases} cases; governing: ${r.case})` : '';
  const note = r.note && v !== 'meets' && v !== 'below' ? `  (${r.note})` : '';
  return `  ${st.padStart(9)}  ${r.section_id.padEnd(22)} ${(r.governing_method ?? '—').padEnd(18)} ${fs.padStart(6)}  ${(r.required_fs ?? '—').toString().padStart(5)}  ${VERDICT_SHORT[v]}${governing}${note}`;
}
