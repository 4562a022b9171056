/**
 * What-if redesign: scale the stiffness and/or mass of member groups, re-solve, and compare the
 * modes with the original ones.
 *
 * The changed matrices keep the original sparsity pattern: each member's k_e and m_e (global
 * axes, sensitivity.ts `elementMatrices`) are added, times (scale − 1), into the entries the
 * member already occupies. So the analysis of the union pattern of K and M (analyse → factorize
 * → solve, STYLE §2) is done once and reused by every variant through `solve`'s `symbolic`
 * option. Scaling a member's stiffness by α is the same as scaling its E (and G) by α; scaling
 * its mass by β the same as scaling its density.
 *
 * Each variant's modes are matched to the original ones by the modal assurance criterion with
 * the new mass matrix, MAC = (φᵢᵀMφⱼ)² / ((φᵢᵀMφᵢ)(φⱼᵀMφⱼ)) (Allemang & Brown 1982, "A correlation
 * coefficient for modal vector analysis"), and the first-order prediction
 * Δλ ≈ Σ (α − 1) dλ/dα + (β − 1) dλ/dβ (Fox & Kapoor 1968) is reported beside the re-solve.
 */
import { solve } from '../eigen/solve';
import { ArgumentError } from '../errors';
import { analyse } from '../linalg/ldlt/analyse';
import type { SymbolicFactor } from '../linalg/ldlt/types';
import { symmetricMultiply, unionPattern, type SymmetricCsc } from '../linalg/sparse/symmetric';
import { assertNoMechanism } from '../model/mechanisms';
import type { AssembledModel } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import type { ModalAnalysisOptions } from './analysis';
import { elementMatrices } from '../model/element-matrices';
import { eigenvalueSensitivity, resolveGroup, type MemberGroup } from './sensitivity';
import { summariseModes } from './summary';

/** One change of a design variant. */
export interface DesignChange {
  /** The members changed. */
  readonly group: MemberGroup;
  /** Factor on the members' stiffness (as on E and G), > 0. @defaultValue 1 */
  readonly stiffnessScale?: number;
  /** Factor on the members' mass (as on the density), ≥ 0. @defaultValue 1 */
  readonly massScale?: number;
}

/** A change with its group resolved and its defaults filled in. */
export interface ResolvedChange {
  readonly name: string;
  readonly elements: readonly number[];
  readonly stiffnessScale: number;
  readonly massScale: number;
}

/** Options of {@link whatIf}. */
export interface WhatIfOptions extends Omit<ModalAnalysisOptions, 'symbolic' | 'range' | 'near'> {
  /** Modes of the variant, lowest first. @defaultValue as many as the original analysis has */
  count?: number;
  /** A frequency band [low, high] in Hz: report which modes lie in it before and after. @defaultValue none */
  band?: readonly [number, number];
  /**
   * Analysis of the union pattern of the original K and M, from {@link whatIfSymbolic} or a
   * previous result's `symbolic`. @defaultValue analysed here (once per call)
   */
  symbolic?: SymbolicFactor;
}

/** A mode of the variant compared with the original. */
export interface ModeShift {
  /** Mode number of the variant, 1 = lowest. */
  readonly mode: number;
  /** Frequency of the variant, Hz. */
  readonly frequency: number;
  /** Original mode it matches best (1-based, by MAC), or 0 when none of the original modes was computed. */
  readonly matches: number;
  /** MAC with that original mode, 0..1. */
  readonly mac: number;
  /** Frequency of the matched original mode, Hz (NaN when matches = 0). */
  readonly before: number;
  /** First-order prediction of this frequency from the original mode's sensitivities, Hz (NaN when matches = 0). */
  readonly predicted: number;
}

/** Outcome of {@link whatIf}. */
export interface WhatIfResult {
  /** The changes as applied. */
  readonly changes: readonly ResolvedChange[];
  /** Modal analysis of the variant (its `assembled` holds the changed K and M; `assembled.model` is the original description). */
  readonly analysis: ModalAnalysis;
  /** Each variant mode against the original. */
  readonly comparison: readonly ModeShift[];
  /** With `band`: mode numbers inside [low, high] Hz before (original) and after (variant). */
  readonly band?: { readonly low: number; readonly high: number; readonly before: readonly number[]; readonly after: readonly number[] };
  /** The pattern analysis used, for the next variant. */
  readonly symbolic: SymbolicFactor;
}

/**
 * Analysis of the union pattern of an assembled model's K and M, to share across variants.
 * @param asm - the assembled model
 */
export function whatIfSymbolic(asm: AssembledModel): SymbolicFactor {
  return analyse(unionPattern(asm.stiffness, asm.mass).pattern);
}

/**
 * K and M of a design variant on the original patterns.
 * @param asm - the original assembled model
 * @param changes - the changes
 * @returns an AssembledModel sharing asm's model, DOFs, coordinates and patterns, with new values
 * @throws ArgumentError (path `changes[i]…`) for an unknown group member or a scale out of range
 */
export function scaledModel(asm: AssembledModel, changes: readonly DesignChange[]): { assembled: AssembledModel; changes: ResolvedChange[] } {
  const resolved = resolveChanges(asm, changes);
  const kv = asm.stiffness.values.slice();
  const mv = asm.mass.values.slice();
  for (const c of resolved) {
    const da = c.stiffnessScale - 1;
    const db = c.massScale - 1;
    for (const k of c.elements) {
      const em = elementMatrices(asm, k);
      if (da !== 0) scatterInto(asm.stiffness, kv, em.stiffness, em.dofs, em.size, da);
      if (db !== 0) scatterInto(asm.mass, mv, em.mass, em.dofs, em.size, db);
    }
  }
  const stiffness: SymmetricCsc = { n: asm.stiffness.n, colPtr: asm.stiffness.colPtr, rowIdx: asm.stiffness.rowIdx, values: kv };
  const mass: SymmetricCsc = { n: asm.mass.n, colPtr: asm.mass.colPtr, rowIdx: asm.mass.rowIdx, values: mv };
  return { assembled: { ...asm, stiffness, mass }, changes: resolved };
}

function resolveChanges(asm: AssembledModel, changes: readonly DesignChange[]): ResolvedChange[] {
  if (!Array.isArray(changes) || changes.length === 0) throw new ArgumentError('no change given; give at least one { group, stiffnessScale, massScale }', 'changes');
  return changes.map((c, i) => {
    const g = resolveGroup(asm.model, c?.group, `changes[${i}].group`);
    const stiffnessScale = c.stiffnessScale ?? 1;
    const massScale = c.massScale ?? 1;
    if (!(Number.isFinite(stiffnessScale) && stiffnessScale > 0)) {
      throw new ArgumentError(`stiffness scale is ${stiffnessScale}; give a finite factor > 0 (1 keeps the stiffness)`, `changes[${i}].stiffnessScale`);
    }
    if (!(Number.isFinite(massScale) && massScale >= 0)) {
      throw new ArgumentError(`mass scale is ${massScale}; give a finite factor ≥ 0 (1 keeps the mass)`, `changes[${i}].massScale`);
    }
    return { name: g.name, elements: g.elements, stiffnessScale, massScale };
  });
}

/** values += factor · a_e at the element's entries (lower triangle; pattern entries found by binary search). */
function scatterInto(A: SymmetricCsc, values: Float64Array, ae: Float64Array, dofs: Int32Array, d: number, factor: number): void {
  for (let r = 0; r < d; r++) {
    const gi = dofs[r];
    if (gi < 0) continue;
    for (let c = 0; c < d; c++) {
      const gj = dofs[c];
      if (gj < 0 || gj > gi) continue; // lower triangle: row gi ≥ column gj
      const v = ae[r * d + c];
      if (v === 0) continue;
      const p = find(A, gi, gj);
      if (p < 0) throw new ArgumentError(`entry (${gi}, ${gj}) is not in the assembled pattern; the variant must keep the original members`, 'changes');
      values[p] += factor * v;
    }
  }
}

function find(A: SymmetricCsc, row: number, col: number): number {
  let lo = A.colPtr[col];
  let hi = A.colPtr[col + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const r = A.rowIdx[mid];
    if (r === row) return mid;
    if (r < row) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

/**
 * Modes of a design variant, compared with the original analysis.
 * @param base - the original modal analysis (its `assembled` and modes)
 * @param changes - the member groups scaled, see {@link DesignChange}
 * @param options - solver options of the re-solve, `band` in Hz, a reusable `symbolic`;
 *   `count` defaults to the number of original modes
 * @returns the variant's analysis, a per-mode comparison (MAC match, before, first-order
 *   prediction), band membership and the analysis to reuse
 * @throws ArgumentError for bad changes or options (path `changes[i]…`, `band`); ModelError
 *   when a change leaves a mechanism; VerificationError as `solve`
 */
export function whatIf(base: ModalAnalysis, changes: readonly DesignChange[], options: WhatIfOptions = {}): WhatIfResult {
  const { band, symbolic: given, referencePoint, directions, count, ...solverOptions } = options;
  if (band !== undefined && !(Array.isArray(band) && band.length === 2 && band[0] >= 0 && band[1] > band[0] && Number.isFinite(band[1]))) {
    throw new ArgumentError(`band is ${JSON.stringify(band)}; give [low, high] in Hz with 0 ≤ low < high`, 'band');
  }
  const asm0 = base.assembled;
  const { assembled, changes: resolved } = scaledModel(asm0, changes);
  assertNoMechanism(assembled);
  const symbolic = given ?? whatIfSymbolic(asm0);
  const m0 = base.modes.length;
  const eigen = solve(assembled.stiffness, assembled.mass, { massCheck: 'minors', ...solverOptions, count: count ?? m0, symbolic });
  const analysis = summariseModes(assembled, eigen, { referencePoint: referencePoint ?? base.referencePoint, directions });

  // ---- first-order predictions from the original modes ----
  const touched = [...new Set(resolved.flatMap((c) => c.elements))].sort((a, b) => a - b);
  const sens = eigenvalueSensitivity(asm0, base.eigen, { elements: touched });
  const predictedLambda = sens.map((s) => {
    let d = 0;
    for (const c of resolved) {
      const inGroup = new Set(c.elements);
      for (const e of s.elements) {
        if (!inGroup.has(e.index)) continue;
        d += (c.stiffnessScale - 1) * e.stiffness + (c.massScale - 1) * e.mass;
      }
    }
    return s.eigenvalue + d;
  });

  // ---- MAC matching with the new mass matrix ----
  const n = asm0.stiffness.n;
  const m1 = eigen.eigenvalues.length;
  const mPhi = new Float64Array(n);
  const oldNorm = new Float64Array(m0);
  const oldM = new Float64Array(n * m0);
  for (let i = 0; i < m0; i++) {
    const x = base.eigen.vectors.subarray(i * n, (i + 1) * n);
    symmetricMultiply(assembled.mass, x, oldM.subarray(i * n, (i + 1) * n));
    oldNorm[i] = dot(x, oldM.subarray(i * n, (i + 1) * n));
  }
  const comparison: ModeShift[] = [];
  for (let j = 0; j < m1; j++) {
    const y = eigen.vectors.subarray(j * n, (j + 1) * n);
    symmetricMultiply(assembled.mass, y, mPhi);
    const yy = dot(y, mPhi);
    let best = -1;
    let mac = 0;
    for (let i = 0; i < m0; i++) {
      const c = dot(oldM.subarray(i * n, (i + 1) * n), y);
      const v = (c * c) / (oldNorm[i] * yy);
      if (v > mac) {
        mac = v;
        best = i;
      }
    }
    comparison.push({
      mode: j + 1,
      frequency: analysis.modes[j].frequency,
      matches: best + 1,
      mac,
      before: best >= 0 ? base.modes[best].frequency : NaN,
      predicted: best >= 0 ? Math.sqrt(Math.max(predictedLambda[best], 0)) / (2 * Math.PI) : NaN,
    });
  }
  const inBand = (modes: readonly { mode: number; frequency: number }[]) => (band ? modes.filter((md) => md.frequency >= band[0] && md.frequency <= band[1]).map((md) => md.mode) : []);
  return {
    changes: resolved,
    analysis,
    comparison,
    ...(band ? { band: { low: band[0], high: band[1], before: inBand(base.modes), after: inBand(analysis.modes) } } : {}),
    symbolic,
  };
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/** Options of {@link stiffnessScaleFor}. */
export interface StiffnessTargetOptions extends Omit<WhatIfOptions, 'band'> {
  /** Mode of the original analysis to move, 1 = lowest. */
  mode: number;
  /** Frequency wanted for that mode, Hz, > 0. */
  frequency: number;
  /** Factor on the group's mass, held fixed while the stiffness is searched. @defaultValue 1 */
  massScale?: number;
  /** Relative tolerance on the frequency. @defaultValue 1e-6 */
  tolerance?: number;
  /** Re-solves allowed. @defaultValue 20 */
  maxIterations?: number;
  /** Largest stiffness factor tried; a target that needs more is out of reach. @defaultValue 1000 */
  maxScale?: number;
}

/** Defaults of {@link StiffnessTargetOptions}. */
export const STIFFNESS_TARGET_DEFAULTS = { massScale: 1, tolerance: 1e-6, maxIterations: 20, maxScale: 1000 } as const;

/** Outcome of {@link stiffnessScaleFor}. */
export interface StiffnessTargetResult {
  /** The factor on the group's stiffness that puts the mode at the target. */
  readonly stiffnessScale: number;
  /** The mode's frequency at that factor, Hz. */
  readonly frequency: number;
  /** Mode number the original mode has become in the variant (it may change places). */
  readonly mode: number;
  /** Re-solves made. */
  readonly iterations: number;
  /** (stiffness factor, frequency in Hz) of each re-solve. */
  readonly history: ReadonlyArray<readonly [number, number]>;
  /** The final variant. */
  readonly result: WhatIfResult;
}

/**
 * The stiffness factor on a member group that moves one mode to a target frequency: Newton's
 * method on λ(α), each step a what-if re-solve (sharing one pattern analysis) whose slope
 * dλ/dα = Σ φ_eᵀ k_e φ_e comes from the variant's own mode (Fox & Kapoor 1968). The mode is
 * followed through the variants by its MAC with the original shape.
 * @param base - the original modal analysis
 * @param group - the members stiffened (or softened)
 * @param options - mode, target frequency (Hz), mass factor, tolerance, limits; solver options
 * @throws ArgumentError (path `mode`, `frequency`, `maxScale`, `tolerance`, `maxIterations`) for bad
 *   options, (path `frequency`) when the target is out of reach of this group (it cannot move the
 *   mode that far within (0, maxScale], or the mode cannot be followed)
 */
export function stiffnessScaleFor(base: ModalAnalysis, group: MemberGroup, options: StiffnessTargetOptions): StiffnessTargetResult {
  const { mode, frequency, massScale, tolerance, maxIterations, maxScale, ...rest } = { ...STIFFNESS_TARGET_DEFAULTS, ...options };
  const m0 = base.modes.length;
  if (!Number.isInteger(mode) || mode < 1 || mode > m0) throw new ArgumentError(`mode ${mode} is not one of the ${m0} modes; give a number from 1 to ${m0}`, 'mode');
  if (!(Number.isFinite(frequency) && frequency > 0)) throw new ArgumentError(`frequency is ${frequency}; give a target above 0 Hz`, 'frequency');
  if (!(tolerance > 0 && tolerance < 0.1)) throw new ArgumentError(`tolerance is ${tolerance}; give a relative tolerance in (0, 0.1)`, 'tolerance');
  if (!(Number.isInteger(maxIterations) && maxIterations >= 1)) throw new ArgumentError(`maxIterations is ${maxIterations}; give a positive integer`, 'maxIterations');
  if (!(maxScale > 1 && Number.isFinite(maxScale))) throw new ArgumentError(`maxScale is ${maxScale}; give a finite factor above 1`, 'maxScale');
  const target = (2 * Math.PI * frequency) ** 2;
  const symbolic = rest.symbolic ?? whatIfSymbolic(base.assembled);
  const history: Array<[number, number]> = [];
  let alpha = 1;
  for (let it = 1; it <= maxIterations; it++) {
    const result = whatIf(base, [{ group, stiffnessScale: alpha, massScale }], { ...rest, symbolic });
    // follow the original mode: the variant mode with the largest MAC against it
    let j = -1;
    let best = 0;
    for (const c of result.comparison) {
      if (c.matches === mode && c.mac > best) {
        best = c.mac;
        j = c.mode;
      }
    }
    if (j < 0 || best < 0.5) {
      throw new ArgumentError(`mode ${mode} can no longer be followed at stiffness factor ${alpha} (best MAC ${best.toFixed(2)}); solve more modes (count) or aim closer`, 'frequency');
    }
    const lam = result.analysis.modes[j - 1].eigenvalue;
    const f = result.analysis.modes[j - 1].frequency;
    history.push([alpha, f]);
    if (Math.abs(f - frequency) <= tolerance * frequency) {
      return { stiffnessScale: alpha, frequency: f, mode: j, iterations: it, history, result };
    }
    const [s] = eigenvalueSensitivity(result.analysis.assembled, result.analysis.eigen, { modes: [j], elements: result.changes[0].elements });
    const slope = s.elements.reduce((a, e) => a + e.stiffness, 0);
    if (!(slope > 0)) throw new ArgumentError(`the group stores no strain energy in mode ${mode}, so its stiffness cannot move it; choose other members`, 'frequency');
    let next = alpha + (target - lam) / slope;
    if (next <= 0) next = alpha / 4; // Newton overshoots below zero when softening a lot: step back geometrically
    if (next > maxScale) {
      if (alpha >= maxScale) break;
      next = maxScale;
    }
    alpha = next;
  }
  throw new ArgumentError(
    `mode ${mode} does not reach ${frequency} Hz by scaling this group's stiffness within (0, ${maxScale}] (last tries: ${history.slice(-3).map(([a, f]) => `×${a.toPrecision(4)} → ${f.toPrecision(6)} Hz`).join(', ')}); stiffen other members or aim lower`,
    'frequency',
  );
}
