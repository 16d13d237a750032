/**
 * A fixed set of engine threads (node:worker_threads). `run` gives a task to an idle thread; `cancel`
 * terminates that thread and starts a fresh one, so a cancelled or overrunning task frees its core at once.
 */
import { Worker } from "node:worker_threads";
import type { EngineTask, TaskResult } from "./tasks";

const BOOT = new URL("./thread-boot.mjs", import.meta.url);
const ENTRY = new URL("./engine-thread.ts", import.meta.url).href;

export interface PoolTask {
  result: Promise<TaskResult>;
  /** Stops the task (the thread is replaced); the result rejects with TaskStopped. */
  stop(reason: string): void;
}

export class TaskStopped extends Error {}

export class ThreadPool {
  private idle: Worker[] = [];
  private waiting: ((w: Worker) => void)[] = [];
  private closed = false;

  constructor(readonly size: number) {
    for (let i = 0; i < size; i++) this.idle.push(this.spawn());
  }

  private spawn(): Worker {
    return new Worker(BOOT, { workerData: { entry: ENTRY } });
  }

  private acquire(): Promise<Worker> {
    const w = this.idle.pop();
    if (w) return Promise.resolve(w);
    return new Promise((res) => this.waiting.push(res));
  }

  private release(w: Worker) {
    if (this.closed) {
      void w.terminate();
      return;
    }
    const next = this.waiting.shift();
    if (next) next(w);
    else this.idle.push(w);
  }

  run(task: EngineTask, onProgress: (done: number) => void): PoolTask {
    let stopWith: ((reason: string) => void) | null = null;
    let stoppedEarly: string | null = null;
    const result = this.acquire().then(
      (w) =>
        new Promise<TaskResult>((resolve, reject) => {
          let settled = false;
          const finish = (replace: boolean) => {
            if (settled) return false;
            settled = true;
            w.removeAllListeners("message");
            w.removeAllListeners("error");
            w.removeAllListeners("exit");
            if (replace) {
              void w.terminate();
              this.release(this.spawn());
            } else this.release(w);
            return true;
          };
          stopWith = (reason) => {
            if (finish(true)) reject(new TaskStopped(reason));
          };
          w.on("message", (m: { type: "progress"; done: number } | { type: "result"; result: TaskResult } | { type: "error"; message: string }) => {
            if (m.type === "progress") onProgress(m.done);
            else if (m.type === "result") {
              finish(false);
              resolve(m.result);
            } else {
              finish(true);
              reject(new Error(m.message));
            }
          });
          w.on("error", (e) => {
            finish(true);
            reject(e);
          });
          w.on("exit", (code) => {
            finish(true);
            reject(new Error(`the engine thread stopped (exit ${code})`));
          });
          if (stoppedEarly !== null) stopWith(stoppedEarly);
          else w.postMessage(task);
        }),
    );
    return {
      result,
      stop(reason) {
        if (stopWith) stopWith(reason);
        else stoppedEarly = reason;
      },
    };
  }

  async close() {
    this.closed = true;
    await Promise.all(this.idle.map((w) => w.terminate()));
    this.idle = [];
  }
}

/** One thread per spare core: all but one (left for the process itself and the database), at least one. */
export function threadCount(cores: number, requested?: number): number {
  if (requested && requested > 0) return Math.floor(requested);
  return Math.max(1, cores - 1);
}
