/**
 * Independent checker benchmark: time to re-verify certificates of
 *  - logistic r = 4 orbits of period 10, 100, 1000 (closed form x_j = sin²(π 2^j k/(2^p − 1)),
 *    conjugacy with the doubling map, derived by hand; multiplier +2^p),
 *  - logistic r = 4, period 100 through k = 1 (passes within ~2^-100 of the critical point:
 *    a high-precision certificate, hints.digits = 140),
 *  - a Hénon (a = 1.4, b = 0.3; Hénon 1976, Commun. Math. Phys. 50) saddle orbit of period 50 found
 *    from a close return of a float trajectory and refined by decimal Newton at 60 digits.
 * Certificates are built here (centre ± radius), not by the prover, so the figures do not depend
 * on it; when the prover is available, the same float orbits are also proven and the
 * checker/prover time ratio is reported.
 *   npx tsx bench/check-bench.ts
 */
import { pathToFileURL } from 'node:url';
import { Decimal } from 'decimal.js';
import { checkCertificate, certificateHash, type CheckReport } from '../src/checker/index.js';

interface Case {
  name: string;
  state: string[];
  params: Record<string, string>;
  step: Record<string, string>;
  centre: string[][];
  relRad?: string;
  rad?: string;
  stability: Record<string, unknown>;
  hints?: Record<string, number>;
  float: number[][];
}

function certificate(c: Case): Record<string, unknown> {
  const H = Decimal.clone({ precision: 400 });
  const boxes = c.centre.map((pt) =>
    pt.map((x) => {
      const r = c.relRad ? new H(x).abs().times(c.relRad) : new H(c.rad ?? '1e-25');
      return [new H(x).minus(r).toString(), new H(x).plus(r).toString()];
    }),
  );
  const doc: Record<string, unknown> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-orbit',
    producer: { name: 'check-bench', version: '0' },
    map: { title: c.name, state: c.state, params: c.params, step: c.step },
    period: c.centre.length,
    orbit: { centre: c.centre, boxes },
    claims: { existence: true, uniqueness: null, minimalPeriod: c.centre.length, stability: c.stability },
  };
  if (c.hints) doc.hints = c.hints;
  doc.sha256 = certificateHash(doc);
  return doc;
}

/** @heuristic deterministic pseudo-random integer of `bits` bits (xorshift32), for generic orbits. */
function pseudoRandomBits(bits: number, seed: number): bigint {
  let x = seed >>> 0 || 1;
  let k = 0n;
  for (let i = 0; i < bits; i++) {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    k = (k << 1n) | BigInt(x & 1);
  }
  return k;
}

/** Smallest k' ≥ k whose logistic orbit has minimal period p (2^j k' ≢ ±k' mod 2^p − 1, 0 < j < p). */
function primitive(p: number, k: bigint): bigint {
  const m = (1n << BigInt(p)) - 1n;
  for (let kk = k % m; ; kk = (kk + 1n) % m) {
    let t = (kk * 2n) % m;
    let ok = kk !== 0n;
    for (let j = 1; j < p && ok; j++) {
      if (t === kk || (t + kk) % m === 0n) ok = false;
      t = (t * 2n) % m;
    }
    if (ok) return kk;
  }
}

function logistic4(p: number, k: bigint, digits: number, relRad: string | undefined, hints?: Record<string, number>): Case {
  const m = (1n << BigInt(p)) - 1n;
  k = primitive(p, k);
  const H = Decimal.clone({ precision: digits + 30 });
  const pi = H.acos(-1);
  const centre: string[][] = [];
  let t = k % m;
  for (let j = 0; j < p; j++) {
    const s = H.sin(pi.times(t.toString()).div(m.toString()));
    centre.push([s.times(s).toSD(digits).toString()]);
    t = (t * 2n) % m;
  }
  const mult = new H(2).pow(p);
  return {
    name: `logistic r=4 period ${p}${k === 1n ? ' (k = 1, near-critical)' : ''}`,
    state: ['x'], params: { r: '4' }, step: { x: 'r*x*(1 - x)' }, centre,
    ...(relRad ? { relRad } : { rad: '1e-25' }),
    stability: { class: 'repelling', multiplier: [mult.times('0.999999').toString(), mult.times('1.000001').toString()] },
    ...(hints ? { hints } : {}),
    float: centre.map((pt) => pt.map((s) => Number(s))),
  };
}

/** @heuristic A period-p Hénon orbit: close return of a float trajectory, float then decimal Newton. */
function henonOrbit(p: number): Case {
  const a = 1.4;
  const b = 0.3;
  let x = 0.1;
  let y = 0.1;
  const traj: [number, number][] = [];
  for (let i = 0; i < 200000; i++) {
    [x, y] = [1 - a * x * x + y, b * x];
    if (i > 1000) traj.push([x, y]);
  }
  const D = Decimal.clone({ precision: 60 });
  const N = 2 * p;
  // try close returns in order of closeness until decimal Newton converges to a period-p orbit
  const starts = traj
    .slice(0, traj.length - p)
    .map((q, i) => ({ i, d: Math.hypot(q[0] - traj[i + p]![0], q[1] - traj[i + p]![1]) }))
    .sort((u, v) => u.d - v.d)
    .slice(0, 40);
  for (const { i } of starts) {
    let z: Decimal[] = [];
    for (let j = 0; j < p; j++) z.push(new D(String(traj[i + j]![0])), new D(String(traj[i + j]![1])));
    const A = new D('1.4');
    const B = new D('0.3');
    let ok = false;
    for (let it = 0; it < 40; it++) {
      // F_j = z_{j+1} − f(z_j); J dense; solve J δ = −F by Gaussian elimination with pivoting
      const F: Decimal[] = new Array(N);
      const J: Decimal[][] = Array.from({ length: N }, () => new Array<Decimal>(N + 1).fill(new D(0)));
      for (let j = 0; j < p; j++) {
        const [zx, zy] = [z[2 * j]!, z[2 * j + 1]!];
        const nx = ((j + 1) % p) * 2;
        F[2 * j] = z[nx]!.minus(new D(1).minus(A.times(zx).times(zx)).plus(zy));
        F[2 * j + 1] = z[nx + 1]!.minus(B.times(zx));
        J[2 * j]![2 * j] = A.times(2).times(zx);
        J[2 * j]![2 * j + 1] = new D(-1);
        J[2 * j + 1]![2 * j] = B.neg();
        J[2 * j]![nx] = J[2 * j]![nx]!.plus(1);
        J[2 * j + 1]![nx + 1] = J[2 * j + 1]![nx + 1]!.plus(1);
      }
      for (let r = 0; r < N; r++) J[r]![N] = F[r]!.neg();
      for (let k = 0; k < N; k++) {
        let piv = k;
        for (let r = k + 1; r < N; r++) if (J[r]![k]!.abs().gt(J[piv]![k]!.abs())) piv = r;
        [J[k], J[piv]] = [J[piv]!, J[k]!];
        for (let r = k + 1; r < N; r++) {
          if (J[r]![k]!.isZero()) continue;
          const f = J[r]![k]!.div(J[k]![k]!);
          for (let cc = k; cc <= N; cc++) J[r]![cc] = J[r]![cc]!.minus(f.times(J[k]![cc]!));
        }
      }
      const delta: Decimal[] = new Array(N);
      for (let k = N - 1; k >= 0; k--) {
        let s = J[k]![N]!;
        for (let cc = k + 1; cc < N; cc++) s = s.minus(J[k]![cc]!.times(delta[cc]!));
        delta[k] = s.div(J[k]![k]!);
      }
      z = z.map((v, r) => v.plus(delta[r]!));
      const step = Decimal.max(...delta.map((d) => d.abs()));
      if (step.gt(10)) break;
      if (step.lt('1e-50')) {
        ok = true;
        break;
      }
    }
    if (!ok) continue;
    const pts: string[][] = [];
    for (let j = 0; j < p; j++) pts.push([z[2 * j]!.toSD(45).toString(), z[2 * j + 1]!.toSD(45).toString()]);
    // minimal period p: no point repeats earlier than p (float check, the checker decides rigorously)
    const distinct = pts.every((q, j) => j === 0 || Math.hypot(Number(q[0]) - Number(pts[0]![0]), Number(q[1]) - Number(pts[0]![1])) > 1e-6);
    if (!distinct) continue;
    return {
      name: `Hénon a=1.4 b=0.3 period ${p}`,
      state: ['x', 'y'], params: { a: '1.4', b: '0.3' }, step: { x: '1 - a*x^2 + y', y: 'b*x' },
      centre: pts, rad: '1e-25', stability: { class: 'saddle' },
      float: pts.map((q) => q.map((s) => Number(s))),
    };
  }
  throw new Error(`no period-${p} Hénon orbit found from close returns`);
}

interface ProverHooks {
  prove(c: Case): { ms: number; certificate: unknown } | string;
}

async function proverHooks(): Promise<ProverHooks | null> {
  try {
    const prove = (await import('../src/prove/orbit.js')) as typeof import('../src/prove/orbit.js');
    const model = (await import('../src/model/index.js')) as typeof import('../src/model/index.js');
    const cert = (await import('../src/certificate/build.js')) as typeof import('../src/certificate/build.js');
    return {
      prove(c: Case) {
        const def = {
          title: c.name, state: c.state, step: c.step,
          region: Object.fromEntries(c.state.map((v) => [v, ['-3', '3'] as [string, string]])),
          params: Object.fromEntries(Object.entries(c.params).map(([k, v]) => [k, { kind: 'exact' as const, value: v }])),
        };
        const map = model.compileMap(def);
        const t0 = performance.now();
        const v = prove.proveOrbit(map, c.float, { maxBits: 1024 });
        const ms = performance.now() - t0;
        if (v.status !== 'proven') return `not proven (${v.reason}: ${v.detail.slice(0, 100)})`;
        return { ms, certificate: cert.buildCertificate(v.orbit, def) };
      },
    };
  } catch {
    return null;
  }
}

function line(name: string, rep: CheckReport, ms: number): string {
  return `${name.padEnd(44)} ${rep.verdict.padEnd(9)} ${(ms / 1000).toFixed(2).padStart(7)} s  (digits ${rep.digits}${rep.reason ? `; ${rep.reason.slice(0, 120)}` : ''})`;
}

export async function runCheckBench(onLine?: (line: string) => void): Promise<string[]> {
  const lines: string[] = [];
  const out = { push: (l: string): void => { lines.push(l); onLine?.(l); } };
  const cases: (() => Case)[] = [
    () => logistic4(10, 0x2cbn, 40, undefined),
    () => logistic4(100, 0x5851f42d4c957f2d1b873593n, 40, undefined),
    () => logistic4(1000, pseudoRandomBits(1000, 12345), 40, undefined),
    () => logistic4(100, 1n, 160, '1e-40', { digits: 140 }),
    () => henonOrbit(50),
  ];
  const hooks = await proverHooks();
  out.push(`checker: certificates built from closed forms / refined orbits; prover ${hooks ? 'available' : 'not available'}`);
  for (const make of cases) {
    const c = make();
    const doc = certificate(c);
    const t0 = performance.now();
    const rep = checkCertificate(JSON.stringify(doc));
    const ms = performance.now() - t0;
    out.push(line(c.name, rep, ms));
    if (hooks) {
      let r: ReturnType<ProverHooks['prove']>;
      try {
        r = hooks.prove(c);
      } catch (e) {
        r = `prover threw: ${(e as Error).message}`;
      }
      if (typeof r === 'string') out.push(`  prover: ${r}`);
      else {
        const t1 = performance.now();
        const rep2 = checkCertificate(JSON.stringify(r.certificate));
        const ms2 = performance.now() - t1;
        out.push(`  prover ${(r.ms / 1000).toFixed(2)} s; its certificate: ${rep2.verdict} in ${(ms2 / 1000).toFixed(2)} s (digits ${rep2.digits}), checker/prover ratio ${(ms2 / r.ms).toFixed(1)}${rep2.reason ? `; ${rep2.reason.slice(0, 160)}` : ''}`);
      }
    }
  }
  return lines;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  await runCheckBench((l) => console.log(l));
}
