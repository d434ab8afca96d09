/** Messages about an input file, and the pieces the input pipeline passes between its steps. */

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
