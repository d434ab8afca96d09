import { createWriteStream, type WriteStream } from 'node:fs';
import {
  exportCollection,
  exportFeature,
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
 * station. For a GeoJSON corridor each feature is the input line with its own flat properties
 * kept; for a batch of JSON or YAML, which has no map position, the geometry is null (an
 * unlocated feature, RFC 7946 §3.2): GIS tools join them to the alignment by station.
 */
export function resultsGeoJson(
  name: string,
  rows: readonly { record: ExportRecord; feature: CorridorFeature | null }[],
): string {
  const features = rows.map(({ record, feature }) =>
    exportFeature(record, { geometry: feature?.geometry ?? null, input: feature?.properties }),
  );
  return `${JSON.stringify(exportCollection(name, features), null, 1)}\n`;
}
