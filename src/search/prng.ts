/**
 * @heuristic A small seeded pseudo-random generator (32-bit state, additive Weyl sequence
 * followed by an integer mixing function). Deterministic for a given seed on every platform;
 * statistically adequate for choosing search seeds, not for anything cryptographic.
 */
export type Rng = () => number;

/** Uniform numbers in [0, 1) from a 32-bit integer seed. */
export function createRng(seed: number): Rng {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x9e3779b9) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    z = (z ^ (z >>> 16)) >>> 0;
    return z / 4294967296;
  };
}
