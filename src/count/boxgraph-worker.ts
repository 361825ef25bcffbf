/**
 * Worker-thread entry of the box-graph count: receives the map definition and the box graph once,
 * then tasks {period, offset, stride}; answers each with the verdicts of its share of the paths.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { compileMap } from '../model/compile.js';
import type { MapDefinition } from '../model/types.js';
import { decideCycles, type BoxGraph } from './boxgraph.js';

const init = workerData as { definition: MapDefinition; graph: BoxGraph };
const map = compileMap(init.definition);
parentPort!.on('message', (t: { period: number; offset: number; stride: number }) => {
  parentPort!.postMessage(decideCycles(map, init.graph, t.period, t.offset, t.stride));
});
