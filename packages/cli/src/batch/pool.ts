import { Worker } from 'node:worker_threads';
import type { Reply, Task } from './messages';

/**
 * A fixed number of worker threads running one script; each takes one task at a time. A
 * worker that dies while working is replaced, and its task answered as failed.
 */
export class WorkerPool {
  private readonly workers: { worker: Worker; task: Task | null }[] = [];
  private stopped = false;

  constructor(
    private readonly script: string,
    size: number,
    private readonly onReply: (reply: Reply) => void,
  ) {
    for (let i = 0; i < size; i++) this.workers.push(this.spawn());
  }

  private spawn(): { worker: Worker; task: Task | null } {
    const slot: { worker: Worker; task: Task | null } = {
      worker: new Worker(this.script),
      task: null,
    };
    slot.worker.on('message', (reply: Reply) => {
      slot.task = null;
      this.onReply(reply);
    });
    let dead = false;
    const lost = (why: string) => {
      if (this.stopped || dead) return;
      dead = true;
      const task = slot.task;
      const i = this.workers.indexOf(slot);
      if (i >= 0) this.workers[i] = this.spawn();
      if (task) this.onReply({ index: task.index, ok: false, error: `the worker stopped: ${why}` });
    };
    slot.worker.on('error', (e) => lost(e.message));
    slot.worker.on('exit', (code) => {
      if (code !== 0) lost(`exit code ${code}`);
    });
    return slot;
  }

  /** How many workers are free for a task. */
  get idle(): number {
    return this.workers.filter((w) => w.task === null).length;
  }

  /** Gives a task to a free worker; false when none is free. */
  run(task: Task): boolean {
    const slot = this.workers.find((w) => w.task === null);
    if (!slot || this.stopped) return false;
    slot.task = task;
    slot.worker.postMessage(task);
    return true;
  }

  /** Ends every worker at once (work in progress is dropped). */
  async terminate(): Promise<void> {
    this.stopped = true;
    await Promise.all(this.workers.map((w) => w.worker.terminate()));
  }
}
