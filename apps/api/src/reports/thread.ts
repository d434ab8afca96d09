/**
 * The report pool's job, run in a worker thread (reports/pool.ts): laying out a section's or a
 * corridor's PDF with @scarpline/report, which is CPU work of seconds for a long corridor, so
 * that it never holds up the process's other work and can be stopped at its time limit. Answers
 * the pool's `{ id, task }` messages (intake/thread-pool.ts) with the PDF's bytes, and sends
 * `{ id, progress }` as a corridor's section pages are laid out.
 */
import { isMainThread, parentPort } from 'node:worker_threads';
import {
  corridorReportPdf,
  sectionReportPdf,
  type CorridorReportInput,
  type SectionReportInput,
} from '@scarpline/report';

export type ReportTask =
  | { kind: 'section'; input: SectionReportInput }
  | { kind: 'corridor'; input: Omit<CorridorReportInput, 'onProgress'> };

if (!isMainThread && parentPort) {
  const port = parentPort;
  port.on('message', ({ id, task }: { id: number; task: ReportTask }) => {
    const made =
      task.kind === 'section'
        ? sectionReportPdf(task.input)
        : corridorReportPdf({
            ...task.input,
            onProgress: (done, total) => port.postMessage({ id, progress: { done, total } }),
          });
    made.then(
      (pdf) => port.postMessage({ id, ok: true, value: new Uint8Array(pdf) }),
      (e: unknown) => {
        const error = e instanceof Error ? e : new Error(String(e));
        port.postMessage({ id, ok: false, error: { name: error.name, message: error.message } });
      },
    );
  });
}
