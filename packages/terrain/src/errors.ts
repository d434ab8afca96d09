/**
 * A problem with the terrain, the alignment or the settings of a cut, located: the file (or
 * setting) it concerns and, for a sample, the station and the offset from the alignment.
 */
export interface TerrainMessage {
  severity: 'error' | 'warning';
  /** The file or the setting the message is about (a raster, the alignment, the job file). */
  file: string;
  /** A setting of the job, e.g. "stations.every", when the message is about one. */
  path?: string;
  /** For a sample of a section: its station (chainage) and offset (left negative, m or ft). */
  station?: number;
  offset?: number;
  /** For a sample: its map position. */
  x?: number;
  y?: number;
  code: string;
  message: string;
}

/** One line of a message, e.g. `dem.tif: station 1040, offset -12.5 (x 512.3, y 880.1): no data`. */
export function messageLine(m: TerrainMessage): string {
  const where: string[] = [];
  if (m.path) where.push(m.path);
  if (m.station !== undefined) where.push(`station ${m.station}`);
  if (m.offset !== undefined) where.push(`offset ${m.offset}`);
  const at = m.x !== undefined && m.y !== undefined ? ` (x ${round(m.x)}, y ${round(m.y)})` : '';
  const located = where.length ? ` ${where.join(', ')}${at}` : at;
  return `${m.file}:${located}${located ? ':' : ''} ${m.severity}: ${m.message}`;
}

const round = (v: number) => Math.round(v * 1000) / 1000;

/** Thrown when a cut cannot go on; carries every located message found so far. */
export class TerrainError extends Error {
  constructor(readonly messages: TerrainMessage[]) {
    super(messages.map(messageLine).join('\n'));
  }
}

/** A TerrainError of one message. */
export const fail = (m: Omit<TerrainMessage, 'severity'>): TerrainError =>
  new TerrainError([{ severity: 'error', ...m }]);
