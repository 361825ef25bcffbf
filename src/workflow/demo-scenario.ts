/**
 * The built-in demo: invented scenarios with exact decimal parameters.
 *
 * 1. "Orchard moth census": N' = r·N·(1 − N/K), r = 3.83, K = 12 (thousand moths). With x = N/K
 *    this is the logistic map at r = 3.83, inside the period-3 window that opens at r = 1 + √8
 *    (C. Zhang, "Cycles of the logistic map", arXiv:1204.0546): a repelling equilibrium
 *    K(1 − 1/r) ≈ 8.8668 (closed form), the extinct state 0, and two 3-generation cycles, one
 *    attracting and one repelling.
 * 2. "Alpine vole two-season model": S' = 1 − a·S² + C, C' = b·S with a = 0.6, b = 0.3 (a
 *    Hénon-type map). Equilibria S = (−(1 − b) ± √((1 − b)² + 4a))/(2a) = 5/6 and −2, both saddles;
 *    one 2-season cycle S = ((1 − b) ± √(4a − 3(1 − b)²))/(2a), attracting: the monodromy
 *    determinant is b² = 0.09 and its eigenvalues are complex with modulus b = 0.3
 *    (closed forms, derived by hand).
 */
export interface DemoTask {
  period: number;
  /** What the demo tells the reader it is about to prove. */
  story: string;
}

export interface DemoScenario {
  /** Map file text (YAML), parsed by the model layer like any map file. */
  yaml: string;
  /** Pseudo file name for error places and the certificate's origin. */
  origin: string;
  /** Lines printed before the results. */
  intro: string[];
  tasks: DemoTask[];
}

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

export const ALPINE_VOLE_YAML = `# Alpine vole two-season model (invented scenario).
title: Alpine vole two-season model
description: >
  S is the scaled spring count of voles; C is the carry-over of overwintering animals, a share b
  of last spring's count. Invented scenario for the orbitseal demo.
state: [S, C]
params:
  a: 0.6    # crowding in the breeding season
  b: 0.3    # share that overwinters
step:
  S: 1 - a*S^2 + C
  C: b*S
region:
  S: [-2.5, 2.5]
  C: [-1, 1]
`;

export const DEMO_SCENARIOS: DemoScenario[] = [
  {
    yaml: ORCHARD_MOTH_YAML,
    origin: 'demo:orchard-moth-census',
    intro: [
      'Orchard moth census: moths counted once per generation (N in thousands), with exact parameters',
      "    N' = r·N·(1 − N/K),   r = 3.83,  K = 12",
    ],
    tasks: [
      { period: 1, story: 'equilibria (the same count every generation)' },
      { period: 3, story: '3-generation boom-and-bust cycles' },
    ],
  },
  {
    yaml: ALPINE_VOLE_YAML,
    origin: 'demo:alpine-vole-two-season',
    intro: [
      'Alpine vole two-season model: spring count S and overwintering carry-over C',
      "    S' = 1 − a·S² + C,   C' = b·S,   a = 0.6,  b = 0.3",
    ],
    tasks: [
      { period: 1, story: 'equilibria' },
      { period: 2, story: 'alternating good and bad years' },
    ],
  },
];
