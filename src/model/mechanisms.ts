/**
 * Mechanism detection: free DOFs that no element or spring stiffens.
 *
 * Test used, node by node: take the block B of K over the node's own free DOFs. K is positive
 * semi-definite, so any x with xᵀ B x = 0 (x living on that node only) has K x = 0: a motion of
 * that node alone that costs no energy. A zero diagonal entry is the plain case (a DOF that
 * nothing touches); a singular B also catches e.g. the transverse motion of a node held only by
 * collinear bars. B is scaled to unit diagonal first (D^-½ B D^-½), so the test does not
 * depend on units; its eigenvalues come from a cyclic Jacobi sweep (Golub & Van Loan, Matrix
 * Computations, 4th ed., ch. 8, Jacobi methods). Mechanisms that involve several nodes at once (e.g. a
 * four-bar linkage) are not local and are left to the solver's zero eigenvalues.
 */
import { ArgumentError, ModelError } from '../errors';
import type { AssembledModel, DofName } from './types';

/** A free DOF found to be unstiffened. */
export interface Mechanism {
  /** Node id. */
  readonly node: string;
  /** Index of the node in model.nodes. */
  readonly nodeIndex: number;
  /** The DOF (for a combined motion, the DOF that dominates it). */
  readonly dof: DofName;
  /** Free DOF index in the assembled system. */
  readonly index: number;
}

export interface MechanismOptions {
  /**
   * An eigenvalue of the unit-diagonal nodal block below this counts as zero; a diagonal entry
   * below this times the largest diagonal of K counts as zero. @defaultValue 1e-9
   */
  tolerance?: number;
}
export const MECHANISM_DEFAULTS = { tolerance: 1e-9 } as const;

/**
 * Lists the free DOFs that no element or spring stiffens (see the file header for the test).
 * @param asm - an assembled model
 * @returns one entry per zero-energy nodal motion, in DOF order; empty when there is none
 */
export function findMechanisms(asm: AssembledModel, options: MechanismOptions = {}): Mechanism[] {
  const { tolerance } = { ...MECHANISM_DEFAULTS, ...options };
  if (!(tolerance > 0 && tolerance < 1)) throw new ArgumentError(`tolerance is ${tolerance}; give a number in (0, 1)`, 'tolerance');
  const K = asm.stiffness;
  const { colPtr, rowIdx, values } = K;
  const dofs = asm.dofs;
  const n = K.n;
  let maxDiag = 0;
  const diag = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) if (rowIdx[p] === j) diag[j] = values[p];
    if (diag[j] > maxDiag) maxDiag = diag[j];
  }
  const found: Mechanism[] = [];
  const B = new Float64Array(36);
  const V = new Float64Array(36);
  const live = new Int32Array(6);
  let start = 0;
  while (start < n) {
    let end = start + 1;
    while (end < n && dofs[end].nodeIndex === dofs[start].nodeIndex) end++;
    // Zero diagonals first; the rest form the block.
    let m = 0;
    for (let j = start; j < end; j++) {
      if (!(diag[j] > tolerance * maxDiag)) found.push(entry(asm, j));
      else live[m++] = j;
    }
    if (m > 1) {
      for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) B[a * m + b] = a === b ? 1 : 0;
      for (let a = 0; a < m; a++) {
        const j = live[a];
        for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
          const i = rowIdx[p];
          if (i >= end) break;
          for (let b = a + 1; b < m; b++) {
            if (live[b] === i) {
              const v = values[p] / Math.sqrt(diag[i] * diag[j]);
              B[a * m + b] = v;
              B[b * m + a] = v;
            }
          }
        }
      }
      jacobi(B, V, m);
      for (let k = 0; k < m; k++) {
        if (B[k * m + k] < tolerance) {
          let best = 0;
          for (let a = 1; a < m; a++) if (Math.abs(V[a * m + k]) > Math.abs(V[best * m + k])) best = a;
          found.push(entry(asm, live[best]));
        }
      }
    }
    start = end;
  }
  found.sort((p, q) => p.index - q.index);
  return found;
}

function entry(asm: AssembledModel, j: number): Mechanism {
  const d = asm.dofs[j];
  return { node: d.node, nodeIndex: d.nodeIndex, dof: d.dof, index: j };
}

/** Cyclic Jacobi on the symmetric m × m row-major A (m ≤ 6): A → diag(λ), V → eigenvectors (columns). */
function jacobi(A: Float64Array, V: Float64Array, m: number): void {
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) V[a * m + b] = a === b ? 1 : 0;
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0;
    for (let p = 0; p < m; p++) for (let q = p + 1; q < m; q++) off += A[p * m + q] ** 2;
    if (off < 1e-30) return;
    for (let p = 0; p < m; p++) {
      for (let q = p + 1; q < m; q++) {
        const apq = A[p * m + q];
        if (apq === 0) continue;
        const theta = (A[q * m + q] - A[p * m + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < m; k++) {
          const akp = A[k * m + p];
          const akq = A[k * m + q];
          A[k * m + p] = c * akp - s * akq;
          A[k * m + q] = s * akp + c * akq;
        }
        for (let k = 0; k < m; k++) {
          const apk = A[p * m + k];
          const aqk = A[q * m + k];
          A[p * m + k] = c * apk - s * aqk;
          A[q * m + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < m; k++) {
          const vkp = V[k * m + p];
          const vkq = V[k * m + q];
          V[k * m + p] = c * vkp - s * vkq;
          V[k * m + q] = s * vkp + c * vkq;
        }
      }
    }
  }
}

/**
 * Throws a ModelError when findMechanisms finds anything, listing up to 10 DOFs, e.g.
 * `node "n4" dof rz is not stiffened by any element or spring; fix it in "supports" or connect it`.
 * The path is `nodes[i]` of the first node found.
 */
export function assertNoMechanism(asm: AssembledModel, options: MechanismOptions = {}): void {
  const found = findMechanisms(asm, options);
  if (found.length === 0) return;
  const shown = found.slice(0, 10).map((f) => `node "${f.node}" dof ${f.dof}`);
  const more = found.length > 10 ? ` and ${found.length - 10} more` : '';
  const verb = found.length === 1 ? 'is' : 'are';
  throw new ModelError(
    `${shown.join(', ')}${more} ${verb} not stiffened by any element or spring (a mechanism); fix ${found.length === 1 ? 'it' : 'them'} in "supports" or connect ${found.length === 1 ? 'it' : 'them'}`,
    `nodes[${found[0].nodeIndex}]`,
  );
}
