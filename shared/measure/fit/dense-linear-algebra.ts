/**
 * Small dense linear algebra for the fitting code: Householder QR with
 * column equilibration for least squares, and Cholesky for symmetric
 * positive-definite systems. Matrices are arrays of rows.
 *
 * Columns are scaled to unit norm before factorising because fitted
 * parameters differ by many orders of magnitude (NIST Misra1a: 2.4e2 and
 * 5.5e-4); without it the normal matrix loses most of its digits.
 */
import { invariant } from './invariant';

export type Matrix = number[][];

export class SingularMatrixError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SingularMatrixError';
  }
}

export function zeros(rows: number, cols: number): Matrix {
  return Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
}

export function transpose(a: Matrix): Matrix {
  const rows = a.length;
  const cols = rows ? a[0].length : 0;
  const t = zeros(cols, rows);
  for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) t[j][i] = a[i][j];
  return t;
}

export function multiply(a: Matrix, b: Matrix): Matrix {
  invariant(a.length === 0 || a[0].length === b.length, 'multiply: inner dimensions differ');
  const n = b.length ? b[0].length : 0;
  const out = zeros(a.length, n);
  for (let i = 0; i < a.length; i++) {
    for (let k = 0; k < b.length; k++) {
      const aik = a[i][k];
      if (aik === 0) continue;
      for (let j = 0; j < n; j++) out[i][j] += aik * b[k][j];
    }
  }
  return out;
}

export function multiplyVector(a: Matrix, v: ArrayLike<number>): number[] {
  return a.map((row) => {
    let s = 0;
    for (let j = 0; j < row.length; j++) s += row[j] * v[j];
    return s;
  });
}

/** Euclidean norm without overflow or underflow (scaled sum of squares, as in LAPACK dnrm2). */
export function euclideanNorm(values: ArrayLike<number>): number {
  let scale = 0;
  let sumSquares = 1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === 0) continue;
    const absV = Math.abs(v);
    if (scale < absV) {
      sumSquares = 1 + sumSquares * (scale / absV) ** 2;
      scale = absV;
    } else {
      sumSquares += (absV / scale) ** 2;
    }
  }
  return scale * Math.sqrt(sumSquares);
}

export interface LeastSquaresSolution {
  /** Minimiser of ‖A·x − b‖. */
  solution: number[];
  /** (AᵀA)⁻¹, unscaled. */
  inverseNormalMatrix: Matrix;
  residuals: number[];
  residualSumOfSquares: number;
  /** Ratio of the smallest to the largest |R_ii| after column scaling: a cheap conditioning indicator. */
  reciprocalConditionEstimate: number;
}

/**
 * Solves min ‖A·x − b‖ by Householder QR of the column-equilibrated matrix
 * (Golub & Van Loan, Matrix Computations, §5.3). Throws SingularMatrixError
 * when a column is (numerically) a combination of the others.
 */
export function solveLeastSquares(design: Matrix, observations: ArrayLike<number>): LeastSquaresSolution {
  const m = design.length;
  invariant(m > 0, 'solveLeastSquares: empty design matrix');
  const n = design[0].length;
  invariant(m >= n, 'solveLeastSquares: fewer rows than columns');
  invariant(observations.length === m, 'solveLeastSquares: observations and design rows differ in number');

  const columnScale = new Array<number>(n);
  for (let j = 0; j < n; j++) {
    const column = new Array<number>(m);
    for (let i = 0; i < m; i++) column[i] = design[i][j];
    const norm = euclideanNorm(column);
    if (!(norm > 0) || !Number.isFinite(norm)) {
      throw new SingularMatrixError(`column ${j + 1} of the design matrix is zero or not finite`);
    }
    columnScale[j] = norm;
  }
  // Working copy, column-major for cache-friendly Householder updates.
  const a: Float64Array[] = [];
  for (let j = 0; j < n; j++) {
    const col = new Float64Array(m);
    for (let i = 0; i < m; i++) col[i] = design[i][j] / columnScale[j];
    a.push(col);
  }
  const qtb = Float64Array.from(observations as ArrayLike<number>);
  const rDiagonal = new Float64Array(n);

  for (let k = 0; k < n; k++) {
    const col = a[k];
    const norm = euclideanNorm(col.subarray(k));
    if (norm === 0) throw new SingularMatrixError(`column ${k + 1} of the design matrix is a combination of the others`);
    const alpha = col[k] > 0 ? -norm : norm;
    // v = x − alpha·e1 stored in col[k..]; H = I − 2vvᵀ/(vᵀv)
    col[k] -= alpha;
    let vtv = 0;
    for (let i = k; i < m; i++) vtv += col[i] * col[i];
    for (let j = k + 1; j < n; j++) {
      const other = a[j];
      let dot = 0;
      for (let i = k; i < m; i++) dot += col[i] * other[i];
      const factor = (2 * dot) / vtv;
      for (let i = k; i < m; i++) other[i] -= factor * col[i];
    }
    let dotB = 0;
    for (let i = k; i < m; i++) dotB += col[i] * qtb[i];
    const factorB = (2 * dotB) / vtv;
    for (let i = k; i < m; i++) qtb[i] -= factorB * col[i];
    rDiagonal[k] = alpha;
  }

  let maxDiagonal = 0;
  let minDiagonal = Infinity;
  for (let k = 0; k < n; k++) {
    maxDiagonal = Math.max(maxDiagonal, Math.abs(rDiagonal[k]));
    minDiagonal = Math.min(minDiagonal, Math.abs(rDiagonal[k]));
  }
  const reciprocalConditionEstimate = minDiagonal / maxDiagonal;
  if (reciprocalConditionEstimate < 64 * Number.EPSILON * Math.max(m, n)) {
    throw new SingularMatrixError('the design matrix is rank deficient: some parameters cannot be separated by these data');
  }

  // R (upper triangle): R[i][j] = a[j][i] for i < j, rDiagonal on the diagonal.
  const r = (i: number, j: number) => (i === j ? rDiagonal[i] : a[j][i]);
  const scaledSolution = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = qtb[i];
    for (let j = i + 1; j < n; j++) s -= r(i, j) * scaledSolution[j];
    scaledSolution[i] = s / rDiagonal[i];
  }
  // R⁻¹ by back substitution, then (AᵀA)⁻¹ = D⁻¹ R⁻¹ R⁻ᵀ D⁻¹.
  const rInverse = zeros(n, n);
  for (let j = 0; j < n; j++) {
    rInverse[j][j] = 1 / rDiagonal[j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += r(i, k) * rInverse[k][j];
      rInverse[i][j] = -s / rDiagonal[i];
    }
  }
  const inverseNormalMatrix = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let s = 0;
      for (let k = j; k < n; k++) s += rInverse[i][k] * rInverse[j][k];
      const value = s / (columnScale[i] * columnScale[j]);
      inverseNormalMatrix[i][j] = value;
      inverseNormalMatrix[j][i] = value;
    }
  }
  const solution = scaledSolution.map((v, j) => v / columnScale[j]);
  const fitted = multiplyVector(design, solution);
  const residuals = fitted.map((f, i) => observations[i] - f);
  let residualSumOfSquares = 0;
  for (const e of residuals) residualSumOfSquares += e * e;
  return { solution, inverseNormalMatrix, residuals, residualSumOfSquares, reciprocalConditionEstimate };
}

export interface CholeskyFactor {
  /** Lower triangle L of the scaled matrix S·A·S = L·Lᵀ. */
  lower: Matrix;
  /** S = diag(1/√A_ii). */
  scale: number[];
}

/** Cholesky factor of a symmetric positive-definite matrix after diagonal (Jacobi) scaling. */
export function choleskyDecompose(matrix: Matrix): CholeskyFactor {
  const n = matrix.length;
  for (const row of matrix) invariant(row.length === n, 'choleskyDecompose: matrix is not square');
  const scale = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    if (!(matrix[i][i] > 0)) throw new SingularMatrixError(`diagonal element ${i + 1} is not positive, so the matrix is not positive definite`);
    scale[i] = 1 / Math.sqrt(matrix[i][i]);
  }
  const lower = zeros(n, n);
  for (let j = 0; j < n; j++) {
    let d = 1;
    for (let k = 0; k < j; k++) d -= lower[j][k] * lower[j][k];
    if (!(d > 64 * Number.EPSILON * n)) throw new SingularMatrixError('the matrix is singular or not positive definite');
    const ljj = Math.sqrt(d);
    lower[j][j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = matrix[i][j] * scale[i] * scale[j];
      for (let k = 0; k < j; k++) s -= lower[i][k] * lower[j][k];
      lower[i][j] = s / ljj;
    }
  }
  return { lower, scale };
}

/** Solves A·x = b for symmetric positive-definite A. */
export function solveSymmetricPositiveDefinite(matrix: Matrix, rightHandSide: ArrayLike<number>): number[] {
  const { lower, scale } = choleskyDecompose(matrix);
  const n = matrix.length;
  invariant(rightHandSide.length === n, 'solveSymmetricPositiveDefinite: right-hand side has the wrong length');
  // (S A S)(S⁻¹ x) = S b
  const y = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    let s = rightHandSide[i] * scale[i];
    for (let k = 0; k < i; k++) s -= lower[i][k] * y[k];
    y[i] = s / lower[i][i];
  }
  const z = new Array<number>(n);
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i];
    for (let k = i + 1; k < n; k++) s -= lower[k][i] * z[k];
    z[i] = s / lower[i][i];
  }
  return z.map((v, i) => v * scale[i]);
}

/** Inverse of a symmetric positive-definite matrix (symmetric result). */
export function invertSymmetricPositiveDefinite(matrix: Matrix): Matrix {
  const n = matrix.length;
  const columns: number[][] = [];
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0);
    e[j] = 1;
    columns.push(solveSymmetricPositiveDefinite(matrix, e));
  }
  const inverse = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const v = 0.5 * (columns[j][i] + columns[i][j]);
      inverse[i][j] = v;
      inverse[j][i] = v;
    }
  }
  return inverse;
}
