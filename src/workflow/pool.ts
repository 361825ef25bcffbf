/**
 * A pool of worker threads for batch jobs (`check` of many certificates, `prove --all`).
 *
 * A job is a list of tasks and a task function named by module URL + export name (so the same
 * function runs inline or in a worker: workers cannot receive closures). Guarantees:
 *  - results come back in TASK order whatever order the workers finish in (deterministic output);
 *  - `progress(done, total)` counts finished tasks across all workers, on the calling thread;
 *  - one worker (or one task, or no compiled worker script next to this module — e.g. when run
 *    from TypeScript sources by the test runner) runs every task inline, in order, on the calling
 *    thread: the reference behaviour the parallel run must reproduce;
 *  - tasks are handed out one at a time to whichever worker is free (costs vary a lot per task);
 *  - a task that throws: the first error (by task order among those seen) is re-thrown after the
 *    workers are stopped; errors known to be user errors are rebuilt with their class
 *    (`reviveError`), anything else becomes an internal error.
 * Tasks and results must be structured-cloneable (plain data).
 */
import { existsSync } from 'node:fs';
import { availableParallelism, cpus } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { MAX_WORKERS } from '../certificate/limits.js';

/** The function a pool runs: `export function name(task: I): O | Promise<O>` in module `module`. */
export interface TaskFunction {
  /** file: URL of the module (compiled JavaScript when workers are used). */
  readonly module: string;
  readonly exportName: string;
}

export interface PoolOptions<O = unknown> {
  /** Number of workers (default: the number of cores). 1 = inline on the calling thread. */
  workers?: number;
  /** Called after each finished task with the count finished so far and the total. */
  progress?: (done: number, total: number) => void;
  /** Each finished result as it arrives (in finishing order), with the count so far; for streaming displays. */
  onResult?: (result: O, done: number, total: number) => void;
}

export { MAX_WORKERS };

/** The number of cores Node may use (the default worker count). */
export function defaultWorkerCount(): number {
  const n = typeof availableParallelism === 'function' ? availableParallelism() : cpus().length;
  return Math.max(1, Math.min(MAX_WORKERS, n));
}

/** An error as it crosses a thread boundary. */
export interface SerializedError {
  name: string;
  message: string;
  props: Record<string, unknown>;
  stack?: string;
}

const revivers = new Map<string, (e: SerializedError) => Error>();

/** Registers how to rebuild errors of class `name` thrown in a worker (user errors keep their exit code). */
export function registerErrorReviver(name: string, revive: (e: SerializedError) => Error): void {
  revivers.set(name, revive);
}

export function serializeError(e: unknown): SerializedError {
  if (e instanceof Error) {
    const props: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(e)) {
      if (v === null || ['string', 'number', 'boolean'].includes(typeof v)) props[k] = v;
    }
    return { name: e.name, message: e.message, props, ...(e.stack !== undefined ? { stack: e.stack } : {}) };
  }
  return { name: 'Error', message: String(e), props: {} };
}

export function reviveError(s: SerializedError): Error {
  const r = revivers.get(s.name);
  if (r !== undefined) return r(s);
  const e = new Error(`in a worker thread: ${s.name}: ${s.message}`);
  if (s.stack !== undefined) e.stack = s.stack;
  return e;
}

const WORKER_SCRIPT = new URL('./pool-worker.js', import.meta.url);

/** True when a compiled worker script sits next to this module (false under the TS test runner). */
export function workersAvailable(): boolean {
  return WORKER_SCRIPT.protocol === 'file:' && existsSync(fileURLToPath(WORKER_SCRIPT)) && import.meta.url.endsWith('.js');
}

async function loadTask<I, O>(fn: TaskFunction): Promise<(task: I) => O | Promise<O>> {
  let url = fn.module;
  // run from TypeScript sources (test runner): the task module is the .ts beside the missing .js
  if (url.startsWith('file:') && url.endsWith('.js') && !existsSync(fileURLToPath(url))) url = `${url.slice(0, -3)}.ts`;
  const mod = (await import(url)) as Record<string, unknown>;
  const f = mod[fn.exportName];
  if (typeof f !== 'function') throw new Error(`internal: ${fn.module} has no function ${fn.exportName}`);
  return f as (task: I) => O | Promise<O>;
}

/** Runs `fn` on every task; results in task order. */
export async function runPool<I, O>(fn: TaskFunction, tasks: readonly I[], opts: PoolOptions<O> = {}): Promise<O[]> {
  const total = tasks.length;
  const want = Math.max(1, Math.min(opts.workers ?? defaultWorkerCount(), MAX_WORKERS, total));
  if (want <= 1 || !workersAvailable()) {
    const f = await loadTask<I, O>(fn);
    const out: O[] = [];
    for (let i = 0; i < total; i++) {
      const result = await f(tasks[i]!);
      out.push(result);
      opts.progress?.(i + 1, total);
      opts.onResult?.(result, i + 1, total);
    }
    return out;
  }
  const results = new Array<O>(total);
  let next = 0;
  let done = 0;
  let failure: { index: number; error: SerializedError } | null = null;
  const workers: Worker[] = [];
  try {
    await new Promise<void>((resolveAll, rejectAll) => {
      let live = want;
      const finishOne = (): void => {
        live--;
        if (live === 0) resolveAll();
      };
      const feed = (w: Worker): void => {
        if (failure !== null || next >= total) {
          void w.terminate().then(finishOne, finishOne);
          return;
        }
        const index = next++;
        w.postMessage({ index, task: tasks[index] });
      };
      for (let k = 0; k < want; k++) {
        const w = new Worker(WORKER_SCRIPT, { workerData: { module: fn.module, exportName: fn.exportName } });
        workers.push(w);
        w.on('message', (m: { index: number; ok: boolean; result?: O; error?: SerializedError }) => {
          if (m.ok) {
            results[m.index] = m.result as O;
            done++;
            opts.progress?.(done, total);
            opts.onResult?.(m.result as O, done, total);
          } else if (failure === null || m.index < failure.index) {
            failure = { index: m.index, error: m.error! };
          }
          feed(w);
        });
        w.on('error', (e) => rejectAll(e));
        w.on('exit', (code) => {
          if (code !== 0 && code !== 1) rejectAll(new Error(`internal: worker thread exited with code ${code}`));
        });
        feed(w);
      }
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate().catch(() => 0)));
  }
  if (failure !== null) throw reviveError((failure as { error: SerializedError }).error);
  return results;
}
