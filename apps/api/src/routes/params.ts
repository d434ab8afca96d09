/** Small parsers for route parameters and bodies. */
import { badRequest } from '../errors';

export function idParam(value: unknown, name = 'id'): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n <= 0) throw badRequest(`${name} must be a positive integer.`);
  return n;
}

export function str(body: unknown, key: string, optional = false): string {
  const v = (body as Record<string, unknown> | undefined)?.[key];
  if (v === undefined && optional) return '';
  if (typeof v !== 'string' || v.trim() === '') throw badRequest(`${key} is a required string.`);
  return v;
}
