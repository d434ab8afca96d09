/**
 * A re-run's edits read and checked: a JSON merge patch (RFC 7396) of changes onto the stored
 * section written as a document by the core (sectionDocument, the inverse of reading one, in SI),
 * read again by the core's checks. Pure (no database): the intake pool runs it off the main
 * thread (intake/thread.ts).
 */
import { screenData, sectionDocument, type Message } from '@scarpline/core/input';
import type { Section } from '@scarpline/core/model';
import { invalid, Problem } from '../errors';
import { readEditedSection } from './validate';

/** What an edit may change. Values are SI (the stored section is normalised to SI). */
export const EDITABLE = [
  'title',
  'description',
  'materials',
  'strata',
  'water',
  'loads',
  'reinforcement',
  'seismic',
  'crack',
  'analysis',
  'requiredFs',
  'cases',
] as const;

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

const isObject = (v: unknown): v is Record<string, Json> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** RFC 7396: objects merge member by member, null removes a member, anything else replaces. */
export function mergePatch(target: Json, patch: Json): Json {
  if (!isObject(patch)) return patch;
  const out: Record<string, Json> = isObject(target) ? { ...target } : {};
  for (const [k, v] of Object.entries(patch)) {
    if (v === null) delete out[k];
    else out[k] = mergePatch(out[k] ?? null, v);
  }
  return out;
}

/** A 422 whose one error is located at `path` in the changes. */
function editError(path: string, code: string, message: string): Problem {
  return invalid(`${path}: ${message}.`, {
    errors: [{ severity: 'error', path, code, message, text: `${path}: ${message}` }],
  });
}

/**
 * The design cases after an edit of `cases`: a list replaces them all (RFC 7396), null removes
 * them; an object edits them by name: each member a merge patch of the case of that name as the
 * section document writes it, null removes that case, and a name the section does not list
 * adds a case of that name. The result is read again by the core's checks like the rest.
 *
 * @example casesPatch([{ name: 'long term', kind: 'long-term' }], { 'long term': { requiredFs: 1.4 } })
 */
export function casesPatch(current: unknown, edits: unknown): Json {
  if (edits === null || Array.isArray(edits)) return edits as Json;
  if (!isObject(edits)) {
    throw editError(
      'cases',
      'cases-edit',
      'give the cases as a list (it replaces them all) or as an object of edits by case name',
    );
  }
  const list: Json[] = Array.isArray(current) ? [...(current as Json[])] : [];
  const named = (name: string) => list.findIndex((c) => isObject(c) && c.name === name);
  for (const [name, patch] of Object.entries(edits)) {
    const at = named(name);
    if (patch === null) {
      if (at < 0) {
        const names = list
          .map((c) => (isObject(c) && typeof c.name === 'string' ? c.name : ''))
          .filter(Boolean);
        throw editError(
          `cases.${name}`,
          'no-such-case',
          `the section has no case named "${name}" to remove${names.length ? ` (its cases: ${names.join(', ')})` : ''}`,
        );
      }
      list.splice(at, 1);
    } else if (!isObject(patch)) {
      throw editError(
        `cases.${name}`,
        'cases-edit',
        'an edit of a case is an object (a merge patch of the case) or null',
      );
    } else if (at < 0) list.push(mergePatch({ name }, patch));
    else list[at] = mergePatch(list[at], patch);
  }
  return list;
}

/**
 * The edited section, checked, with the warnings of the core's checks about it; throws 422 with
 * located errors (paths into the section). Results stay in the units of the section's file.
 * The changes are screened by the core first (screenData: nesting, sizes, characters no text
 * may hold), so that nothing below walks data deeper or larger than a section can be.
 */
export function checkEdits(
  stored: Section,
  changes: unknown,
): { section: Section; warnings: Message[] } {
  if (!isObject(changes)) throw invalid('Send the changes as a JSON object.');
  const { refusal } = screenData(changes);
  if (refusal) {
    const at = refusal.path.join('.');
    throw invalid(`${at ? `${at}: ` : ''}${refusal.message}.`, {
      errors: [
        {
          severity: 'error',
          path: at,
          code: refusal.code,
          message: refusal.message,
          text: `${at || 'changes'}: ${refusal.message}`,
        },
      ],
    });
  }
  const unknown = Object.keys(changes).filter((k) => !(EDITABLE as readonly string[]).includes(k));
  if (unknown.length > 0) {
    throw invalid(`These cannot be edited: ${unknown.slice(0, 20).join(', ')}.`, {
      errors: unknown.slice(0, 20).map((k) => ({
        severity: 'error',
        path: k,
        code: 'not-editable',
        message: `${k} cannot be edited; the settings that can are ${EDITABLE.join(', ')}`,
        text: `${k}: cannot be edited`,
      })),
    });
  }
  const { requiredFs, cases, ...rest } = changes;
  const patch: Record<string, Json> = { ...rest };
  if (requiredFs !== undefined) {
    patch.analysis = mergePatch(patch.analysis ?? {}, { requiredFs });
  }
  const written = sectionDocument(stored) as unknown as Record<string, Json>;
  const doc = mergePatch(written, patch) as Record<string, Json>;
  // a list replaces the cases (RFC 7396); an object edits them by name
  if (cases !== undefined) {
    const next = casesPatch(written.cases, cases);
    if (next === null) delete doc.cases;
    else doc.cases = next;
  }
  return readEditedSection(doc, stored.units);
}

/** The edited section, checked (see checkEdits). */
export function editSection(stored: Section, changes: unknown): Section {
  return checkEdits(stored, changes).section;
}

/** A re-run's body as sent (JSON text): parsed, then checkEdits; with the changes as read. */
export function readEdits(
  stored: Section,
  text: string,
): { section: Section; warnings: Message[]; changes: unknown } {
  let changes: unknown;
  try {
    changes = JSON.parse(text);
  } catch (e) {
    throw new Problem(400, 'Malformed JSON', e instanceof Error ? e.message : String(e));
  }
  return { ...checkEdits(stored, changes), changes };
}
