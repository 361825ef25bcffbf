/**
 * A PieceRunner on K worker threads (one task in flight per worker; results arrive in any order,
 * the caller orders them by piece). Kept behind the PieceRunner interface so it can move onto the
 * shared worker pool later.
 */
import { Worker } from 'node:worker_threads';
import type { MapDefinition } from '../model/types.js';
import type { PieceRunner, PieceTask } from './run.js';
import type { PieceResult } from './search.js';
import type { ClusterGraph, CycleVerdict } from './boxgraph.js';

export function workerRunner(definition: MapDefinition, region: Float64Array, pieceDepth: number, count: number): PieceRunner {
  const url = new URL('./worker.js', import.meta.url);
  const workers: Worker[] = [];
  for (let i = 0; i < count; i++) {
    workers.push(new Worker(url, { workerData: { definition: JSON.parse(JSON.stringify(definition)) as MapDefinition, region, pieceDepth } }));
  }
  return {
    run(tasks: readonly PieceTask[], onResult: (r: PieceResult) => void): Promise<void> {
      return new Promise((resolve, reject) => {
        let next = 0;
        let pending = 0;
        let failed = false;
        const feed = (w: Worker): void => {
          if (next < tasks.length) {
            pending++;
            w.postMessage(tasks[next++]);
          } else if (pending === 0) resolve();
        };
        for (const w of workers) {
          w.removeAllListeners('message');
          w.removeAllListeners('error');
          w.on('message', (r: PieceResult) => {
            pending--;
            if (failed) return;
            onResult(r);
            feed(w);
          });
          w.on('error', (e) => {
            failed = true;
            reject(e);
          });
        }
        if (tasks.length === 0) resolve();
        for (const w of workers) feed(w);
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

/** Decides the closed paths of one period on K worker threads (worker i takes paths i, i + K, …). */
export interface BoxGraphPool {
  decide(graph: ClusterGraph, period: number): Promise<CycleVerdict[]>;
  close(): Promise<void>;
}

export function boxGraphWorkers(definition: MapDefinition, count: number): BoxGraphPool {
  const url = new URL('./boxgraph-worker.js', import.meta.url);
  const data = { definition: JSON.parse(JSON.stringify(definition)) as MapDefinition };
  const workers: Worker[] = [];
  for (let i = 0; i < count; i++) workers.push(new Worker(url, { workerData: data }));
  return {
    decide(graph: ClusterGraph, period: number): Promise<CycleVerdict[]> {
      return Promise.all(
        workers.map(
          (w, i) =>
            new Promise<CycleVerdict[]>((resolve, reject) => {
              w.removeAllListeners('message');
              w.removeAllListeners('error');
              w.once('message', (r: CycleVerdict[]) => resolve(r));
              w.once('error', reject);
              w.postMessage({ graph, period, offset: i, stride: count });
            }),
        ),
      ).then((shares) => {
        // back to enumeration order: path j is share j % K, position ⌊j / K⌋
        const total = shares.reduce((s, x) => s + x.length, 0);
        const out: CycleVerdict[] = [];
        for (let j = 0; j < total; j++) out.push(shares[j % count]![Math.floor(j / count)]!);
        return out;
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}
