/**
 * The worker pool: heavy uploads (DXF inspection and outlines, manifests, bars files) are read on
 * worker threads (piscina), so a 20 MB file being parsed never stops the process from answering
 * other requests. One pool per process (sharedWorkerPool), sized by GRIDSET_WORKERS; each task
 * has a time limit and each thread a heap cap, so a hostile file costs one thread, never the
 * process: the thread is ended, the request answers a sentence, and piscina starts a new thread.
 */
import { MessageChannel } from 'node:worker_threads';
import Piscina from 'piscina';
import { workerSettingsOf, type WorkerSettings } from '../config';
import { HttpError, WORKER_STOPPED } from '../middleware/errors';
import type { TaskFailure, TaskInput, TaskMessage, TaskName, TaskOutput, TaskReply } from './task-types';

const ENTRY = new URL('./worker-entry.mjs', import.meta.url).href;

class TaskTimeout extends Error {}

export class WorkerPool {
  #piscina: Piscina | null = null;
  /** Called as each task begins on a thread (tests and the bench watch for it). */
  onTaskStart: ((name: TaskName) => void) | null = null;

  constructor(readonly settings: WorkerSettings = workerSettingsOf({})) {}

  #pool(): Piscina {
    this.#piscina ??= new Piscina({
      filename: ENTRY,
      minThreads: 0,
      maxThreads: this.settings.size,
      // A thread idle for a minute is ended; the next task starts one (about a quarter second, loading tsx).
      idleTimeout: 60_000,
      maxQueue: this.settings.size * 16,
      // The task module is loaded through tsx's asynchronous module hooks; piscina's Atomics.wait between tasks would stall them.
      atomics: 'disabled',
      resourceLimits: { maxOldGenerationSizeMb: this.settings.memoryMb },
    });
    // A thread that fails with no task running (piscina emits 'error'): logged; unheard, it would end the process.
    this.#piscina.on('error', (err: unknown) => console.error('A worker thread failed outside any upload (a new one starts for the next):', err));
    return this.#piscina;
  }

  /** Runs one task on a thread; a refusal comes back as the HttpError it was, a dead or slow thread as a sentence. */
  async run<K extends TaskName>(name: K, input: TaskInput<K>): Promise<TaskOutput<K>> {
    const pool = this.#pool();
    const abort = new AbortController();
    const { port1, port2 } = new MessageChannel();
    let timer: NodeJS.Timeout | undefined;
    port1.once('message', () => {
      timer = setTimeout(() => abort.abort(new TaskTimeout()), this.settings.timeoutMs);
      this.onTaskStart?.(name);
    });
    let reply: TaskReply<K>;
    try {
      const message: TaskMessage<K> = { name, input, started: port2 };
      reply = await pool.run(message, { transferList: [port2], signal: abort.signal });
    } catch (err) {
      throw this.#poolError(err, abort.signal);
    } finally {
      clearTimeout(timer);
      port1.close();
    }
    if (!reply.ok) throw rebuild(reply.failure);
    return reply.value;
  }

  #poolError(err: unknown, signal: AbortSignal): Error {
    const { memoryMb, timeoutMs } = this.settings;
    if (signal.reason instanceof TaskTimeout) {
      return new HttpError(400, 'file-too-slow', `Reading the file took longer than the ${timeoutMs >= 1000 ? `${Math.round(timeoutMs / 1000)} s` : `${timeoutMs} ms`} one upload may take, so it was stopped; send a smaller or simpler file.`);
    }
    const code = (err as { code?: unknown })?.code;
    if (code === 'ERR_WORKER_OUT_OF_MEMORY') {
      return new HttpError(400, 'file-too-complex', `Reading the file needed more than the ${memoryMb} MB of memory one upload may use, so it was stopped; send a smaller or simpler file.`);
    }
    const message = err instanceof Error ? err.message : String(err);
    if (message === 'Task queue is at limit') {
      return new HttpError(503, 'busy', 'The server is reading as many files as it can right now; nothing was saved, so send the file again in a minute.');
    }
    if ((err as { name?: unknown })?.name === 'AbortError') {
      return new HttpError(503, 'unavailable', 'The server is shutting down, so the file was not read; nothing was saved. Send it again once the server is back.');
    }
    // A thread that exited or could not start: the machine's fault, logged and answered 503 (unavailableMessage).
    return Object.assign(new Error(`A worker thread stopped while reading an upload: ${message}`, { cause: err }), { code: WORKER_STOPPED });
  }

  /** Ends the threads once their running tasks are done; a later task starts the pool again. */
  async close(): Promise<void> {
    const p = this.#piscina;
    this.#piscina = null;
    await p?.close();
  }
}

/** The main-thread error for a failure inside a task: the same HttpError, or an Error for the log that keeps its name, stack and code. */
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

