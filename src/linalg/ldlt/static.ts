import { ArgumentError } from '../../errors';
import type { SymmetricCsc } from '../sparse/symmetric';
import { analyse } from './analyse';
import { factorizeNamed } from './factorize';

/**
 * Linear static solve K u = f by sparse LDLᵀ (analyse → factorize → solve in one call).
 * @param K - stiffness, symmetric n × n, lower triangle in CSC (N/m, N·m/rad)
 * @param f - load vector, length n (N, N·m)
 * @returns displacements u, length n (m, rad)
 * @throws ArgumentError when f's length differs from n or K is malformed
 * @throws FactorizationError (path `row <index>`) when K is singular: the structure is a
 *   mechanism at that DOF (missing support or released connection)
 */
export function solveStatic(K: SymmetricCsc, f: Float64Array): Float64Array {
  if (f.length !== K.n) throw new ArgumentError(`load vector has length ${f.length}, expected ${K.n}; give one load per DOF`, 'f');
  const fac = factorizeNamed(analyse(K), K.values, {}, 'K');
  const u = new Float64Array(K.n);
  fac.solve(f, u);
  return u;
}
