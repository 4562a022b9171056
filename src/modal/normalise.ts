/**
 * Mass normalisation of mode shapes (φᵀ M φ = 1) and their sign convention.
 *
 * Sign convention: each mode is turned so that its component of largest magnitude is positive.
 * Components within a relative {@link SIGN_TIE_TOLERANCE} of that magnitude count as tied (an
 * antisymmetric mode of a symmetric structure has two equal and opposite peaks), and the tied
 * component with the lowest DOF index decides. The comparison runs over all DOFs, rotations
 * included, as the shapes carry no units information here.
 */
import { ArgumentError } from '../errors';
import { symmetricMultiply, type SymmetricCsc } from '../linalg/sparse/symmetric';
import { dot } from './modes';

/** Relative tolerance under which two component magnitudes are treated as equal for the sign. */
export const SIGN_TIE_TOLERANCE = 1e-9;

/** Options of {@link massNormalise}. */
export interface MassNormaliseOptions {
  /** Apply the sign convention (largest component positive). @defaultValue true */
  orient?: boolean;
}

/** Defaults of {@link MassNormaliseOptions}. */
export const MASS_NORMALISE_DEFAULTS = { orient: true } as const;

/**
 * Turns each column of `vectors` so that its largest-magnitude component is positive (ties:
 * lowest index, see the module comment). In place.
 * @param vectors - column-major n × m mode shapes, modified
 * @param n - rows
 */
export function orientModes(vectors: Float64Array, n: number): void {
  const m = n > 0 ? vectors.length / n : 0;
  for (let j = 0; j < m; j++) {
    const o = j * n;
    let big = 0;
    for (let i = 0; i < n; i++) big = Math.max(big, Math.abs(vectors[o + i]));
    const cut = big * (1 - SIGN_TIE_TOLERANCE);
    let i = 0;
    while (i < n && Math.abs(vectors[o + i]) < cut) i++;
    if (i < n && vectors[o + i] < 0) for (let k = 0; k < n; k++) vectors[o + k] = -vectors[o + k];
  }
}

/**
 * Scales each mode shape to unit modal mass, φⱼᵀ M φⱼ = 1, and (by default) orients it. The
 * input is not modified. Scaling does not make distinct modes M-orthogonal: modes from a
 * symmetric eigensolver already are, except within a repeated eigenvalue.
 *
 * @param mass - M, n × n symmetric (kg, kg·m² on rotations), lower-stored
 * @param vectors - column-major n × m mode shapes (any scale)
 * @returns a new column-major n × m array of mass-normalised shapes, units kg^-½
 * @throws ArgumentError (path `vectors`) when the length is not a multiple of n; (path
 *   `modes[j]`) when φⱼᵀ M φⱼ is not positive and finite (a zero shape, or one that moves only
 *   massless DOFs)
 */
export function massNormalise(mass: SymmetricCsc, vectors: Float64Array, options: MassNormaliseOptions = {}): Float64Array {
  const opts = { ...MASS_NORMALISE_DEFAULTS, ...options };
  const n = mass.n;
  if (n === 0 ? vectors.length !== 0 : vectors.length % n !== 0) {
    throw new ArgumentError(`length ${vectors.length} is not a multiple of the matrix dimension ${n}; pass column-major n × m shapes`, 'vectors');
  }
  const m = n > 0 ? vectors.length / n : 0;
  const out = Float64Array.from(vectors);
  const mphi = new Float64Array(n);
  for (let j = 0; j < m; j++) {
    const phi = out.subarray(j * n, (j + 1) * n);
    symmetricMultiply(mass, phi, mphi);
    const mu = dot(phi, 0, mphi, 0, n);
    if (!(mu > 0) || !Number.isFinite(mu)) {
      throw new ArgumentError(`modal mass φᵀMφ = ${mu} is not positive; the shape is zero or moves only massless DOFs, and cannot be mass-normalised`, `modes[${j}]`);
    }
    const s = 1 / Math.sqrt(mu);
    for (let i = 0; i < n; i++) phi[i] *= s;
  }
  if (opts.orient) orientModes(out, n);
  return out;
}
