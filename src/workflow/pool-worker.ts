/**
 * The worker side of src/workflow/pool.ts: loads the task function once, then answers each
 * `{ index, task }` with `{ index, ok, result }` or `{ index, ok: false, error }`.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { serializeError } from './pool.js';

const { module, exportName } = workerData as { module: string; exportName: string };
const mod = (await import(module)) as Record<string, unknown>;
const fn = mod[exportName] as (task: unknown) => unknown;
if (typeof fn !== 'function') throw new Error(`internal: ${module} has no function ${exportName}`);
const port = parentPort!;
port.on('message', (m: { index: number; task: unknown }) => {
  void (async () => {
    try {
      const result = await fn(m.task);
      port.postMessage({ index: m.index, ok: true, result });
    } catch (e) {
      port.postMessage({ index: m.index, ok: false, error: serializeError(e) });
    }
  })();
});
