/**
 * Conversion of the accepted matrix forms (SymmetricCsc, ml-matrix, flat row-major) to one flat
 * row-major Float64Array, with the validation every dense solver needs.
 */
import { AbstractMatrix } from 'ml-matrix';
import { ArgumentError } from '../../errors';
import type { SymmetricCsc } from '../../linalg/sparse/symmetric';

/** A dense symmetric n × n matrix stored row-major in one Float64Array of length n². */
export interface DenseSymmetric {
  /** Dimension n. */
  readonly n: number;
  /** Row-major entries, length n², entry (i, j) at i·n + j. */
  readonly data: Float64Array;
}

/** Any matrix form the dense solvers accept. */
export type DenseEigenInput = SymmetricCsc | AbstractMatrix | DenseSymmetric;

/**
 * Relative tolerance of the symmetry check on dense inputs: |aᵢⱼ − aⱼᵢ| ≤ tol · max |a|.
 * @defaultValue 1e-12
 */
export const SYMMETRY_TOLERANCE = 1e-12;

function isCsc(a: unknown): a is SymmetricCsc {
  return typeof a === 'object' && a !== null && (a as SymmetricCsc).colPtr instanceof Int32Array;
}

function isFlat(a: unknown): a is DenseSymmetric {
  return typeof a === 'object' && a !== null && (a as DenseSymmetric).data instanceof Float64Array;
}

/**
 * Copies a matrix to a fresh row-major Float64Array (the input is never modified).
 * Dense inputs are checked for symmetry and then symmetrised exactly (average of the two
 * triangles) so that later kernels may read either triangle.
 * @param a - the matrix
 * @param name - its name in error paths (`K`, `M`)
 * @throws ArgumentError (path `name`, or `name(i, j)` for one entry) when the matrix is not
 *   square, not symmetric, has a non-finite entry, or is not one of the accepted forms
 */
export function toDenseSymmetric(a: DenseEigenInput, name: string): DenseSymmetric {
  let n: number;
  let data: Float64Array;
  if (isCsc(a)) {
    n = a.n;
    if (!Number.isInteger(n) || n < 0 || a.colPtr.length !== n + 1) {
      throw new ArgumentError(`sparse matrix has n = ${n} and ${a.colPtr.length} column pointers; colPtr must have length n + 1`, name);
    }
    data = new Float64Array(n * n);
    for (let j = 0; j < n; j++) {
      for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
        const i = a.rowIdx[p];
        const v = a.values[p];
        if (!(i >= j && i < n)) {
          throw new ArgumentError(`stored entry ${p} has row ${i} in column ${j}; lower-triangle storage needs ${j} ≤ row < ${n}`, `${name}(${i}, ${j})`);
        }
        if (!Number.isFinite(v)) {
          throw new ArgumentError(`entry is ${v}; every entry must be a finite number`, `${name}(${i}, ${j})`);
        }
        data[i * n + j] += v;
        if (i !== j) data[j * n + i] += v;
      }
    }
    return { n, data };
  }
  if (AbstractMatrix.isMatrix(a)) {
    if (a.rows !== a.columns) {
      throw new ArgumentError(`matrix is ${a.rows} × ${a.columns}; pass a square matrix`, name);
    }
    n = a.rows;
    data = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) data[i * n + j] = a.get(i, j);
  } else if (isFlat(a)) {
    n = a.n;
    if (!Number.isInteger(n) || n < 0) {
      throw new ArgumentError(`dimension n = ${n} is not a non-negative integer; pass the matrix size`, `${name}.n`);
    }
    if (a.data.length !== n * n) {
      throw new ArgumentError(`has ${a.data.length} entries but n = ${n} needs n² = ${n * n}; pass a square row-major array`, `${name}.data`);
    }
    data = new Float64Array(a.data);
  } else {
    throw new ArgumentError('is not a SymmetricCsc, an ml-matrix Matrix or { n, data: Float64Array }; pass one of these', name);
  }
  // Finite entries, symmetry, then exact symmetrisation.
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = data[i * n + j];
      if (!Number.isFinite(v)) throw new ArgumentError(`entry is ${v}; every entry must be a finite number`, `${name}(${i}, ${j})`);
      const av = Math.abs(v);
      if (av > maxAbs) maxAbs = av;
    }
  }
  const tol = SYMMETRY_TOLERANCE * maxAbs;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const lo = data[i * n + j];
      const up = data[j * n + i];
      if (Math.abs(lo - up) > tol) {
        throw new ArgumentError(`matrix is not symmetric: (${i}, ${j}) = ${lo} but (${j}, ${i}) = ${up}; pass a symmetric matrix`, `${name}(${i}, ${j})`);
      }
      const s = 0.5 * (lo + up);
      data[i * n + j] = s;
      data[j * n + i] = s;
    }
  }
  return { n, data };
}
