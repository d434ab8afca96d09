/** Messages about an input file, and the pieces the input pipeline passes between its steps. */
import type { Section, UnitSystem } from '../model/types';

/** A located message about an input file. line and column are 1-based. */
export interface Message {
  severity: 'error' | 'warning';
  file: string;
  line: number;
  column: number;
  /** Where in the data, e.g. `materials.clay.strength.frictionAngle`; empty for the file. */
  path: string;
  /** A stable kebab-case code, e.g. `above-maximum`, `material-undefined`. */
  code: string;
  message: string;
  /**
   * The ids of the sections the message concerns: the section of the document it is in, the
   * section made from the batch item or GeoJSON feature it points into, every station a
   * template message holds at. Empty when it concerns no section that has an id.
   */
  sections: string[];
}

/** One step of a path into the data: a property name or an array index. */
export type PathKey = string | number;

/**
 * A message before it is located in the file: the path into the data it concerns. `key` asks
 * for the location of the property's name rather than its value (an unknown setting).
 */
export interface Issue {
  severity: 'error' | 'warning';
  path: PathKey[];
  code: string;
  message: string;
  key?: boolean;
}

/** The header of a corridor batch: what it says of itself, and where its id is written. */
export interface BatchHeader {
  id: string;
  title: string | null;
  units: UnitSystem;
  file: string;
  line: number;
  column: number;
}

/**
 * One section of an input file, read or not: a section document, an item of a corridor batch
 * or a feature of a GeoJSON corridor, with where it is given and the messages about it.
 */
export interface SectionEntry {
  /** The section's id (`<batch id>@<station>` in a corridor); null when the input gives none. */
  id: string | null;
  /** How messages and tables name it: its id, or where it is given (`sections[3]`). */
  label: string;
  station: number | null;
  /** The id of the corridor batch it belongs to; null for a section document. */
  batch: string | null;
  /** Where the section's id is written (a batch item: its station; a feature: its station). */
  file: string;
  line: number;
  column: number;
  path: string;
  /** The section validated and normalised (SI); null when a message stops it. */
  section: Section | null;
  /** Every message that concerns it, in the order of the file. */
  messages: Message[];
}
