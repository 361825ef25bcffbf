/**
 * A PieceRunner on K worker threads (one task in flight per worker; results arrive in any order,
 * the caller orders them by piece). Kept behind the PieceRunner interface so it can move onto the
 * shared worker pool later.
 */
import { Worker } from 'node:worker_threads';
import type { MapDefinition } from '../model/types.js';
import type { PieceRunner, PieceTask } from './run.js';
import type { PieceResult } from './search.js';
import type { BoxGraph, PeriodOutcome } from './boxgraph.js';

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

/** Whole periods of a box-graph count on K worker threads (one period in flight per worker). */
export interface BoxGraphPool {
  countPeriods(base: BoxGraph, periods: readonly number[], maxLevel: number, onDone: (p: number, r: PeriodOutcome) => void): Promise<void>;
  close(): Promise<void>;
}

export function boxGraphWorkers(definition: MapDefinition, count: number): BoxGraphPool {
  const url = new URL('./boxgraph-worker.js', import.meta.url);
  const data = { definition: JSON.parse(JSON.stringify(definition)) as MapDefinition };
  const workers: Worker[] = [];
  for (let i = 0; i < count; i++) workers.push(new Worker(url, { workerData: data }));
  return {
    countPeriods(base, periods, maxLevel, onDone): Promise<void> {
      return new Promise((resolve, reject) => {
        // heavy (long) periods first
        const queue = [...periods].sort((a, b) => b - a);
        let pending = 0;
        let failed = false;
        const feed = (w: Worker): void => {
          const p = queue.shift();
          if (p !== undefined) {
            pending++;
            w.postMessage({ base, period: p, maxLevel });
          } else if (pending === 0) resolve();
        };
        for (const w of workers) {
          w.removeAllListeners('message');
          w.removeAllListeners('error');
          w.on('message', (r: { period: number; outcome: PeriodOutcome }) => {
            pending--;
            if (failed) return;
            onDone(r.period, r.outcome);
            feed(w);
          });
          w.on('error', (e) => {
            failed = true;
            reject(e);
          });
        }
        if (queue.length === 0) resolve();
        for (const w of workers) feed(w);
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}
