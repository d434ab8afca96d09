/** Small parsers for route parameters and bodies: each refuses what it cannot take, saying why. */
import { badCharacter } from '@scarpline/core/input';
import { badRequest, invalid } from '../errors';
import { API_LIMITS } from '../limits';

/**
 * An id: a plain positive integer, written in digits in a path (`0x1`, `1e0`, ` 1` and `01`
 * are not ids) or a JSON integer in a body, at most API_LIMITS.id.
 */
export function idParam(value: unknown, name = 'id'): number {
  const n =
    typeof value === 'number'
      ? value
      : typeof value === 'string' && /^[1-9][0-9]{0,9}$/.test(value)
        ? Number(value)
        : NaN;
  if (!Number.isInteger(n) || n < 1 || n > API_LIMITS.id) {
    throw badRequest(
      `${name} must be a positive whole number in digits (at most ${API_LIMITS.id}).`,
    );
  }
  return n;
}

/** A JSON body as an object ({} when there is none); 400 for a list or a bare value. */
export function objectBody(body: unknown): Record<string, unknown> {
  if (body === undefined || body === null) return {};
  if (typeof body !== 'object' || Array.isArray(body)) {
    throw badRequest('Send a JSON object (Content-Type: application/json).');
  }
  return body as Record<string, unknown>;
}

/**
 * A text a person typed (a name, a comment), trimmed: a string of at most `max` characters that
 * holds no U+0000 and no half of a character (what no stored text may hold; the core's
 * badCharacter); required (400 when missing or blank) unless `optional`.
 */
export function text(
  body: unknown,
  key: string,
  max: number,
  { optional = false, trim = true }: { optional?: boolean; trim?: boolean } = {},
): string {
  const v = (body as Record<string, unknown> | undefined)?.[key];
  if (v === undefined && optional) return '';
  if (typeof v !== 'string') {
    throw optional ? invalid(`${key} is a string.`) : badRequest(`${key} is a required string.`);
  }
  const s = trim ? v.trim() : v;
  if (v.trim() === '' && !optional) throw badRequest(`${key} is a required string.`);
  if (s.length > max) {
    throw invalid(`${key} has ${s.length} characters; at most ${max} are taken.`);
  }
  const bad = badCharacter(s);
  if (bad) throw invalid(`${key} holds ${bad}: remove it.`);
  return s;
}

/** A required string (untrimmed but not blank) of at most `max` characters. */
export function str(
  body: unknown,
  key: string,
  optional = false,
  max: number = API_LIMITS.name,
): string {
  return text(body, key, max, { optional, trim: false });
}

/**
 * A whole number from a query (`?page=2`): digits only, from 1 to `max`; `fallback` when the
 * query does not give it. `1e20`, `-1`, `2.5` and a repeated parameter are refused (400).
 */
export function queryInt(value: unknown, name: string, fallback: number, max: number): number {
  if (value === undefined || value === '') return fallback;
  const n = typeof value === 'string' && /^[0-9]{1,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isInteger(n) || n < 1 || n > max) {
    throw badRequest(`${name} is a whole number from 1 to ${max}.`);
  }
  return n;
}

/** A yes-or-no query (`?slices=true`): `true` or `false`, false when not given; 400 otherwise. */
export function queryFlag(value: unknown, name: string): boolean {
  const v = queryText(value, name);
  if (v === undefined || v === 'false') return false;
  if (v === 'true') return true;
  throw badRequest(`${name} is true or false.`);
}

/** One text from a query, or undefined; 400 when the parameter is repeated or nested. */
export function queryText(value: unknown, name: string): string | undefined {
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'string') throw badRequest(`${name} is given once, as a plain value.`);
  return value;
}

/**
 * A name from a query (`?case=long term`), or undefined: at most `max` characters, none that no
 * stored text may hold; 400 otherwise, or when the parameter is repeated or nested.
 */
export function queryName(value: unknown, name: string, max: number): string | undefined {
  const v = queryText(value, name);
  if (v === undefined) return undefined;
  if (v.length > max)
    throw badRequest(`${name} has ${v.length} characters; at most ${max} are taken.`);
  const bad = badCharacter(v);
  if (bad) throw badRequest(`${name} holds ${bad}: remove it.`);
  return v;
}
