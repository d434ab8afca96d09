/**
 * Re-running a section with edits: a JSON merge patch (RFC 7396) of changes onto the stored
 * section written as a document by the core (sectionDocument, the inverse of reading one, in
 * SI), read again by the core's checks (located errors, 422), queued as the next run. Older
 * runs and their results are kept.
 */
import { CAUTION } from '@scarpline/core/caution';
import { sectionDocument, type Message } from '@scarpline/core/input';
import type { Section } from '@scarpline/core/model';
import { sequelize } from '../db';
import { conflict, invalid } from '../errors';
import { AuditEntry, Batch, ResultRow } from '../models';
import { enqueueSections } from '../queue';
import { audit } from './audit';
import type { Principal } from './auth';
import { loadSection, resultView, sectionView } from './sections';
import { readEditedSection, sectionMessage } from './validate';
import { userRefs } from './views';

/** What an edit may change. Values are SI (the stored section is normalised to SI). */
export const EDITABLE = [
  'title',
  'description',
  'materials',
  'strata',
  'water',
  'loads',
  'seismic',
  'crack',
  'analysis',
  'requiredFs',
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

/**
 * The edited section, checked, with the warnings of the core's checks about it; throws 422 with
 * located errors (paths into the section). Results stay in the units of the section's file.
 */
export function checkEdits(
  stored: Section,
  changes: unknown,
): { section: Section; warnings: Message[] } {
  if (!isObject(changes)) throw invalid('Send the changes as a JSON object.');
  const unknown = Object.keys(changes).filter((k) => !(EDITABLE as readonly string[]).includes(k));
  if (unknown.length > 0) {
    throw invalid(`These cannot be edited: ${unknown.join(', ')}.`, {
      errors: unknown.map((k) => ({
        severity: 'error',
        path: k,
        code: 'not-editable',
        message: `${k} cannot be edited; the settings that can are ${EDITABLE.join(', ')}`,
        text: `${k}: cannot be edited`,
      })),
    });
  }
  const { requiredFs, ...rest } = changes;
  const patch: Record<string, Json> = { ...rest };
  if (requiredFs !== undefined) {
    patch.analysis = mergePatch(patch.analysis ?? {}, { requiredFs });
  }
  const doc = mergePatch(sectionDocument(stored) as unknown as Json, patch);
  return readEditedSection(doc, stored.units);
}

/** The edited section, checked (see checkEdits). */
export function editSection(stored: Section, changes: unknown): Section {
  return checkEdits(stored, changes).section;
}

export async function rerunSection(p: Principal, sectionId: number, changes: unknown) {
  const section = await loadSection(p, sectionId);
  if (section.status === 'queued' || section.status === 'running') {
    throw conflict(`Section ${section.key} is ${section.status}; re-run it when this run ends.`);
  }
  const { section: input, warnings } = checkEdits(section.input as Section, changes);
  const run = section.run + 1;
  await sequelize.transaction(async (t) => {
    // The section's input is now the edited one: so are the warnings about it.
    await section.update(
      {
        input,
        run,
        status: 'queued',
        failReason: null,
        inputWarnings: warnings.map(sectionMessage),
      },
      { transaction: t },
    );
    await Batch.update(
      { status: 'running', finishedAt: null },
      { where: { id: section.batchId }, transaction: t },
    );
    await enqueueSections([{ sectionId: section.id, run }], t);
    await audit(p.userId, 'rerun', 'section', section.id, { run, changes }, t);
  });
  return sectionView(p, section.id);
}

/** Every run of a section, newest first: its result, and the edits that started it. */
export async function sectionRuns(p: Principal, sectionId: number) {
  const section = await loadSection(p, sectionId);
  const results = await ResultRow.findAll({
    where: { sectionId: section.id },
    order: [['run', 'DESC']],
  });
  const edits = await AuditEntry.findAll({
    where: { action: 'rerun', entity: 'section', entityId: section.id },
  });
  const entryOf = (run: number) =>
    edits.find((e) => (e.details as { run?: number } | null)?.run === run);
  const editors = await userRefs(edits.map((e) => e.userId));
  const runs = [];
  for (let run = section.run; run >= 1; run--) {
    const r = results.find((x) => x.run === run);
    const entry = entryOf(run);
    const editedBy = entry?.userId ?? null;
    runs.push({
      run,
      current: run === section.run,
      changes: (entry?.details as { changes?: unknown } | null | undefined)?.changes ?? null,
      editedBy,
      /** Who started this run with edits (null for the submitted run). */
      editor: editedBy === null ? null : (editors.get(editedBy) ?? null),
      input: r?.input ?? (run === section.run ? section.input : null),
      result: r ? resultView(r) : null,
    });
  }
  return { sectionId: section.id, key: section.key, run: section.run, runs, caution: CAUTION };
}
