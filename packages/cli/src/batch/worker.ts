/**
 * A batch worker thread: analyses the sections it is sent with the built core and answers
 * with the result as JSON text (written to results.json by the main thread) and its row of the
 * results table, writing the section's drawing itself when asked.
 */
import { writeFileSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';
import {
  analyzeSection,
  caseView,
  drawSection,
  exportRecord,
  sectionOfCase,
  stationInUnits,
} from '@scarpline/core';
import type { Reply, Task } from './messages';

parentPort?.on('message', (task: Task) => {
  let reply: Reply;
  try {
    const result = analyzeSection(task.section);
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
      // the station's row: its governing case, and the station's verdict over every case
      record: exportRecord({ ...caseView(shown), verdict: shown.verdict }),
    };
  } catch (e) {
    reply = { index: task.index, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
