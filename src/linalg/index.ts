/**
 * Linear algebra. @heuristic (non-rigorous) float64 and decimal point algebra: dense LU / solve /
 * inverse / products, the structured multiple-shooting solvers, monodromy products, approximate
 * eigenvalues and eigenvectors — used by the float search and for Krawczyk preconditioners (any C
 * is admissible there). Rigorous: the interval matrix helpers (interval-matrix.ts) and complex
 * interval magnitudes (complex.ts), over any outward-rounding `IntervalArithmetic`.
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
export { type CMat, complexInverse, approxEigenvectors, cmagUp, cmigDown } from './complex.js';
export { intervalMatMul, orthogonalInverseEnclosure, orthonormalColumns } from './interval-matrix.js';
export {
  type DecimalCtor,
  type DecimalLu,
  decimalContext,
  decimalLuFactor,
  decimalLuSolve,
  decimalShootingJacobian,
} from './decimal.js';
