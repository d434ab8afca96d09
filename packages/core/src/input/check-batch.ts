import { isRecord } from './guards';
import type { Issue, PathKey } from './types';
import { listWords } from './words';

/**
 * Checks of a corridor batch that its schema cannot express, in the template and in each
 * section: a stratum below the first gives its top by exactly one of depth and elevation, and
 * water is given by at most one of depth, elevation and ru.
 *
 * @example checkBatch(batch) // → [{ path: ['template', 'strata', 1], code: 'top-both', … }]
 */
export function checkBatch(batch: unknown): Issue[] {
  const issues: Issue[] = [];
  if (!isRecord(batch)) return issues;
  const parts: [unknown, PathKey[]][] = [[batch.template, ['template']]];
  if (Array.isArray(batch.sections)) {
    batch.sections.forEach((s: unknown, i: number) => parts.push([s, ['sections', i]]));
  }
  for (const [part, base] of parts) {
    if (!isRecord(part)) continue;
    if (Array.isArray(part.strata)) {
      part.strata.forEach((s: unknown, k: number) => {
        if (k === 0 || !isRecord(s)) return;
        const hasDepth = s.depth !== undefined;
        const hasElevation = s.elevation !== undefined;
        if (hasDepth && hasElevation) {
          issues.push({
            severity: 'error',
            path: [...base, 'strata', k],
            code: 'top-both',
            message: 'gives both depth and elevation; give the top by one of them',
          });
        } else if (!hasDepth && !hasElevation) {
          issues.push({
            severity: 'error',
            path: [...base, 'strata', k],
            code: 'missing',
            message: 'depth or elevation is missing (every stratum below the first gives its top)',
          });
        }
      });
    }
    if (isRecord(part.water)) {
      const given = ['depth', 'elevation', 'ru'].filter(
        (k) => (part.water as Record<string, unknown>)[k] !== undefined,
      );
      if (given.length > 1) {
        issues.push({
          severity: 'error',
          path: [...base, 'water'],
          code: 'water-both',
          message: `gives ${listWords(given)}; give one of them`,
        });
      }
    }
  }
  return issues;
}
