/**
 * Re-running a section with edits: a JSON merge patch (RFC 7396) of changes onto the stored
 * section (edits.ts: read and checked by the core off the main thread, located errors, 422),
 * queued as the next run. Older runs and their results are kept.
 */
import { CAUTION } from '@scarpline/core/caution';
import type { Section } from '@scarpline/core/model';
import { sequelize } from '../db';
import { conflict } from '../errors';
import { readEditsText } from '../intake/pool';
import { AuditEntry, Batch, ResultRow } from '../models';
import { enqueueSections } from '../queue';
import { audit } from './audit';
import type { Principal } from './auth';
import { casesOf, loadSection, resultView, sectionView } from './sections';
import { sectionMessage } from './validate';
import { userRefs } from './views';

/**
 * Queues the next run of a section with edits. `changesText`: the body as sent (JSON), read and
 * checked off the main thread (edits.ts readEdits, by the intake pool). Whoever edits the run
 * is kept on the section (`editedBy`): they may not review it.
 */
export async function rerunSection(p: Principal, sectionId: number, changesText: string) {
  const section = await loadSection(p, sectionId);
  if (section.status === 'queued' || section.status === 'running') {
    throw conflict(`Section ${section.key} is ${section.status}; re-run it when this run ends.`);
  }
  const read = await readEditsText(section.input as Section, changesText);
  const { section: input, warnings, changes } = read;
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
        editedBy: p.userId,
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
  const cases = await casesOf(results);
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
      result: r ? resultView(r, cases.get(r.id) ?? []) : null,
    });
  }
  return { sectionId: section.id, key: section.key, run: section.run, runs, caution: CAUTION };
}
