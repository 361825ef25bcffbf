// Replaying a failed property: fast-check prints the seed of a failing run; run the suite again
// with FC_SEED=<seed> (and optionally FC_PATH=<path>) to reproduce it exactly. Without FC_SEED
// every run draws fresh random seeds, as fast-check does by default.
import fc from 'fast-check';

const seed = process.env.FC_SEED;
if (seed !== undefined && seed !== '') {
  const n = Number(seed);
  if (!Number.isInteger(n)) throw new Error(`FC_SEED must be an integer, got ${JSON.stringify(seed)}`);
  fc.configureGlobal({ seed: n, ...(process.env.FC_PATH ? { path: process.env.FC_PATH } : {}) });
}
