/**
 * A batch worker thread: analyses the sections it is sent with the built core and answers
 * with the result as JSON text (written to results.json by the main thread) and a summary,
 * writing the section's drawing itself when asked.
 */
import { writeFileSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';
import { analyzeSection, drawSection, type DrawableResult } from '@scarpline/core';
import { convertResult } from '../convert-result';
import type { Reply, Summary, Task } from './messages';

function summarise(r: DrawableResult): Summary {
  const reason = r.governing
    ? null
    : (r.results.find((m) => !m.converged)?.reason ?? 'no method converged');
  return {
    id: r.id,
    station: r.station,
    case: r.case,
    governing: r.governing?.method ?? null,
    fs: r.governing?.fs ?? null,
    requiredFs: r.requiredFs,
    passes: r.passes,
    warnings: r.warnings.length + r.results.reduce((n, m) => n + m.warnings.length, 0),
    reason,
  };
}

parentPort?.on('message', (task: Task) => {
  let reply: Reply;
  try {
    const result: DrawableResult = analyzeSection(task.section);
    if (task.svgPath)
      writeFileSync(task.svgPath, `${drawSection(task.section, result, { idPrefix: 'sl' })}\n`);
    const shown = task.units ? convertResult(result, task.units) : result;
    reply = { index: task.index, ok: true, json: JSON.stringify(shown), summary: summarise(shown) };
  } catch (e) {
    reply = { index: task.index, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
