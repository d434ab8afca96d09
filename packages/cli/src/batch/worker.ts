/**
 * A batch worker thread: analyses the sections it is sent with the built core and answers
 * with the result as JSON text (written to results.json by the main thread), its rows of
 * the results table (a row per case, then the station's, with the probability of failure where
 * the section asks for it on the critical surface) and, when asked, its slice sheet, writing the
 * section's drawing itself when asked.
 */
import { writeFileSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';
import {
  analyzeSection,
  caseView,
  drawSection,
  sliceSheet,
  sectionOfCase,
  stationInUnits,
  stationProbabilityOrWarning,
  stationRecords,
} from '@scarpline/core';
import type { Reply, Task } from './messages';

parentPort?.on('message', (task: Task) => {
  let reply: Reply;
  try {
    const analysed = analyzeSection(task.section);
    // the probability of failure on each case's critical surface, where the section asks for it
    // (as the service's section job: where it cannot be computed, a warning says why)
    const { summary, warning } = stationProbabilityOrWarning(task.section, {}, analysed);
    const result = {
      ...analysed,
      ...(summary ? { probability: summary } : {}),
      ...(warning ? { warnings: [...analysed.warnings, warning] } : {}),
    };
    // the drawing of the governing case, as that case sees the section
    const governing = result.governing?.case;
    if (task.svgPath)
      writeFileSync(
        task.svgPath,
        `${drawSection(sectionOfCase(task.section, governing), caseView(result, governing), { idPrefix: 'sl' })}\n`,
      );
    const shown = task.units ? stationInUnits(result, task.units) : result;
    reply = {
      index: task.index,
      ok: true,
      json: JSON.stringify(shown),
      // a row per case, then the station's: its governing case, and its verdict over every case
      records: stationRecords(shown),
      slices: task.sliceSheet ? sliceSheet(shown, new Set()) : null,
    };
  } catch (e) {
    reply = { index: task.index, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
