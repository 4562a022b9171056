/**
 * Point mass at a node: translational mass m (kg) on each translation and an optional rotary
 * inertia (kg·m²) on each rotation, the same about every axis (a sphere-like lumped inertia).
 */
import { ArgumentError } from '../errors';

/**
 * Diagonal of a point mass over a node's DOFs, kg and kg·m².
 * @param mass - translational mass, kg, ≥ 0
 * @param inertia - rotary inertia, kg·m², ≥ 0 @defaultValue 0
 * @param space - "plane" → (ux, uy, rz), length 3; "space" → (ux, uy, uz, rx, ry, rz), length 6
 */
export function pointMassDiagonal(mass: number, inertia: number, space: 'plane' | 'space', out?: Float64Array): Float64Array {
  if (!(mass >= 0) || !Number.isFinite(mass)) throw new ArgumentError(`mass is ${mass}; it must be a finite number ≥ 0 (kg)`, 'mass');
  if (!(inertia >= 0) || !Number.isFinite(inertia)) throw new ArgumentError(`inertia is ${inertia}; it must be a finite number ≥ 0 (kg·m²)`, 'inertia');
  if (space === 'plane') {
    const o = out ?? new Float64Array(3);
    o[0] = mass; o[1] = mass; o[2] = inertia;
    return o;
  }
  const o = out ?? new Float64Array(6);
  o[0] = mass; o[1] = mass; o[2] = mass; o[3] = inertia; o[4] = inertia; o[5] = inertia;
  return o;
}
