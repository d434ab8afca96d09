import { isRecord } from './guards';
import type { Issue, PathKey } from './types';
import { listWords } from './words';

/**
 * Checks of a corridor batch that its schema cannot express, in the template and in each
 * section: a stratum below the first gives its top by exactly one of depth and elevation;
 * water (a case's too) is given by at most one of depth, elevation and ru, and the water after
 * a drawdown by one of depth and elevation.
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
    checkWater(part.water, [...base, 'water'], issues);
    if (Array.isArray(part.cases)) {
      part.cases.forEach((c: unknown, j: number) => {
        if (!isRecord(c)) return;
        checkWater(c.water, [...base, 'cases', j, 'water'], issues);
        if (isRecord(c.drawdown) && isRecord(c.drawdown.after)) {
          const at: PathKey[] = [...base, 'cases', j, 'drawdown', 'after'];
          checkWater(c.drawdown.after, at, issues);
          if (c.drawdown.after.depth === undefined && c.drawdown.after.elevation === undefined) {
            issues.push({
              severity: 'error',
              path: at,
              code: 'missing',
              message:
                'depth or elevation is missing (the piezometric line after drawdown, below the ground or as an elevation)',
            });
          }
        }
      });
    }
  }
  return issues;
}

/** Water given by at most one of depth, elevation and ru. */
function checkWater(water: unknown, path: PathKey[], issues: Issue[]): void {
  if (!isRecord(water)) return;
  const given = ['depth', 'elevation', 'ru'].filter((k) => water[k] !== undefined);
  if (given.length > 1) {
    issues.push({
      severity: 'error',
      path,
      code: 'water-both',
      message: `gives ${listWords(given)}; give one of them`,
    });
  }
}
