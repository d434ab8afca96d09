import type { Message } from './types';

/**
 * A message as one line: `file:line:column path: message`, with `warning:` before the path of
 * a warning.
 *
 * @example
 * formatMessage({ severity: 'error', file: 'clay-cut.yaml', line: 12, column: 34,
 *   path: 'materials.clay.strength.frictionAngle', code: 'above-maximum', message: '95 is above 90°' })
 * // → 'clay-cut.yaml:12:34 materials.clay.strength.frictionAngle: 95 is above 90°'
 */
export function formatMessage(m: Omit<Message, 'sections'> & { sections?: string[] }): string {
  const severity = m.severity === 'warning' ? 'warning: ' : '';
  const path = m.path ? `${m.path}: ` : '';
  return `${m.file}:${m.line}:${m.column} ${severity}${path}${m.message}`;
}
