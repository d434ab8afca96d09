/** Type guards for data that may not have passed the schema. */
import type { Point } from '../model/types';

/** @example isRecord({ a: 1 }) // → true (and false for a list or null) */
export function isRecord(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** @example isNumber(NaN) // → false */
export function isNumber(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

/** @example isPoint([1, 2]) // → true */
export function isPoint(v: unknown): v is Point {
  return Array.isArray(v) && v.length === 2 && isNumber(v[0]) && isNumber(v[1]);
}

/** A list of at least two points. @example isPointList([[0, 0], [1, 1]]) // → true */
export function isPointList(v: unknown): v is Point[] {
  return Array.isArray(v) && v.length >= 2 && v.every(isPoint);
}
