/**
 * Static condensation of massless DOFs (Guyan reduction, which is exact for DOFs that carry no
 * mass): Bathe, Finite Element Procedures (1996), §10.3.1 (static condensation).
 *
 *   K* = K_mm − K_m0 K_00⁻¹ K_0m,   K* x_m = λ M_mm x_m,   x_0 = −K_00⁻¹ K_0m x_m.
 *
 * A DOF is massless when its diagonal mass is zero and its row of M is zero up to underflow
 * (|M_ij| ≤ ε · max diagonal). The eigenvalues of those DOFs are infinite and are never
 * returned. A singular M without such rows is handled by nullmass.ts.
 */
import { FactorizationError } from '../../errors';
import type { DenseSymmetric } from './input';

/** Pivot threshold of the LDLᵀ of K_00, relative to max |K_00 diagonal|. @defaultValue 1e-13 */
export const CONDENSE_PIVOT_TOLERANCE = 1e-13;

/** The reduced problem on the massive DOFs and what is needed to recover the massless ones. */
export interface Condensed {
  /** Full dimension n. */
  readonly n: number;
  /** Original indices of the massive DOFs, ascending, length nm. */
  readonly massive: Int32Array;
  /** Original indices of the massless DOFs, ascending, length n0. */
  readonly massless: Int32Array;
  /** Condensed stiffness K*, row-major nm × nm. */
  readonly k: Float64Array;
  /** Mass of the massive DOFs M_mm, row-major nm × nm. */
  readonly m: Float64Array;
  /** Z = K_00⁻¹ K_0m, row-major n0 × nm, so that x_0 = −Z x_m. */
  readonly z: Float64Array;
}

/**
 * Splits DOFs by mass and condenses out the massless ones.
 * @param K - stiffness, n × n symmetric row-major (N/m, N·m/rad on rotations)
 * @param M - mass, n × n symmetric positive semidefinite row-major (kg, kg·m² on rotations)
 * @throws FactorizationError (path `row i`, i the original DOF index) when a DOF has a zero or
 *   negative diagonal mass but a nonzero row (M indefinite), or when K_00 is singular (a
 *   massless DOF with no stiffness of its own: a mechanism)
 */
export function condenseMassless(K: DenseSymmetric, M: DenseSymmetric): Condensed {
  const n = K.n;
  const kd = K.data;
  const md = M.data;
  // ---- classify DOFs ----
  // A coupling below ε · max diagonal next to a zero diagonal is underflow, not mass: the
  // global lumped torsional inertia ρIₚL/2 · x xᵀ of a member whose direction x has a component
  // near 1e-162 gets x_z² = 0 but x_y·x_z ≠ 0. Such a DOF is massless (the neglected entry
  // changes M by less than round-off).
  let diagMax = 0;
  for (let i = 0; i < n; i++) diagMax = Math.max(diagMax, md[i * n + i]);
  const negligible = Number.EPSILON * diagMax;
  const isMassless = new Uint8Array(n);
  let n0 = 0;
  for (let i = 0; i < n; i++) {
    const row = i * n;
    let offMax = 0;
    let offAt = -1;
    for (let j = 0; j < n; j++) {
      const v = Math.abs(md[row + j]);
      if (j !== i && v > offMax) {
        offMax = v;
        offAt = j;
      }
    }
    const mii = md[row + i];
    if (mii === 0 && offMax <= negligible) {
      isMassless[i] = 1;
      n0++;
    } else if (mii < 0) {
      throw new FactorizationError(`DOF ${i} has negative mass M(${i}, ${i}) = ${mii}; M must be positive semidefinite: correct the mass of this DOF`, `row ${i}`);
    } else if (mii === 0) {
      throw new FactorizationError(
        `DOF ${i} has zero diagonal mass but M(${i}, ${offAt}) = ${md[row + offAt]}, so M is indefinite; give the DOF a positive diagonal mass or remove its coupling mass to make it massless`,
        `row ${i}`,
      );
    }
  }
  const nm = n - n0;
  const massive = new Int32Array(nm);
  const massless = new Int32Array(n0);
  for (let i = 0, a = 0, b = 0; i < n; i++) {
    if (isMassless[i]) massless[b++] = i;
    else massive[a++] = i;
  }
  if (n0 === 0) return { n, massive, massless, k: kd, m: md, z: new Float64Array(0) };

  // ---- gather blocks ----
  const k00 = new Float64Array(n0 * n0);
  const z = new Float64Array(n0 * nm); // K_0m, then overwritten by Z
  const k = new Float64Array(nm * nm);
  const m = new Float64Array(nm * nm);
  for (let a = 0; a < n0; a++) {
    const row = massless[a] * n;
    for (let b = 0; b < n0; b++) k00[a * n0 + b] = kd[row + massless[b]];
    for (let b = 0; b < nm; b++) z[a * nm + b] = kd[row + massive[b]];
  }
  for (let a = 0; a < nm; a++) {
    const row = massive[a] * n;
    for (let b = 0; b < nm; b++) {
      k[a * nm + b] = kd[row + massive[b]];
      m[a * nm + b] = md[row + massive[b]];
    }
  }

  // ---- LDLᵀ of K_00 without pivoting (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 4.1.2) ----
  let dMax = 0;
  for (let a = 0; a < n0; a++) dMax = Math.max(dMax, Math.abs(k00[a * n0 + a]));
  const tol = CONDENSE_PIVOT_TOLERANCE * dMax;
  const d = new Float64Array(n0);
  const w = new Float64Array(n0);
  for (let j = 0; j < n0; j++) {
    const rj = j * n0;
    for (let p = 0; p < j; p++) w[p] = k00[rj + p] * d[p]; // w = L(j, 0:j) ∘ d
    let dj = k00[rj + j];
    for (let p = 0; p < j; p++) dj -= k00[rj + p] * w[p];
    if (!(Math.abs(dj) > tol)) {
      throw new FactorizationError(
        `massless DOF ${massless[j]} has no stiffness once the other massless DOFs are eliminated (pivot ${dj.toExponential(3)}); ` +
          'K restricted to the massless DOFs is singular (a mechanism without mass): add stiffness (a support, spring or member) or mass at this DOF',
        `row ${massless[j]}`,
      );
    }
    d[j] = dj;
    for (let i = j + 1; i < n0; i++) {
      const ri = i * n0;
      let s = k00[ri + j];
      for (let p = 0; p < j; p++) s -= k00[ri + p] * w[p];
      k00[ri + j] = s / dj;
    }
  }

  // ---- Z = K_00⁻¹ K_0m: forward, diagonal, backward; row-oriented axpys ----
  for (let i = 0; i < n0; i++) {
    const zi = i * nm;
    for (let p = 0; p < i; p++) {
      const l = k00[i * n0 + p];
      if (l === 0) continue;
      const zp = p * nm;
      for (let b = 0; b < nm; b++) z[zi + b] -= l * z[zp + b];
    }
  }
  for (let i = 0; i < n0; i++) {
    const inv = 1 / d[i];
    const zi = i * nm;
    for (let b = 0; b < nm; b++) z[zi + b] *= inv;
  }
  for (let i = n0 - 1; i >= 0; i--) {
    const zi = i * nm;
    for (let p = i + 1; p < n0; p++) {
      const l = k00[p * n0 + i];
      if (l === 0) continue;
      const zp = p * nm;
      for (let b = 0; b < nm; b++) z[zi + b] -= l * z[zp + b];
    }
  }

  // ---- K* = K_mm − K_m0 Z ----
  for (let i = 0; i < n0; i++) {
    const row0 = massless[i] * n;
    const zi = i * nm;
    for (let a = 0; a < nm; a++) {
      const c = kd[row0 + massive[a]];
      if (c === 0) continue;
      const ka = a * nm;
      for (let b = 0; b < nm; b++) k[ka + b] -= c * z[zi + b];
    }
  }
  for (let a = 0; a < nm; a++) {
    for (let b = 0; b < a; b++) {
      const s = 0.5 * (k[a * nm + b] + k[b * nm + a]);
      k[a * nm + b] = s;
      k[b * nm + a] = s;
    }
  }
  return { n, massive, massless, k, m, z };
}

/**
 * Expands modes of the reduced problem to all n DOFs: x_m in place, x_0 = −Z x_m.
 * @param c - the condensation
 * @param xm - reduced modes, column-major nm × count
 * @param count - number of modes
 * @returns full modes, column-major n × count
 */
export function expandModes(c: Condensed, xm: Float64Array, count: number): Float64Array {
  const { n, massive, massless, z } = c;
  const nm = massive.length;
  const n0 = massless.length;
  if (n0 === 0) return xm;
  const x = new Float64Array(n * count);
  for (let j = 0; j < count; j++) {
    const src = j * nm;
    const dst = j * n;
    for (let a = 0; a < nm; a++) x[dst + massive[a]] = xm[src + a];
    for (let i = 0; i < n0; i++) {
      const zi = i * nm;
      let s = 0;
      for (let b = 0; b < nm; b++) s += z[zi + b] * xm[src + b];
      x[dst + massless[i]] = -s;
    }
  }
  return x;
}
