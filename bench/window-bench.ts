/**
 * Windows and edges on the logistic map (issue 10). Ratios are measured in one run.
 *  1. Both edges of the period-3 window enclosed (fold, flip: Krawczyk on the augmented system,
 *     certificates re-checked) and the interior proven to within 1e-6 of each edge (window cover,
 *     re-checked), beside a float bisection for the same edges to the same tolerance.
 *  2. The period-doubling cascade r_1..r_8 (flips of the period-2^(k−1) orbit), the ratios
 *     (r_k − r_{k−1})/(r_{k+1} − r_k) beside Feigenbaum's δ = 4.66920160910299 (OEIS A006890), and
 *     the enclosures below r_∞ = 3.5699456718709449 (OEIS A098587).
 *  3. Superstable parameters per minimal period n, beside OEIS A000048 (Metropolis, Stein & Stein 1973).
 *  4. The same counted exactly for n = 7..12 (superstable-count: the rest of [0, 4] excluded),
 *     certificate built; re-checked by the checker to n = 10; prover and checker times.
 */
import { Decimal } from 'decimal.js';
import { buildEdgeCertificate, buildSuperstableCountCertificate, buildWindowCertificate } from '../src/certificate/build-window.js';
import { checkCertificate } from '../src/checker/index.js';
import { compileMap, resolveMap } from '../src/model/index.js';
import { refineFloat } from '../src/prove/refine.js';
import { coverWindow } from '../src/windows/cover.js';
import { findEdges } from '../src/windows/edges.js';
import { countSuperstable } from '../src/windows/superstable-count.js';

const D = Decimal.clone({ precision: 40 });
const logistic = resolveMap('logistic');

/** @heuristic float: a period-3 orbit continued from `seed` exists at r (and |Λ| < 1 when `stable`). */
function floatOrbit3(r: number, seed: number[], stable: boolean): boolean {
  const map = compileMap(logistic, { r: { kind: 'exact', value: String(r) } });
  const ref = refineFloat(map, seed, 3, 1);
  if (!ref.converged) return false;
  const x = ref.x;
  if (Math.abs(x[0]! - x[1]!) < 1e-7) return false;
  const lam = [0, 1, 2].reduce((acc, i) => acc * r * (1 - 2 * x[i]!), 1);
  return !stable || Math.abs(lam) < 1;
}

function floatBisect(lo: number, hi: number, pred: (r: number) => boolean, tol: number): [number, number] {
  const plo = pred(lo);
  while (hi - lo > tol) {
    const m = (lo + hi) / 2;
    if (pred(m) === plo) lo = m;
    else hi = m;
  }
  return [lo, hi];
}

export async function runWindowBench(): Promise<string[]> {
  const out: string[] = [];
  // 1. period-3 window
  const t0 = performance.now();
  const range: [string, string] = ['3.82', '3.845'];
  const edges = findEdges(logistic, {}, 'r', range, 3, ['fold', 'flip'], { samples: 8, search: false });
  const fold = edges.find((e) => e.kind === 'fold')!;
  const flip = edges.find((e) => e.kind === 'flip')!;
  const edgeChecks = edges.map((e) => checkCertificate(JSON.stringify(buildEdgeCertificate(e, logistic, range))).verdict);
  const a = new D(fold.param[1]).plus('1e-6').toSignificantDigits(12, Decimal.ROUND_CEIL).toString();
  const b = new D(flip.param[0]).minus('1e-6').toSignificantDigits(12, Decimal.ROUND_FLOOR).toString();
  const cover = coverWindow(logistic, {}, 'r', [a, b], 3);
  const wcert = buildWindowCertificate({ ...cover, pieces: cover.pieces.map((p) => ({ param: p.param, centre: p.orbit.centre, boxes: p.orbit.boxes, minimalPeriod: p.orbit.minimalPeriod, stability: p.orbit.stability, joinedToNext: p.joinedToNext })) }, logistic);
  const wcheck = checkCertificate(JSON.stringify(wcert)).verdict;
  const proven = performance.now() - t0;
  const t1 = performance.now();
  const seed = [0.156, 0.505, 0.957]; // the attracting orbit at r = 3.83 (float iteration)
  const ffold = floatBisect(3.82, 3.835, (r) => floatOrbit3(r, seed, false), 1e-6);
  const fflip = floatBisect(3.84, 3.845, (r) => floatOrbit3(r, seed, true), 1e-6);
  const floatMs = performance.now() - t1;
  const sqrt8 = new D(8).sqrt().plus(1);
  out.push(`period-3 window: fold [${fold.param[0].slice(0, 20)}, ${fold.param[1].slice(0, 20)}] (1+√8 inside: ${new D(fold.param[0]).lte(sqrt8) && sqrt8.lte(fold.param[1])}), flip [${flip.param[0].slice(0, 20)}, ${flip.param[1].slice(0, 20)}], edge certificates ${edgeChecks.join('/')}`);
  out.push(`interior [${a}, ${b}]: ${cover.pieces.length} pieces, ${cover.gaps.length} gaps, ${cover.pieces.every((p) => p.orbit.stability.class === 'attracting') ? 'attracting' : 'mixed'}, joined: ${cover.pieces.slice(0, -1).every((p) => p.joinedToNext)}, certificate ${wcheck}`);
  out.push(`proven + certified: ${proven.toFixed(0)} ms; float bisection to 1e-6 (fold ≈ ${ffold[0].toFixed(7)}, flip ≈ ${fflip[0].toFixed(7)}): ${floatMs.toFixed(0)} ms; ratio ${(proven / floatMs).toFixed(1)}×`);
  // 2. cascade
  const t2 = performance.now();
  const spans: [number, [string, string]][] = [
    [1, ['2.9', '3.1']], [2, ['3.4', '3.5']], [4, ['3.5', '3.55']], [8, ['3.56', '3.566']],
    [16, ['3.566', '3.569']], [32, ['3.569', '3.5697']], [64, ['3.5698', '3.56992']], [128, ['3.56992', '3.56994']],
  ];
  const rs: Decimal[] = [];
  let widest = new D(0);
  let below = true;
  for (const [p, rg] of spans) {
    const [e] = findEdges(logistic, {}, 'r', rg, p, ['flip'], { samples: 6, search: false });
    if (!e) {
      out.push(`flip of period ${p}: not found`);
      break;
    }
    rs.push(new D(e.param[0]).plus(e.param[1]).div(2));
    widest = Decimal.max(widest, new D(e.param[1]).minus(e.param[0]));
    below &&= new D(e.param[1]).lt('3.5699456718709449');
  }
  const ratios = rs.slice(1, -1).map((_, i) => rs[i + 1]!.minus(rs[i]!).div(rs[i + 2]!.minus(rs[i + 1]!)).toFixed(6));
  out.push(`cascade r_1..r_${rs.length}: widest enclosure ${widest.toExponential(2)}, all below r_∞: ${below}; δ_k = ${ratios.join(', ')} (δ = 4.669201…) in ${(performance.now() - t2).toFixed(0)} ms`);
  // 3. superstable counts
  const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170];
  const t3 = performance.now();
  const counts: string[] = [];
  for (let n = 1; n <= 10; n++) {
    const found = findEdges(logistic, {}, 'r', ['0.5', '4'], n, ['superstable'], { samples: 0 }).filter((e) => e.minimalPeriod === n).length;
    counts.push(found === A000048[n - 1] ? `${found}` : `${found}≠${A000048[n - 1]}`);
  }
  out.push(`superstable parameters, n = 1..10 (proven, not certified here): ${counts.join(', ')} (A000048) in ${((performance.now() - t3) / 1000).toFixed(1)} s`);
  // 4. exact counts (the rest of [0, 4] excluded), certified and re-checked
  for (let n = 7; n <= 12; n++) {
    const t4 = performance.now();
    const v = countSuperstable(logistic, {}, 'r', ['0', '4'], n, '0.5');
    const proveMs = performance.now() - t4;
    if (v.status !== 'proven') {
      out.push(`exactly-N count n = ${n}: undecided (${v.reason} near r = ${v.at[0].slice(0, 16)}) after ${(proveMs / 1000).toFixed(1)} s`);
      continue;
    }
    const t5 = performance.now();
    const cert = buildSuperstableCountCertificate({ period: n, parameter: 'r', range: ['0', '4'], region: v.region, critical: '0.5', count: v.count, leaves: v.leaves }, logistic);
    // the decimal checker takes minutes from n = 11 on (about 2.5 min at n = 11): re-checked to n = 10 here
    const checked = n <= 10 ? `checker ${checkCertificate(JSON.stringify(cert)).verdict} in ${((performance.now() - t5) / 1000).toFixed(1)} s` : 'checker not run in the bench (n ≥ 11)';
    out.push(`exactly-N count n = ${n}: ${v.count} (A000048: ${A000048[n - 1]}), ${v.leaves.length} leaves, proven in ${(proveMs / 1000).toFixed(1)} s, ${checked}`);
  }
  return out;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  void runWindowBench().then((lines) => lines.forEach((l) => console.log(l)));
}
