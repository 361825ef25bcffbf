/**
 * @heuristic Float monodromy products and approximate eigenvalues of small matrices.
 *
 * Not rigorous. The prover encloses multipliers itself (DESIGN.md §4 "Stability"); these
 * routines only give the float search a stability guess and the prover a starting point.
 */

/** A complex number (an eigenvalue that may be non-real). */
export interface Complex {
  re: number;
  im: number;
}

/**
 * The monodromy product M = A_{p−1}⋯A_0 of p blocks (layout as in shooting.ts) kept as
 * 2^log2Scale · matrix with max|matrix| = 1, so that long chaotic products neither overflow nor
 * underflow. A zero product gives matrix = 0 and log2Scale = −Infinity.
 */
export function monodromyScaled(
  blocks: ArrayLike<number>,
  p: number,
  n: number,
): { matrix: Float64Array; log2Scale: number } {
  const nn = n * n;
  let m = new Float64Array(nn);
  let next = new Float64Array(nn);
  for (let i = 0; i < n; i++) m[i * n + i] = 1;
  let log2Scale = 0;
  for (let i = 0; i < p; i++) {
    const off = i * nn;
    let big = 0;
    for (let r = 0; r < n; r++) {
      for (let c = 0; c < n; c++) {
        let s = 0;
        for (let l = 0; l < n; l++) s += blocks[off + r * n + l]! * m[l * n + c]!;
        next[r * n + c] = s;
        if (!(Math.abs(s) <= big)) big = Math.abs(s);
      }
    }
    [m, next] = [next, m];
    if (!Number.isFinite(big)) return { matrix: m, log2Scale: NaN };
    if (big === 0) return { matrix: m, log2Scale: -Infinity };
    const e = Math.max(-1000, Math.min(1000, Math.round(Math.log2(big))));
    if (e !== 0) {
      const f = Math.pow(2, -e);
      for (let k = 0; k < nn; k++) m[k] = m[k]! * f;
      log2Scale += e;
    }
  }
  return { matrix: m, log2Scale };
}

/** The monodromy product itself (may overflow to ±Infinity for long chaotic orbits). */
export function monodromy(blocks: ArrayLike<number>, p: number, n: number): Float64Array {
  const { matrix, log2Scale } = monodromyScaled(blocks, p, n);
  const f = Math.pow(2, log2Scale);
  return matrix.map((v) => (v === 0 ? 0 : v * f));
}

/**
 * Approximate eigenvalues of the monodromy of p blocks, with care for long products:
 * n = 1 is the product of the derivatives (via logarithms); n = 2 takes the dominant root from
 * trace and determinant of the scaled product and the other one as Π det(A_i) / λ_1 (avoids
 * the cancellation that would lose a tiny eigenvalue of a saddle); n ≥ 3 uses shifted QR on the
 * scaled product (eigenvaluesQR; polynomial roots only if QR fails). Eigenvalues much smaller than
 * the largest one lose relative accuracy in any method working on the product.
 * Values may be ±Infinity when the exact multiplier exceeds the double range.
 * Ordered by decreasing modulus.
 */
export function monodromyEigenvalues(blocks: ArrayLike<number>, p: number, n: number): Complex[] {
  if (n === 1) {
    let sign = 1;
    let log2 = 0;
    for (let i = 0; i < p; i++) {
      const a = blocks[i]!;
      if (a === 0) return [{ re: 0, im: 0 }];
      if (a < 0) sign = -sign;
      log2 += Math.log2(Math.abs(a));
    }
    return [{ re: sign * Math.pow(2, log2), im: 0 }];
  }
  const { matrix, log2Scale } = monodromyScaled(blocks, p, n);
  if (Number.isNaN(log2Scale)) return Array.from({ length: n }, () => ({ re: NaN, im: NaN }));
  const f = Math.pow(2, log2Scale);
  if (n === 2) {
    const tr = matrix[0]! + matrix[3]!;
    const det = matrix[0]! * matrix[3]! - matrix[1]! * matrix[2]!;
    const disc = tr * tr - 4 * det;
    if (disc < 0) {
      const im = Math.sqrt(-disc) / 2;
      return [
        { re: (tr / 2) * f, im: im * f },
        { re: (tr / 2) * f, im: -im * f },
      ];
    }
    const big = (tr + (tr >= 0 ? 1 : -1) * Math.sqrt(disc)) / 2;
    // Determinant of the product from the blocks' determinants (sign and log2).
    let sign = 1;
    let log2Det = 0;
    for (let i = 0; i < p; i++) {
      const o = i * 4;
      const d = blocks[o]! * blocks[o + 3]! - blocks[o + 1]! * blocks[o + 2]!;
      if (d === 0) {
        sign = 0;
        break;
      }
      if (d < 0) sign = -sign;
      log2Det += Math.log2(Math.abs(d));
    }
    if (big === 0) return [{ re: 0, im: 0 }, { re: 0, im: 0 }];
    const small =
      sign === 0 ? 0 : sign * Math.sign(big) * Math.pow(2, log2Det - log2Scale - Math.log2(Math.abs(big)));
    return [
      { re: big * f, im: 0 },
      { re: small, im: 0 },
    ];
  }
  const roots = eigenvaluesQR(matrix, n) ?? polynomialRoots(characteristicPolynomial(matrix, n));
  return roots
    .map((z) => ({ re: z.re * f, im: z.im * f }))
    .sort((a, b) => Math.hypot(b.re, b.im) - Math.hypot(a.re, a.im));
}

/** Approximate eigenvalues of a general n×n matrix, by decreasing modulus. */
export function eigenvaluesApprox(a: ArrayLike<number>, n: number): Complex[] {
  return monodromyEigenvalues(a, 1, n);
}

/**
 * Coefficients c_0..c_n (c_n = 1) of det(λI − A) by the Faddeev–LeVerrier recursion, O(n⁴).
 * Plain floats; fine for the small n of state spaces.
 */
export function characteristicPolynomial(a: ArrayLike<number>, n: number): Float64Array {
  const c = new Float64Array(n + 1);
  c[n] = 1;
  let m = new Float64Array(n * n); // M_0 = 0
  for (let k = 1; k <= n; k++) {
    // M_k = A·M_{k−1} + c_{n−k+1} I ; c_{n−k} = −tr(A·M_k)/k
    const next = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let l = 0; l < n; l++) s += a[i * n + l]! * m[l * n + j]!;
        next[i * n + j] = s;
      }
      next[i * n + i] = next[i * n + i]! + c[n - k + 1]!;
    }
    m = next;
    let tr = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let l = 0; l < n; l++) s += a[i * n + l]! * m[l * n + i]!;

      tr += s;
    }
    c[n - k] = -tr / k;
  }
  return c;
}

/**
 * Roots of the monic polynomial Σ c_k z^k (c given low to high, c_n = 1) by simultaneous
 * Newton corrections (Weierstrass/Aberth style iteration). Heuristic: multiple or clustered
 * roots converge slowly and come out with reduced accuracy.
 */
export function polynomialRoots(c: ArrayLike<number>): Complex[] {
  const n = c.length - 1;
  if (n <= 0) return [];
  // Cauchy bound for the initial circle.
  let bound = 0;
  for (let k = 0; k < n; k++) bound = Math.max(bound, Math.abs(c[k]!));
  const radius = 1 + bound;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const t = (2 * Math.PI * k) / n + 0.4;
    re[k] = radius * 0.5 * Math.cos(t);
    im[k] = radius * 0.5 * Math.sin(t);
  }
  for (let iter = 0; iter < 500; iter++) {
    let maxStep = 0;
    for (let k = 0; k < n; k++) {
      // p(z) and p'(z) by Horner in complex arithmetic.
      let pr = 1;
      let pi = 0;
      let dr = 0;
      let di = 0;
      for (let j = n - 1; j >= 0; j--) {
        const ndr = dr * re[k]! - di * im[k]! + pr;
        const ndi = dr * im[k]! + di * re[k]! + pi;
        dr = ndr;
        di = ndi;
        const npr = pr * re[k]! - pi * im[k]! + c[j]!;
        const npi = pr * im[k]! + pi * re[k]!;
        pr = npr;
        pi = npi;
      }
      // Newton ratio w = p/p'.
      const dd = dr * dr + di * di;
      if (dd === 0) continue;
      const wr = (pr * dr + pi * di) / dd;
      const wi = (pi * dr - pr * di) / dd;
      // Aberth: step = w / (1 − w·Σ 1/(z_k − z_j)).
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        if (j === k) continue;
        const xr = re[k]! - re[j]!;
        const xi = im[k]! - im[j]!;
        const xx = xr * xr + xi * xi;
        if (xx === 0) continue;
        sr += xr / xx;
        si += -xi / xx;
      }
      const denr = 1 - (wr * sr - wi * si);
      const deni = -(wr * si + wi * sr);
      const den = denr * denr + deni * deni;
      if (den === 0) continue;
      const stepR = (wr * denr + wi * deni) / den;
      const stepI = (wi * denr - wr * deni) / den;
      re[k] = re[k]! - stepR;
      im[k] = im[k]! - stepI;
      maxStep = Math.max(maxStep, Math.hypot(stepR, stepI) / (1 + Math.hypot(re[k]!, im[k]!)));
    }
    if (maxStep < 1e-15) break;
  }
  const out: Complex[] = [];
  for (let k = 0; k < n; k++) {
    const scale = 1 + Math.hypot(re[k]!, im[k]!);
    out.push({ re: re[k]!, im: Math.abs(im[k]!) < 1e-12 * scale ? 0 : im[k]! });
  }
  return out;
}

/**
 * Eigenvalues of a real n×n matrix by Householder reduction to Hessenberg form followed by
 * complex single-shift QR iteration (Wilkinson shifts, exceptional shifts when stagnating,
 * deflation on negligible subdiagonal entries). Backward stable, so multiple eigenvalues of
 * (block-)triangular matrices come out to full accuracy, unlike polynomial roots.
 * Returns null if the iteration does not converge (30·n sweeps per eigenvalue) or input is non-finite.
 */
export function eigenvaluesQR(a: ArrayLike<number>, n: number): Complex[] | null {
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  // Work on A / 2^e with max|entry| ≈ 1 (products in the shift formula must not under/overflow).
  let big = 0;
  for (let k = 0; k < n * n; k++) {
    if (!Number.isFinite(a[k]!)) return null;
    big = Math.max(big, Math.abs(a[k]!));
  }
  if (big === 0) return Array.from({ length: n }, () => ({ re: 0, im: 0 }));
  const e = Math.max(-1000, Math.min(1000, Math.round(Math.log2(big))));
  const down = Math.pow(2, -e);
  const up = Math.pow(2, e);
  for (let k = 0; k < n * n; k++) re[k] = a[k]! * down;
  // Householder reduction to upper Hessenberg form (real).
  const v = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    // Scale the column first so that squares neither underflow nor overflow (a reflector built
    // from an inaccurate vᵀv is not orthogonal and would break the similarity).
    let colScale = 0;
    for (let i = k + 1; i < n; i++) colScale = Math.max(colScale, Math.abs(re[i * n + k]!));
    if (colScale === 0) continue;
    let norm2 = 0;
    for (let i = k + 1; i < n; i++) norm2 += (re[i * n + k]! / colScale) ** 2;
    const norm = Math.sqrt(norm2);
    const alpha = re[(k + 1) * n + k]! >= 0 ? -norm : norm;
    let vtv = 0;
    for (let i = k + 1; i < n; i++) {
      v[i] = re[i * n + k]! / colScale - (i === k + 1 ? alpha : 0);
      vtv += v[i]! * v[i]!;
    }
    if (vtv === 0) continue;
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = k + 1; i < n; i++) s += v[i]! * re[i * n + j]!;
      const f = (2 * s) / vtv;
      for (let i = k + 1; i < n; i++) re[i * n + j] = re[i * n + j]! - f * v[i]!;
    }
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = k + 1; j < n; j++) s += re[i * n + j]! * v[j]!;
      const f = (2 * s) / vtv;
      for (let j = k + 1; j < n; j++) re[i * n + j] = re[i * n + j]! - f * v[j]!;
    }
    for (let i = k + 2; i < n; i++) re[i * n + k] = 0;
  }
  let normA = 0;
  for (let k = 0; k < n * n; k++) normA = Math.hypot(normA, re[k]!);
  const out: Complex[] = [];
  const cs = new Float64Array(n); // Givens c (real)
  const sr = new Float64Array(n); // Givens s (complex)
  const si = new Float64Array(n);
  let hi = n - 1;
  let iter = 0;
  let total = 0;
  const eps = 2.220446049250313e-16;
  while (hi >= 0) {
    if (hi === 0) {
      out.push({ re: re[0]!, im: im[0]! });
      break;
    }
    // Find the start of the unreduced block ending at hi.
    let lo = hi;
    while (lo > 0) {
      const sub = Math.hypot(re[lo * n + lo - 1]!, im[lo * n + lo - 1]!);
      const diag =
        Math.hypot(re[lo * n + lo]!, im[lo * n + lo]!) + Math.hypot(re[(lo - 1) * n + lo - 1]!, im[(lo - 1) * n + lo - 1]!);
      // Relative test, or a normwise one (backward perturbation ≤ 1e−4·eps·‖A‖) for tiny blocks.
      if (sub <= eps * diag || sub <= 1e-4 * eps * normA) {
        re[lo * n + lo - 1] = 0;
        im[lo * n + lo - 1] = 0;
        break;
      }
      lo--;
    }
    if (lo === hi) {
      out.push({ re: re[hi * n + hi]!, im: im[hi * n + hi]! });
      hi--;
      iter = 0;
      continue;
    }
    if (++total > 30 * n * n) return null;
    iter++;
    // Wilkinson shift: eigenvalue of the trailing 2×2 block nearer to its last diagonal entry.
    const ar = re[(hi - 1) * n + hi - 1]!, ai = im[(hi - 1) * n + hi - 1]!;
    const br = re[(hi - 1) * n + hi]!, bi = im[(hi - 1) * n + hi]!;
    const cr = re[hi * n + hi - 1]!, ci = im[hi * n + hi - 1]!;
    const dr = re[hi * n + hi]!, di = im[hi * n + hi]!;
    let mur: number;
    let mui: number;
    if (iter % 11 === 10) {
      // Exceptional shift to break cycles.
      mur = dr + 0.75 * Math.hypot(cr, ci);
      mui = di;
    } else {
      // μ = (a + d)/2 ± sqrt(((a − d)/2)² + b·c)
      const hr = (ar - dr) / 2, hiPart = (ai - di) / 2;
      const qr = hr * hr - hiPart * hiPart + (br * cr - bi * ci);
      const qi = 2 * hr * hiPart + (br * ci + bi * cr);
      const mod = Math.hypot(qr, qi);
      let sqr = Math.sqrt((mod + qr) / 2);
      let sqi = Math.sqrt(Math.max(0, (mod - qr) / 2));
      if (qi < 0) sqi = -sqi;
      const mr = (ar + dr) / 2, mi = (ai + di) / 2;
      // Choose the root nearer to d.
      const d1 = Math.hypot(mr + sqr - dr, mi + sqi - di);
      const d2 = Math.hypot(mr - sqr - dr, mi - sqi - di);
      if (d2 < d1) {
        sqr = -sqr;
        sqi = -sqi;
      }
      mur = mr + sqr;
      mui = mi + sqi;
    }
    for (let k = lo; k <= hi; k++) {
      re[k * n + k] = re[k * n + k]! - mur;
      im[k * n + k] = im[k * n + k]! - mui;
    }
    // QR by Givens rotations on the subdiagonal, rows lo..hi.
    for (let k = lo; k < hi; k++) {
      const xr = re[k * n + k]!, xi = im[k * n + k]!;
      const yr = re[(k + 1) * n + k]!, yi = im[(k + 1) * n + k]!;
      const ax = Math.hypot(xr, xi);
      const r = Math.hypot(ax, Math.hypot(yr, yi));
      let c: number, s_r: number, s_i: number;
      if (r === 0) {
        c = 1;
        s_r = 0;
        s_i = 0;
      } else if (ax === 0) {
        c = 0;
        s_r = yr / r;
        s_i = -yi / r;
      } else {
        c = ax / r;
        // s = (x/|x|)·conj(y)/r
        const ur = xr / ax, ui = xi / ax;
        s_r = (ur * yr + ui * yi) / r;
        s_i = (ui * yr - ur * yi) / r;
      }
      cs[k] = c;
      sr[k] = s_r;
      si[k] = s_i;
      for (let j = k; j <= hi; j++) {
        const pr = re[k * n + j]!, pi = im[k * n + j]!;
        const qr2 = re[(k + 1) * n + j]!, qi2 = im[(k + 1) * n + j]!;
        // row k ← c·p + s·q ; row k+1 ← −conj(s)·p + c·q
        re[k * n + j] = c * pr + (s_r * qr2 - s_i * qi2);
        im[k * n + j] = c * pi + (s_r * qi2 + s_i * qr2);
        re[(k + 1) * n + j] = -(s_r * pr + s_i * pi) + c * qr2;
        im[(k + 1) * n + j] = -(s_r * pi - s_i * pr) + c * qi2;
      }
    }
    // R·Q: apply each rotation's conjugate transpose from the right to columns k, k+1.
    for (let k = lo; k < hi; k++) {
      const c = cs[k]!, s_r = sr[k]!, s_i = si[k]!;
      for (let i = lo; i <= Math.min(k + 2, hi); i++) {
        const pr = re[i * n + k]!, pi = im[i * n + k]!;
        const qr2 = re[i * n + k + 1]!, qi2 = im[i * n + k + 1]!;
        // col k ← c·p + conj(s)·q ; col k+1 ← −s·p + c·q
        re[i * n + k] = c * pr + (s_r * qr2 + s_i * qi2);
        im[i * n + k] = c * pi + (s_r * qi2 - s_i * qr2);
        re[i * n + k + 1] = -(s_r * pr - s_i * pi) + c * qr2;
        im[i * n + k + 1] = -(s_r * pi + s_i * pr) + c * qi2;
      }
    }
    for (let k = lo; k <= hi; k++) {
      re[k * n + k] = re[k * n + k]! + mur;
      im[k * n + k] = im[k * n + k]! + mui;
    }
  }
  // Real input: clean tiny imaginary parts (conjugate pairs are kept as computed).
  return out.map((z) => ({ re: z.re * up, im: Math.abs(z.im) <= 1e-13 * (1 + Math.abs(z.re)) ? 0 : z.im * up }));
}
