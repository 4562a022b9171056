/**
 * Linear springs along one DOF: grounded (1 × 1, k) or between two nodes (2 × 2,
 * k · [1 −1; −1 1] over the same DOF of both nodes). k in N/m on translations, N·m/rad on
 * rotations.
 */
import { positive } from './transform';

/** Grounded spring stiffness, 1 × 1. */
export function groundedSpringStiffness(k: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(1);
  o[0] = positive(k, 'stiffness');
  return o;
}

/** Two-node spring stiffness k · [1 −1; −1 1], 2 × 2 row-major over (dof at node 1, dof at node 2). */
export function twoNodeSpringStiffness(k: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(4);
  positive(k, 'stiffness');
  o[0] = k; o[1] = -k; o[2] = -k; o[3] = k;
  return o;
}
