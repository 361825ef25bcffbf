/**
 * Worker-thread entry of the box-graph count: receives the map definition once, then tasks
 * {graph, period, offset, stride}; answers each with the verdicts of its share of the paths.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { compileMap } from '../model/compile.js';
import type { MapDefinition } from '../model/types.js';
import { decideCycles, type ClusterGraph } from './boxgraph.js';

const init = workerData as { definition: MapDefinition };
const map = compileMap(init.definition);
parentPort!.on('message', (t: { graph: ClusterGraph; period: number; offset: number; stride: number }) => {
  parentPort!.postMessage(decideCycles(map, t.graph, t.period, t.offset, t.stride));
});
