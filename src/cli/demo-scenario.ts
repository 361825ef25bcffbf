/**
 * The built-in demo: an invented scenario with exact decimal parameters.
 *
 * "Orchard moth census": a moth population counted once per generation in an orchard,
 * N' = r·N·(1 − N/K) with growth factor r = 3.83 and capacity K = 12 (thousand moths). With x = N/K
 * this is the logistic map at r = 3.83, inside the period-3 window that opens at r = 1 + √8
 * (C. Zhang, "Cycles of the logistic map", arXiv:1204.0546), so the census has a repelling
 * equilibrium and two 3-generation cycles, one attracting and one repelling.
 */
export const ORCHARD_MOTH_YAML = `# Orchard moth census (invented scenario): moths counted once per generation.
title: Orchard moth census
description: >
  Moths per orchard, in thousands, counted once per generation. Growth factor r per
  generation, crowding limit K (thousand moths). Invented scenario for the orbitseal demo.
state: [N]
params:
  r: 3.83   # growth factor per generation (exact decimal 383/100)
  K: 12     # crowding limit, thousand moths
step:
  N: r*N*(1 - N/K)
region:
  N: [0, 12]
`;

export interface DemoTask {
  period: number;
  /** What the demo tells the reader it is about to prove. */
  story: string;
}

export const ORCHARD_MOTH_TASKS: DemoTask[] = [
  { period: 1, story: 'the equilibrium census (the same count every generation)' },
  { period: 3, story: 'the 3-generation boom-and-bust cycles' },
];
