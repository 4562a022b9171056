/**
 * Checks shared by every eigensolver: relative residuals, M-orthonormality, mass
 * normalisation and the 1-norm of K. Operands may be a SymmetricCsc, an Operator, an ml-matrix
 * Matrix or a flat row-major `{ n, data }`. Mode shapes are column-major n × m Float64Arrays.
 */
import { AbstractMatrix } from 'ml-matrix';
import { ArgumentError, VerificationError } from '../errors';
import type { Operator } from '../linalg/operator';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';
import { dot, dotColumns, residualSquares } from './kernels';
import { matrixOperator, type BlockOperator } from './operators';
import type { DenseSymmetric } from './dense/input';

/** A symmetric matrix in any form the checks accept. */
export type SymmetricOperand = SymmetricCsc | Operator | DenseSymmetric | AbstractMatrix;

function isCsc(a: SymmetricOperand): a is SymmetricCsc {
  return (a as SymmetricCsc).colPtr instanceof Int32Array;
}
function isDense(a: SymmetricOperand): a is DenseSymmetric {
  return (a as DenseSymmetric).data instanceof Float64Array && !isCsc(a);
}

function flatOf(a: AbstractMatrix): DenseSymmetric {
  if (a.rows !== a.columns) throw new ArgumentError(`matrix is ${a.rows} × ${a.columns}; pass a square matrix`, 'matrix');
  const n = a.rows;
  const data = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) data[i * n + j] = a.get(i, j);
  return { n, data };
}

/** Wraps any operand as an Operator (y ← A x), converting ml-matrix once. */
export function asOperator(a: SymmetricOperand): Operator {
  if (isCsc(a)) return matrixOperator(a);
  if (AbstractMatrix.isMatrix(a)) return asOperator(flatOf(a));
  if (isDense(a)) {
    const { n, data } = a;
    return {
      n,
      apply(x, y) {
        for (let i = 0; i < n; i++) {
          const r = i * n;
          let s = 0;
          for (let j = 0; j < n; j++) s += data[r + j] * x[j];
          y[i] = s;
        }
      },
    };
  }
  if (typeof (a as Operator).apply === 'function' && Number.isInteger((a as Operator).n)) return a as Operator;
  throw new ArgumentError('is not a SymmetricCsc, Operator, ml-matrix Matrix or { n, data }; pass one of these', 'matrix');
}

/**
 * 1-norm of a symmetric matrix (= its ∞-norm): max over columns of Σᵢ |aᵢⱼ|.
 * Exact for SymmetricCsc (one pass over the stored lower triangle), dense and ml-matrix inputs;
 * for a bare Operator, Hager's estimate (Hager, SIAM J. Sci. Stat. Comput. 5, 1984; as given by
 * Higham, ACM TOMS 14, 1988, with Aᵀ = A), a lower bound that is
 * usually exact or within a small factor.
 * @returns ‖A‖₁ in A's units
 */
export function matrixNorm1(a: SymmetricOperand): number {
  if (isCsc(a)) {
    const col = new Float64Array(a.n);
    for (let j = 0; j < a.n; j++) {
      for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
        const i = a.rowIdx[p];
        const v = Math.abs(a.values[p]);
        col[j] += v;
        if (i !== j) col[i] += v;
      }
    }
    let m = 0;
    for (let j = 0; j < a.n; j++) if (col[j] > m) m = col[j];
    return m;
  }
  if (AbstractMatrix.isMatrix(a)) return matrixNorm1(flatOf(a));
  if (isDense(a)) {
    const { n, data } = a;
    const col = new Float64Array(n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) col[j] += Math.abs(data[i * n + j]);
    let m = 0;
    for (let j = 0; j < n; j++) if (col[j] > m) m = col[j];
    return m;
  }
  // ---- Hager's estimator on an Operator ----
  const op = asOperator(a);
  const n = op.n;
  if (n === 0) return 0;
  const x = new Float64Array(n).fill(1 / n);
  const y = new Float64Array(n);
  const xi = new Float64Array(n);
  const z = new Float64Array(n);
  let est = 0;
  for (let iter = 0; iter < 5; iter++) {
    op.apply(x, y);
    est = 0;
    for (let i = 0; i < n; i++) {
      est += Math.abs(y[i]);
      xi[i] = y[i] >= 0 ? 1 : -1; // ξ = sign(y)
    }
    op.apply(xi, z); // z = Aᵀ ξ = A ξ
    let jMax = 0;
    let zx = 0;
    for (let i = 0; i < n; i++) {
      if (Math.abs(z[i]) > Math.abs(z[jMax])) jMax = i;
      zx += z[i] * x[i];
    }
    if (Math.abs(z[jMax]) <= zx) break; // Hager's stopping test: x is a local maximum of ‖A x‖₁
    x.fill(0);
    x[jMax] = 1;
  }
  return est;
}

function checkModes(n: number, vectors: Float64Array, m: number, name: string): void {
  if (!Number.isInteger(m) || m < 0 || vectors.length < n * m) {
    throw new ArgumentError(`${m} modes of length ${n} need ${n * m} entries but vectors has ${vectors.length}; pass column-major n × m mode shapes`, name);
  }
}

/**
 * Relative residual of each eigenpair: ‖K x − λ M x‖₂ / (‖K‖₁ ‖x‖₂).
 * @param K - stiffness, n × n symmetric
 * @param M - mass, n × n symmetric
 * @param values - eigenvalues λ (rad²/s²), length m
 * @param vectors - mode shapes, column-major n × m
 * @param normK - ‖K‖₁; computed by {@link matrixNorm1} when omitted
 * @returns length m, dimensionless; 0 for a zero mode or a zero K with zero residual
 * @throws ArgumentError when the sizes disagree
 */
export function residuals(K: SymmetricOperand, M: SymmetricOperand, values: Float64Array, vectors: Float64Array, normK?: number): Float64Array {
  return checkPairs(K, M, values, vectors, normK, 'residuals').residuals;
}

/**
 * Residuals ({@link residuals}) and M-orthonormality error ({@link orthogonalityError}) of the
 * same modes in one pass: each mode's M·x serves both, so the pair costs m products with K and
 * m with M (not 2m with M). The values are those the two functions return, bit for bit.
 * @param K - stiffness, n × n symmetric
 * @param M - mass, n × n symmetric
 * @param values - eigenvalues λ (rad²/s²), length m
 * @param vectors - mode shapes, column-major n × m
 * @param normK - ‖K‖₁; computed by {@link matrixNorm1} when omitted
 * @param work - optional space for the products, ≥ {@link checkWorkLength}(n, m) entries (a
 *   solver passes memory it has already touched); allocated when omitted or too short
 * @returns residuals (length m, dimensionless) and orthogonalityError (max |ΦᵀMΦ − I|)
 * @throws ArgumentError when the sizes disagree
 */
export function modeChecks(K: SymmetricOperand, M: SymmetricOperand, values: Float64Array, vectors: Float64Array, normK?: number, work?: Float64Array): { residuals: Float64Array; orthogonalityError: number } {
  return checkPairs(K, M, values, vectors, normK, 'both', work);
}

/**
 * {@link modeChecks} of modes whose eigenvalues are first replaced by their Rayleigh quotients
 * λⱼ = xⱼᵀKxⱼ / xⱼᵀMxⱼ, from the same products with K and M: the λ that minimises each mode's
 * residual, accurate to the square of the vector's error (Parlett, The Symmetric Eigenvalue
 * Problem, §4.6 and §11.4). For the Ritz vectors of one Lanczos run, whose values σ + 1/θ can
 * lose digits on soft modes beside much stiffer members.
 * @param values - overwritten with the Rayleigh quotients (rad²/s²), length m (not re-sorted)
 * @param work - as for modeChecks
 * @returns residuals (with the new values) and orthogonalityError, as modeChecks
 */
export function rayleighModeChecks(K: SymmetricOperand, M: SymmetricOperand, values: Float64Array, vectors: Float64Array, normK?: number, work?: Float64Array): { residuals: Float64Array; orthogonalityError: number } {
  return checkPairs(K, M, values, vectors, normK, 'rayleigh', work);
}

/** Modes per block product in the checks (symmetricMultiplyMany takes four columns per pass). */
const CHECK_BLOCK = 4;

/** Entries of the `work` space the mode checks use for n-vectors and m modes. */
export function checkWorkLength(n: number, m: number): number {
  return 2 * n * Math.min(CHECK_BLOCK, m);
}

/**
 * Y ← A·X for k column-major vectors: in one call where the operator takes blocks (a sparse
 * matrix's operator reads A once per four vectors), else one vector at a time.
 */
function multiplyBlock(op: Operator, x: Float64Array, y: Float64Array, k: number, n: number): void {
  if (typeof (op as Partial<BlockOperator>).applyMany === 'function') (op as BlockOperator).applyMany(x, y, k);
  else for (let c = 0; c < k; c++) op.apply(x.subarray(c * n, (c + 1) * n), y.subarray(c * n, (c + 1) * n));
}

function checkPairs(
  K: SymmetricOperand,
  M: SymmetricOperand,
  values: Float64Array,
  vectors: Float64Array,
  normK: number | undefined,
  what: 'residuals' | 'both' | 'rayleigh',
  work?: Float64Array,
): { residuals: Float64Array; orthogonalityError: number } {
  const withOrthogonality = what !== 'residuals';
  const rayleigh = what === 'rayleigh';
  const kop = asOperator(K);
  const mop = asOperator(M);
  const n = kop.n;
  if (mop.n !== n) throw new ArgumentError(`M has dimension ${mop.n} but K has ${n}; pass matrices of one size`, 'M');
  const m = values.length;
  checkModes(n, vectors, m, 'vectors');
  const nk = normK ?? matrixNorm1(K);
  // Modes go through the products CHECK_BLOCK at a time (one pass over a sparse K or M serves
  // them all); each mode's checks then read its own columns.
  const block = Math.min(CHECK_BLOCK, m);
  const space = work && work.length >= checkWorkLength(n, m) ? work : new Float64Array(checkWorkLength(n, m));
  const kxs = space.subarray(0, n * block);
  const mxs = space.subarray(n * block, 2 * n * block);
  const h = new Float64Array(m);
  const out = new Float64Array(m);
  const sums = new Float64Array(2);
  let worst = 0;
  for (let j = 0; j < m; j++) {
    const q = j % block;
    if (q === 0) {
      const b = Math.min(block, m - j);
      const xs = vectors.subarray(j * n, (j + b) * n);
      multiplyBlock(kop, xs, kxs, b, n);
      multiplyBlock(mop, xs, mxs, b, n);
    }
    const x = vectors.subarray(j * n, (j + 1) * n);
    const kx = kxs.subarray(q * n, (q + 1) * n);
    const mx = mxs.subarray(q * n, (q + 1) * n);
    if (rayleigh) {
      const xmx = dot(x, mx, n);
      if (xmx > 0) values[j] = dot(x, kx, n) / xmx;
    }
    residualSquares(kx, mx, x, values[j], n, sums);
    const r2 = sums[0];
    const den = nk * Math.sqrt(sums[1]);
    out[j] = den > 0 ? Math.sqrt(r2) / den : Math.sqrt(r2);
    if (withOrthogonality) {
      dotColumns(vectors, n, 0, j + 1, mx, h);
      for (let i = 0; i <= j; i++) {
        const e = Math.abs(i === j ? h[i] - 1 : h[i]);
        if (e > worst || Number.isNaN(e)) worst = Number.isNaN(e) ? Infinity : e;
      }
    }
  }
  return { residuals: out, orthogonalityError: worst };
}

/**
 * Largest entry of |Φᵀ M Φ − I| over the first m modes.
 * @param M - mass, n × n symmetric
 * @param vectors - mode shapes, column-major n × m
 * @param m - number of modes
 * @returns dimensionless (0 for exactly M-orthonormal modes)
 */
export function orthogonalityError(M: SymmetricOperand, vectors: Float64Array, m: number): number {
  const op = asOperator(M);
  const n = op.n;
  checkModes(n, vectors, m, 'vectors');
  const w = new Float64Array(n);
  const h = new Float64Array(m);
  let worst = 0;
  for (let j = 0; j < m; j++) {
    op.apply(vectors.subarray(j * n, (j + 1) * n), w);
    // h_i = φᵢᵀ (M φⱼ), each a plain sequential sum (dotColumns blocks four columns per pass).
    dotColumns(vectors, n, 0, j + 1, w, h);
    for (let i = 0; i <= j; i++) {
      const e = Math.abs(i === j ? h[i] - 1 : h[i]);
      if (e > worst || Number.isNaN(e)) worst = Number.isNaN(e) ? Infinity : e;
    }
  }
  return worst;
}

