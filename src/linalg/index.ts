/**
 * @heuristic Float64 linear algebra (non-rigorous): dense LU / solve / inverse / products, the
 * structured multiple-shooting solvers, monodromy products and approximate eigenvalues.
 * Used by the float search and for Krawczyk preconditioners (any C is admissible there).
 */
export {
  type LuFactorization,
  identityMatrix,
  luFactorInPlace,
  luFactor,
  luSolveInto,
  solve,
  inverse,
  matVecInto,
  matVec,
  matMulInto,
  matMul,
  normInf,
  matrixNormInf,
} from './dense.js';
export {
  ShootingSolver,
  shootingSolve,
  shootingSolveCondensed,
  shootingSolveDense,
  shootingJacobianDense,
  shootingMatVecInto,
} from './shooting.js';
export {
  type Complex,
  monodromyScaled,
  monodromy,
  monodromyEigenvalues,
  eigenvaluesApprox,
  eigenvaluesQR,
  characteristicPolynomial,
  polynomialRoots,
} from './eigen.js';
