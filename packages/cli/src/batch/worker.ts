/**
 * A batch worker thread: analyses the sections it is sent with the built core and answers
 * with the result as JSON text (written to results.json by the main thread) and its row of the
 * results table, writing the section's drawing itself when asked.
 */
import { writeFileSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';
import {
  analyzeSection,
  drawSection,
  exportRecord,
  resultInUnits,
  type DrawableResult,
} from '@scarpline/core';
import type { Reply, Task } from './messages';

parentPort?.on('message', (task: Task) => {
  let reply: Reply;
  try {
    const result: DrawableResult = analyzeSection(task.section);
    if (task.svgPath)
      writeFileSync(task.svgPath, `${drawSection(task.section, result, { idPrefix: 'sl' })}\n`);
    const shown = task.units ? resultInUnits(result, task.units) : result;
    reply = {
      index: task.index,
      ok: true,
      json: JSON.stringify(shown),
      record: exportRecord(shown),
    };
  } catch (e) {
    reply = { index: task.index, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
