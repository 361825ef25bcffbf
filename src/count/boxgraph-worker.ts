/**
 * Worker-thread entry of the box-graph count: receives the map definition once, then tasks
 * {base, period, maxLevel}; answers each with the whole period's outcome (countPeriod).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { compileMap } from '../model/compile.js';
import type { MapDefinition } from '../model/types.js';
import { countPeriod, type BoxGraph } from './boxgraph.js';

const init = workerData as { definition: MapDefinition };
const map = compileMap(init.definition);
parentPort!.on('message', (t: { base: BoxGraph; period: number; maxLevel: number }) => {
  parentPort!.postMessage({ period: t.period, outcome: countPeriod(map, t.base, t.period, t.maxLevel) });
});
