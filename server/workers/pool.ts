/**
 * The worker pool: heavy uploads (DXF inspection and outlines, manifests, bars files, part
 * programs) are read in child processes (workerpool's process workers), so a 20 MB file being
 * parsed never stops the server from answering other requests. One pool per server process
 * (sharedWorkerPool), sized by GRIDSET_WORKERS. Each task has a time limit and each process a
 * heap cap (node's --max-old-space-size): a hostile file costs one child, never the server. A
 * worker *thread* with resourceLimits is not enough here: Node documents that reaching those
 * limits may still abort the whole process (nodejs/node#47224), and a separate process is the
 * boundary the operating system keeps.
 */
import workerpool from 'workerpool';
import { workerSettingsOf, type WorkerSettings } from '../config';
import { HttpError, WORKER_STOPPED } from '../middleware/errors';
import type { TaskFailure, TaskInput, TaskMessage, TaskName, TaskOutput, TaskReply } from './task-types';

const ENTRY = new URL('./worker-entry.mjs', import.meta.url).pathname;
/** Children idle this long are ended (their heap holds the last parse); the next task forks anew. */
const IDLE_MS = 60_000;

type Pool = ReturnType<typeof workerpool.pool>;
type Pending = ReturnType<Pool['exec']>;

class TaskTimeout extends Error {}

export class WorkerPool {
  #pool: Pool | null = null;
  #running = 0;
  #idle: NodeJS.Timeout | undefined;
  #closing = false;
  /** Called as each task begins in a child (tests and the bench watch for it). */
  onTaskStart: ((name: TaskName) => void) | null = null;

  constructor(readonly settings: WorkerSettings = workerSettingsOf({})) {}

  #get(): Pool {
    this.#pool ??= workerpool.pool(ENTRY, {
      workerType: 'process',
      minWorkers: 0,
      maxWorkers: this.settings.size,
      maxQueueSize: this.settings.size * 16,
      // A child stopped for its time limit is killed at once (it is busy parsing and cannot clean up).
      workerTerminateTimeout: 100,
      forkOpts: {
        // The child's own heap cap; replies cross as structured clones (byte arrays stay byte arrays).
        execArgv: [`--max-old-space-size=${this.settings.memoryMb}`],
        serialization: 'advanced',
      },
    });
    return this.#pool;
  }

  /** Runs one task in a child; a refusal comes back as the HttpError it was, a dead or slow child as a sentence. */
  async run<K extends TaskName>(name: K, input: TaskInput<K>): Promise<TaskOutput<K>> {
    if (this.#closing) throw this.#poolError(new Error('closing'), null);
    clearTimeout(this.#idle);
    this.#running++;
    let timer: NodeJS.Timeout | undefined;
    let timedOut = false;
    let pending: Pending | undefined;
    let reply: TaskReply<K>;
    try {
      const message: TaskMessage<K> = { name, input };
      pending = this.#get().exec('run', [message], {
        on: (event: unknown) => {
          if (event !== 'started') return;
          // The time limit counts from the start of the reading, not from the wait in the queue.
          timer = setTimeout(() => { timedOut = true; pending?.cancel(); }, this.settings.timeoutMs);
          this.onTaskStart?.(name);
        },
      });
      reply = (await pending) as TaskReply<K>;
    } catch (err) {
      throw this.#poolError(err, timedOut ? new TaskTimeout() : null);
    } finally {
      clearTimeout(timer);
      this.#running--;
      this.#whenIdle();
    }
    if (!reply.ok) throw rebuild(reply.failure);
    return reply.value;
  }

  #whenIdle(): void {
    if (this.#running > 0 || !this.#pool) return;
    this.#idle = setTimeout(() => {
      const p = this.#pool;
      this.#pool = null;
      void p?.terminate();
    }, IDLE_MS);
    this.#idle.unref();
  }

  #poolError(err: unknown, reason: TaskTimeout | null): Error {
    const { memoryMb, timeoutMs } = this.settings;
    if (reason instanceof TaskTimeout) {
      return new HttpError(400, 'file-too-slow', `Reading the file took longer than the ${timeoutMs >= 1000 ? `${Math.round(timeoutMs / 1000)} s` : `${timeoutMs} ms`} one upload may take, so it was stopped; send a smaller or simpler file.`);
    }
    const message = err instanceof Error ? err.message : String(err);
    // V8 aborts a process that reaches its heap cap ("Reached heap limit"): SIGABRT, seen here as the child's signal.
    if (/signalCode: `SIGABRT`/.test(message)) {
      return new HttpError(400, 'file-too-complex', `Reading the file needed more than the ${memoryMb} MB of memory one upload may use, so it was stopped; send a smaller or simpler file.`);
    }
    if (/^Max queue size of \d+ reached/.test(message)) {
      return new HttpError(503, 'busy', 'The server is reading as many files as it can right now; nothing was saved, so send the file again in a minute.');
    }
    if (this.#closing) {
      return new HttpError(503, 'unavailable', 'The server is shutting down, so the file was not read; nothing was saved. Send it again once the server is back.');
    }
    // A child that exited or could not start: the machine's fault, logged and answered 503 (unavailableMessage).
    return Object.assign(new Error(`A worker process stopped while reading an upload: ${message}`, { cause: err }), { code: WORKER_STOPPED });
  }

  /** Ends the children once their running tasks are done; a later task starts the pool again. */
  async close(): Promise<void> {
    clearTimeout(this.#idle);
    const p = this.#pool;
    this.#pool = null;
    this.#closing = true;
    try {
      await p?.terminate();
    } finally {
      this.#closing = false;
    }
  }
}

/** The main-side error for a failure inside a task: the same HttpError, or an Error for the log that keeps its name, stack and code. */
export function rebuild(f: TaskFailure): Error {
  if (f.kind === 'http') return new HttpError(f.status, f.code, f.message, f.details);
  const err = new Error(f.message);
  err.name = f.name;
  if (f.stack) err.stack = f.stack;
  return f.code === undefined ? err : Object.assign(err, { code: f.code });
}

let shared: WorkerPool | null = null;

/** The process's pool, made on first use from the environment (GRIDSET_WORKERS, GRIDSET_WORKER_MEMORY_MB, GRIDSET_WORKER_TIMEOUT_S). */
export function sharedWorkerPool(settings?: WorkerSettings): WorkerPool {
  shared ??= new WorkerPool(settings ?? workerSettingsOf(process.env));
  return shared;
}
