/**
 * Float64 interval evaluation of the multiple-shooting system F_i(x) = x_{(i+1) mod p} − f(x_i)
 * for the counting search: the map image through the compiled flat image (generated
 * straight-line code, src/expr/flat.ts), the Jacobian through the compiled flat Jacobian when
 * the formulas allow it (no abs/min/max/pow), else through the generic tape evaluator with
 * interval slopes. Boxes are flat Float64Arrays: component k = (point i, coordinate a),
 * k = i·n + a, lower end at [2k], upper end at [2k+1].
 *
 * Enclosure contract: `image` and `jacobian` write enclosures of f(X_i) and of Df over X_i (or a
 * slope set for abs/min/max, which is what Krawczyk needs); they return false when an operation
 * left its domain (the enclosure is then not to be used). Rounding: that of src/interval/flat.ts
 * and kernel.ts (outward).
 */
import { compileFlatJacobian, type FlatImage, type FlatJacobianImage } from '../expr/flat.js';
import { TapeEvaluator } from '../expr/evaluate.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { Interval } from '../interval/interval.js';
import { paramBounds, type FormulaMap } from '../model/compile.js';

export class ShootingEvaluator {
  readonly n: number;
  private readonly img: FlatImage;
  private readonly R: Float64Array;
  private readonly jimg: FlatJacobianImage | undefined;
  private readonly RJ: Float64Array | undefined;
  private readonly generic: TapeEvaluator<Interval> | undefined;
  private readonly genericStatus: { continuous: boolean } | undefined;
  private readonly gx: Interval[];
  private readonly gy: Interval[];
  private readonly gj: Interval[];
  readonly floatJ: Float64Array;
  private readonly floatX: Float64Array;

  constructor(readonly map: FormulaMap) {
    const n = map.dim;
    this.n = n;
    this.img = map.flatImage();
    this.R = this.img.newRegisters();
    const enclosures = map.paramValues.map(paramBounds);
    this.jimg = compileFlatJacobian(map.tape, enclosures);
    this.RJ = this.jimg?.newRegisters();
    if (!this.jimg) {
      const arith = intervalArithmetic();
      this.generic = new TapeEvaluator<Interval>(map.tape, arith, enclosures);
      this.genericStatus = arith.status;
    }
    this.gx = new Array<Interval>(n).fill(new Interval(0, 0));
    this.gy = new Array<Interval>(n).fill(new Interval(0, 0));
    this.gj = new Array<Interval>(n * n).fill(new Interval(0, 0));
    this.floatJ = new Float64Array(n * n);
    this.floatX = new Float64Array(n);
  }

  /** out[2a], out[2a+1] := enclosure of f_a over the point box i of X. False: domain left. */
  image(X: Float64Array, i: number, out: Float64Array): boolean {
    const { n, img, R } = this;
    img.resetStatus(R);
    for (let a = 0; a < n; a++) img.setInput(R, a, X[2 * (i * n + a)]!, X[2 * (i * n + a) + 1]!);
    img.run(R);
    const o = img.outputRegisters;
    for (let a = 0; a < n; a++) {
      out[2 * a] = R[2 * o[a]!]!;
      out[2 * a + 1] = R[2 * o[a]! + 1]!;
    }
    return R[0] === 1;
  }

  /** jac[2(a·n+b)], [..+1] := enclosure of ∂f_a/∂x_b over point box i of X. False: domain left. */
  jacobian(X: Float64Array, i: number, jac: Float64Array): boolean {
    const n = this.n;
    if (this.jimg) {
      const J = this.jimg;
      const R = this.RJ!;
      J.resetStatus(R);
      for (let a = 0; a < n; a++) J.setInput(R, a, X[2 * (i * n + a)]!, X[2 * (i * n + a) + 1]!);
      J.run(R);
      const jr = J.jacobianRegisters;
      for (let k = 0; k < n * n; k++) {
        const r = jr[k]!;
        if (r < 0) {
          jac[2 * k] = 0;
          jac[2 * k + 1] = 0;
        } else {
          jac[2 * k] = R[2 * r]!;
          jac[2 * k + 1] = R[2 * r + 1]!;
        }
      }
      return R[0] === 1;
    }
    const st = this.genericStatus!;
    st.continuous = true;
    for (let a = 0; a < n; a++) this.gx[a] = new Interval(X[2 * (i * n + a)]!, X[2 * (i * n + a) + 1]!);
    this.generic!.imageAndJacobian(this.gx, this.gy, this.gj);
    for (let k = 0; k < n * n; k++) {
      jac[2 * k] = this.gj[k]!.lo;
      jac[2 * k + 1] = this.gj[k]!.hi;
    }
    return st.continuous;
  }

  /** @heuristic float Jacobian of f at the midpoint of point box i (row-major), for the preconditioner. */
  jacobianAtMid(X: Float64Array, i: number): Float64Array {
    const n = this.n;
    for (let a = 0; a < n; a++) this.floatX[a] = 0.5 * X[2 * (i * n + a)]! + 0.5 * X[2 * (i * n + a) + 1]!;
    this.map.jacobianFloat(this.floatX, this.floatJ);
    return this.floatJ;
  }
}
