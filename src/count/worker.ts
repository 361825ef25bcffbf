/**
 * Worker-thread entry of the counting search: receives the map definition (parameters already in
 * effect), the region and the piece depth once, then tasks; answers each with its PieceResult.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { compileMap } from '../model/compile.js';
import type { MapDefinition } from '../model/types.js';
import { ShootingCounter } from './search.js';

interface Init {
  definition: MapDefinition;
  region: Float64Array;
  pieceDepth: number;
}

const init = workerData as Init;
const map = compileMap(init.definition);
const counters = new Map<number, ShootingCounter>();
parentPort!.on('message', (t: { period: number; piece: number }) => {
  let c = counters.get(t.period);
  if (!c) counters.set(t.period, (c = new ShootingCounter(map, t.period, init.region, init.pieceDepth)));
  const r = c.runPiece(t.piece);
  parentPort!.postMessage(r, [r.zeros.buffer as ArrayBuffer]);
});
