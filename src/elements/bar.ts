/**
 * Axial bar (truss member): two nodes, axial stiffness only, pinned ends.
 *
 * Local form: 2 × 2 over the axial displacements (u1, u2). Global forms: plane 4 × 4 over
 * (ux1, uy1, ux2, uy2) and space 6 × 6 over (ux1, uy1, uz1, ux2, uy2, uz2), row-major.
 *
 * Mass: the consistent matrix interpolates all translations linearly, so in global coordinates
 * it is ρAL/6 · [2I I; I 2I] (I the 2×2 or 3×3 identity): the same in every direction, which is
 * what carries the transverse inertia of a pin-ended member (Cook, Malkus, Plesha & Witt,
 * Concepts and Applications of Finite Element Analysis, 4th ed., chapter on mass matrices; from memory). The lumped matrix puts
 * half the member mass, ρAL/2, on each translation of each node.
 *
 * Units: E in Pa, A in m², density ρ in kg/m³, coordinates in m; stiffness in N/m, mass in kg.
 */
import { memberLength, positive, nonNegative } from './transform';

/** Local axial stiffness EA/L · [1 −1; −1 1], 2 × 2 row-major, N/m. */
export function barStiffnessLocal(E: number, A: number, L: number, out?: Float64Array): Float64Array {
  const k = (positive(E, 'E') * positive(A, 'A')) / positive(L, 'L');
  const o = out ?? new Float64Array(4);
  o[0] = k; o[1] = -k; o[2] = -k; o[3] = k;
  return o;
}

/** Local axial consistent mass ρAL/6 · [2 1; 1 2], 2 × 2 row-major, kg. */
export function barConsistentMassLocal(density: number, A: number, L: number, out?: Float64Array): Float64Array {
  const m = (nonNegative(density, 'density') * positive(A, 'A') * positive(L, 'L')) / 6;
  const o = out ?? new Float64Array(4);
  o[0] = 2 * m; o[1] = m; o[2] = m; o[3] = 2 * m;
  return o;
}

/** Local axial lumped mass ρAL/2 · I₂, 2 × 2 row-major, kg. */
export function barLumpedMassLocal(density: number, A: number, L: number, out?: Float64Array): Float64Array {
  const m = (nonNegative(density, 'density') * positive(A, 'A') * positive(L, 'L')) / 2;
  const o = out ?? new Float64Array(4);
  o[0] = m; o[1] = 0; o[2] = 0; o[3] = m;
  return o;
}

// Global stiffness EA/L · [ccᵀ −ccᵀ; −ccᵀ ccᵀ], c the unit member vector, d = dimension.
function barStiffnessGlobal(E: number, A: number, c: number[], L: number, d: number, out?: Float64Array): Float64Array {
  const n = 2 * d;
  const o = out ?? new Float64Array(n * n);
  const k = (positive(E, 'E') * positive(A, 'A')) / L;
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      const v = k * c[i] * c[j];
      o[i * n + j] = v;
      o[(i + d) * n + j + d] = v;
      o[i * n + j + d] = -v;
      o[(i + d) * n + j] = -v;
    }
  }
  return o;
}

// Global mass: consistent ρAL/6 [2I I; I 2I] or lumped ρAL/2 I (both rotation invariant).
function barMassGlobal(density: number, A: number, L: number, d: number, diag: number, off: number, out?: Float64Array): Float64Array {
  const n = 2 * d;
  const o = out ?? new Float64Array(n * n);
  o.fill(0, 0, n * n);
  const m = nonNegative(density, 'density') * positive(A, 'A') * L;
  for (let i = 0; i < d; i++) {
    o[i * n + i] = m * diag;
    o[(i + d) * n + i + d] = m * diag;
    o[i * n + i + d] = m * off;
    o[(i + d) * n + i] = m * off;
  }
  return o;
}

const c2 = [0, 0];
const c3 = [0, 0, 0];

/**
 * Plane bar stiffness in global axes, 4 × 4 over (ux1, uy1, ux2, uy2), N/m.
 * @param dx - x₂ − x₁, m; @param dy - y₂ − y₁, m. Throws ArgumentError on zero length.
 */
export function barStiffnessPlane(E: number, A: number, dx: number, dy: number, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, 0);
  c2[0] = dx / L; c2[1] = dy / L;
  return barStiffnessGlobal(E, A, c2, L, 2, out);
}

/** Plane bar consistent mass, 4 × 4 over (ux1, uy1, ux2, uy2), kg: ρAL/6 · [2I I; I 2I]. */
export function barConsistentMassPlane(density: number, A: number, dx: number, dy: number, out?: Float64Array): Float64Array {
  return barMassGlobal(density, A, memberLength(dx, dy, 0), 2, 1 / 3, 1 / 6, out);
}

/** Plane bar lumped mass, 4 × 4 diagonal ρAL/2 on every translation, kg. */
export function barLumpedMassPlane(density: number, A: number, dx: number, dy: number, out?: Float64Array): Float64Array {
  return barMassGlobal(density, A, memberLength(dx, dy, 0), 2, 1 / 2, 0, out);
}

/**
 * Space bar stiffness in global axes, 6 × 6 over (ux1, uy1, uz1, ux2, uy2, uz2), N/m.
 * @param dx - x₂ − x₁, m (likewise dy, dz). Throws ArgumentError on zero length.
 */
export function barStiffnessSpace(E: number, A: number, dx: number, dy: number, dz: number, out?: Float64Array): Float64Array {
  const L = memberLength(dx, dy, dz);
  c3[0] = dx / L; c3[1] = dy / L; c3[2] = dz / L;
  return barStiffnessGlobal(E, A, c3, L, 3, out);
}

/** Space bar consistent mass, 6 × 6, kg: ρAL/6 · [2I I; I 2I]. */
export function barConsistentMassSpace(density: number, A: number, dx: number, dy: number, dz: number, out?: Float64Array): Float64Array {
  return barMassGlobal(density, A, memberLength(dx, dy, dz), 3, 1 / 3, 1 / 6, out);
}

/** Space bar lumped mass, 6 × 6 diagonal ρAL/2 on every translation, kg. */
export function barLumpedMassSpace(density: number, A: number, dx: number, dy: number, dz: number, out?: Float64Array): Float64Array {
  return barMassGlobal(density, A, memberLength(dx, dy, dz), 3, 1 / 2, 0, out);
}
