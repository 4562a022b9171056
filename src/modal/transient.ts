/**
 * Transient response to loads that vary in time, by modal superposition (Chopra, Dynamics of
 * Structures, §12.5–12.6, section numbers from memory; classical damping, at rest at t = 0).
 *
 * Load: f(t) = Σₗ fₗ gₗ(t), fixed spatial patterns fₗ scaled by piecewise-linear histories gₗ.
 * Each mode obeys q̈ + 2ζωq̇ + ω²q = Σₗ (φᵀfₗ) gₗ(t), integrated step by step over the union of
 * the output times and every history's breakpoints, so the modal load is linear on each step:
 * - `exact` (default): the closed-form solution over a step with linearly varying load
 *   (Chopra §5.2, "interpolation of excitation"): particular solution
 *   q_p(τ) = (p₀ + sτ)/ω² − 2ζs/ω³, s = (p₁ − p₀)/h, plus the damped free vibration that meets
 *   the state at the start of the step. Exact for these loads whatever the step.
 * - `newmark`: Newmark's average acceleration method, γ = ½, β = ¼ (Chopra §5.4, incremental
 *   form of Table 5.4.2): unconditionally stable, period elongation grows with ωh.
 *
 * A history is zero before its first time and after its last; two equal times make a jump.
 * Modes used: `count`, or the fewest whose effective mass in one direction reaches a share
 * (common practice: 90 %).
 */
import { ArgumentError } from '../errors';
import type { DofName } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import { dampingRatios, type Damping } from './damping';
import { nodalLoadVector, type NodalLoad } from '../model/loads';
import { resolveDofs, responseModes, type DofRef } from './harmonic-dofs';

/** A piecewise-linear history: g(t) linear between (times[k], values[k]); zero outside. */
export interface LoadHistory {
  /** s, non-decreasing (a repeated time makes a jump), at least two. */
  readonly times: ArrayLike<number>;
  /** Dimensionless scale of the pattern (or N when the pattern is unit), same length. */
  readonly values: ArrayLike<number>;
}

/** A spatial pattern and its history. */
export interface TransientLoad {
  /** Pattern: vector of length n (N, N·m) or nodal loads `{ node, dof, value }`. */
  readonly pattern: Float64Array | readonly NodalLoad[];
  readonly history: LoadHistory;
}

/** Integration method. */
export type TransientMethod = 'exact' | 'newmark';

/** Options of {@link transientResponse}. */
export interface TransientOptions {
  /** Loads. Required, at least one. */
  loads: readonly TransientLoad[];
  /** End time, s. Required, > 0. */
  duration: number;
  /** Output step Δt, s. Required, > 0; also the integration step (histories add breakpoints). */
  timeStep: number;
  /** DOFs whose history is wanted. Required, at least one. */
  at: readonly DofRef[];
  /** @defaultValue 'exact' */
  method?: TransientMethod;
  /** Modal damping. @defaultValue constant 0.01 */
  damping?: Damping;
  /** Modes used, the first ones; overrides `massTarget`. @defaultValue chosen by `massTarget` */
  count?: number;
  /** Share of the mass along `massDirection` the modes must capture, 0..1. @defaultValue 0.9 (common practice) */
  massTarget?: number;
  /**
   * Direction of that mass. @defaultValue the translation with the largest |rᵀ fₗ| summed
   * over the loads (the direction the loads push in)
   */
  massDirection?: DofName;
}

/** Defaults of {@link TransientOptions}. */
export const TRANSIENT_DEFAULTS = { method: 'exact', damping: { kind: 'constant', ratio: 0.01 } as Damping, massTarget: 0.9 } as const;

/** History of one DOF at the output times. */
export interface DofTransientResponse {
  readonly dof: number;
  readonly node: string;
  readonly name: DofName;
  /** m (rad). */
  readonly displacement: Float64Array;
  /** m/s (rad/s). */
  readonly velocity: Float64Array;
  /** m/s² (rad/s²), just after each time (after any jump of the load). */
  readonly acceleration: Float64Array;
  /** Largest |displacement| and its time, s. */
  readonly peakDisplacement: number;
  readonly peakTime: number;
}

/** Result of {@link transientResponse}. */
export interface TransientResult {
  /** Output times 0, Δt, …, s (the last is `duration`). */
  readonly times: Float64Array;
  readonly responses: readonly DofTransientResponse[];
  readonly method: TransientMethod;
  readonly modesUsed: number;
  readonly dampingRatios: Float64Array;
  /** Direction whose mass decided the modes, and the share captured (null when `count` was given and no direction applies). */
  readonly massDirection: DofName | null;
  readonly massCaptured: number | null;
  /** False when every mode of the analysis was used and the target was still not reached. */
  readonly massTargetReached: boolean;
}

function checkHistory(h: LoadHistory, path: string): void {
  const nt = h?.times?.length ?? 0;
  if (nt < 2 || h.values?.length !== nt) {
    throw new ArgumentError(`a history needs at least two times and as many values (got ${nt} times, ${h?.values?.length ?? 0} values)`, path);
  }
  for (let k = 0; k < nt; k++) {
    if (!Number.isFinite(h.times[k]) || h.times[k] < 0) throw new ArgumentError(`time ${h.times[k]} s is not a finite number ≥ 0`, `${path}.times[${k}]`);
    if (k > 0 && h.times[k] < h.times[k - 1]) throw new ArgumentError(`time ${h.times[k]} s comes before ${h.times[k - 1]} s; list times in order`, `${path}.times[${k}]`);
    if (!Number.isFinite(h.values[k])) throw new ArgumentError(`value ${h.values[k]} is not a finite number`, `${path}.values[${k}]`);
  }
  if (h.times[nt - 1] === h.times[0]) throw new ArgumentError('all times are equal; give a history that spans some time', `${path}.times`);
}

/** g(t⁺) (side +1, right limit) or g(t⁻) (side −1, left limit) of a piecewise-linear history. */
export function historyValue(h: LoadHistory, t: number, side: 1 | -1): number {
  const T = h.times;
  const V = h.values;
  const last = T.length - 1;
  if (t < T[0] || (t === T[0] && side < 0)) return 0;
  if (t > T[last] || (t === T[last] && side > 0)) return 0;
  // Binary search (histories may be long): right limit uses the last k with T[k] ≤ t, left
  // limit the first k with T[k] ≥ t; a repeated time is a jump between its two values.
  if (side > 0) {
    let lo = 0;
    let hi = last; // T[lo] ≤ t < T[hi] unless t = T[last]
    if (t >= T[last]) return V[last];
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (T[mid] <= t) lo = mid;
      else hi = mid;
    }
    return V[lo] + ((t - T[lo]) / (T[hi] - T[lo])) * (V[hi] - V[lo]);
  }
  if (t <= T[0]) return V[0];
  let lo = 0; // T[lo] < t ≤ T[hi]
  let hi = last;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (T[mid] < t) lo = mid;
    else hi = mid;
  }
  return V[lo] + ((t - T[lo]) / (T[hi] - T[lo])) * (V[hi] - V[lo]);
}

/**
 * Displacement, velocity and acceleration histories at chosen DOFs.
 * @param analysis - modal analysis (mass-normalised modes, λ > 0)
 * @param options - see {@link TransientOptions}; defaults in {@link TRANSIENT_DEFAULTS}
 * @throws ArgumentError naming the option (`loads[l].history.times[k]`, `duration`,
 *   `timeStep`, `at[k]`, `method`, `count`, `massTarget`, `massDirection`, `damping.*`)
 */
export function transientResponse(analysis: ModalAnalysis, options: TransientOptions): TransientResult {
  const o = { ...TRANSIENT_DEFAULTS, ...options };
  const assembled = analysis.assembled;
  const n = analysis.eigen.n;
  if (!Array.isArray(o.loads) || o.loads.length === 0) throw new ArgumentError('no load given; give at least one { pattern, history }', 'loads');
  if (!(o.duration > 0) || !Number.isFinite(o.duration)) throw new ArgumentError(`${o.duration} s is not a positive duration`, 'duration');
  if (!(o.timeStep > 0) || !Number.isFinite(o.timeStep)) throw new ArgumentError(`${o.timeStep} s is not a positive time step`, 'timeStep');
  const steps = Math.round(o.duration / o.timeStep);
  if (Math.abs(steps * o.timeStep - o.duration) > 1e-9 * o.duration || steps > 1e7) {
    throw new ArgumentError(`duration ${o.duration} s is not a whole number (≤ 10⁷) of steps of ${o.timeStep} s; adjust one of them`, 'timeStep');
  }
  if (o.method !== 'exact' && o.method !== 'newmark') throw new ArgumentError(`"${String(o.method)}" is not a method; use exact or newmark`, 'method');
  if (!o.at || o.at.length === 0) throw new ArgumentError('no response DOF given; name at least one { node, dof }', 'at');
  if (!(o.massTarget > 0 && o.massTarget <= 1)) throw new ArgumentError(`${o.massTarget} is not in (0, 1]; give the share of mass to capture, e.g. 0.9`, 'massTarget');
  const patterns = o.loads.map((l, k) => {
    checkHistory(l.history, `loads[${k}].history`);
    const f = l.pattern instanceof Float64Array ? l.pattern : nodalLoadVector(assembled, l.pattern, `loads[${k}].pattern`);
    if (f.length !== n || !f.every((v: number) => Number.isFinite(v))) throw new ArgumentError(`pattern must hold ${n} finite numbers, got length ${f.length}`, `loads[${k}].pattern`);
    return f;
  });

  // ---- modes used ----
  const translations = (assembled.model.space === 'plane' ? ['ux', 'uy'] : ['ux', 'uy', 'uz']) as DofName[];
  let massDirection: DofName | null = o.massDirection ?? null;
  if (massDirection !== null && !translations.includes(massDirection)) {
    throw new ArgumentError(`"${massDirection}" is not a translation of a ${assembled.model.space} model; use ${translations.join(', ')}`, 'massDirection');
  }
  if (massDirection === null) {
    let best = 0;
    for (const d of translations) {
      let s = 0;
      for (const f of patterns) {
        let r = 0;
        for (let i = 0; i < n; i++) if (assembled.dofs[i].dof === d) r += f[i];
        s += Math.abs(r);
      }
      if (s > best) {
        best = s;
        massDirection = d;
      }
    }
  }
  let count = o.count;
  let massTargetReached = true;
  if (count === undefined) {
    count = analysis.modes.length;
    if (massDirection !== null) {
      massTargetReached = false;
      for (let j = 0; j < analysis.modes.length; j++) {
        if ((analysis.modes[j].cumulativeRatio[massDirection] ?? 0) >= o.massTarget - 1e-12) {
          count = j + 1;
          massTargetReached = true;
          break;
        }
      }
    }
  }
  const modes = responseModes(analysis, count);
  const { m, angular, vectors } = modes;
  const zeta = dampingRatios(o.damping, angular);
  const massCaptured = massDirection === null ? null : analysis.modes[m - 1].cumulativeRatio[massDirection] ?? 0;

  // ---- modal load patterns Γₗⱼ = φⱼᵀ fₗ ----
  const L = patterns.length;
  const gam = new Float64Array(L * m);
  for (let l = 0; l < L; l++) {
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += vectors[j * n + i] * patterns[l][i];
      gam[l * m + j] = s;
    }
  }

  // ---- breakpoints: output grid ∪ history times ----
  const dt = o.timeStep;
  const extra: number[] = [];
  for (const l of o.loads) for (let k = 0; k < l.history.times.length; k++) {
    const t = l.history.times[k];
    if (t > 0 && t < o.duration && Math.abs(t / dt - Math.round(t / dt)) > 1e-9) extra.push(t);
  }
  extra.sort((a, b) => a - b);

  // ---- integration ----
  const idx = resolveDofs(assembled, o.at, 'at');
  const R = idx.length;
  const times = new Float64Array(steps + 1);
  const disp = Array.from({ length: R }, () => new Float64Array(steps + 1));
  const vel = Array.from({ length: R }, () => new Float64Array(steps + 1));
  const acc = Array.from({ length: R }, () => new Float64Array(steps + 1));
  const phiAt = new Float64Array(R * m);
  for (let r = 0; r < R; r++) for (let j = 0; j < m; j++) phiAt[r * m + j] = vectors[j * n + idx[r]];
  const q = new Float64Array(m);
  const qd = new Float64Array(m);
  const p0 = new Float64Array(m);
  const p1 = new Float64Array(m);
  const g0 = new Float64Array(L);
  const g1 = new Float64Array(L);
  const modalLoad = (g: Float64Array, p: Float64Array): void => {
    p.fill(0);
    for (let l = 0; l < L; l++) {
      const gl = g[l];
      if (gl === 0) continue;
      for (let j = 0; j < m; j++) p[j] += gl * gam[l * m + j];
    }
  };
  const evalHistories = (t: number, side: 1 | -1, g: Float64Array): void => {
    for (let l = 0; l < L; l++) g[l] = historyValue(o.loads[l].history, t, side);
  };
  const record = (k: number, t: number): void => {
    times[k] = t;
    evalHistories(t, 1, g0);
    modalLoad(g0, p0);
    for (let r = 0; r < R; r++) {
      let u = 0;
      let v = 0;
      let a = 0;
      for (let j = 0; j < m; j++) {
        const w = angular[j];
        const f = phiAt[r * m + j];
        u += f * q[j];
        v += f * qd[j];
        a += f * (p0[j] - 2 * zeta[j] * w * qd[j] - w * w * q[j]);
      }
      disp[r][k] = u;
      vel[r][k] = v;
      acc[r][k] = a;
    }
  };
  const step = (ta: number, tb: number): void => {
    const h = tb - ta;
    if (h <= 0) return;
    evalHistories(ta, 1, g0);
    evalHistories(tb, -1, g1);
    modalLoad(g0, p0);
    modalLoad(g1, p1);
    for (let j = 0; j < m; j++) {
      const w = angular[j];
      const z = zeta[j];
      if (o.method === 'exact') {
        const s = (p1[j] - p0[j]) / h;
        const up0 = (p0[j] - (2 * z * s) / w) / (w * w);
        const vp = s / (w * w);
        const wd = w * Math.sqrt(1 - z * z);
        const A = q[j] - up0;
        const B = (qd[j] - vp + z * w * A) / wd;
        const E = Math.exp(-z * w * h);
        const C = Math.cos(wd * h);
        const S = Math.sin(wd * h);
        q[j] = up0 + (s * h) / (w * w) + E * (A * C + B * S);
        qd[j] = vp + E * ((-z * w * A + wd * B) * C + (-z * w * B - wd * A) * S);
      } else {
        const c = 2 * z * w;
        const a0 = p0[j] - c * qd[j] - w * w * q[j];
        const kh = w * w + (2 * c) / h + 4 / (h * h);
        const du = (p1[j] - p0[j] + (4 / h + 2 * c) * qd[j] + 2 * a0) / kh;
        qd[j] += (2 / h) * du - 2 * qd[j];
        q[j] += du;
      }
    }
  };
  record(0, 0);
  let e = 0;
  for (let k = 1; k <= steps; k++) {
    const tEnd = k === steps ? o.duration : k * dt;
    let t = (k - 1) * dt;
    while (e < extra.length && extra[e] <= t) e++;
    while (e < extra.length && extra[e] < tEnd) {
      step(t, extra[e]);
      t = extra[e++];
    }
    step(t, tEnd);
    record(k, tEnd);
  }
  const responses: DofTransientResponse[] = [];
  for (let r = 0; r < R; r++) {
    let peak = 0;
    let peakTime = 0;
    for (let k = 0; k <= steps; k++) {
      if (Math.abs(disp[r][k]) > peak) {
        peak = Math.abs(disp[r][k]);
        peakTime = times[k];
      }
    }
    const d = assembled.dofs[idx[r]];
    responses.push({ dof: idx[r], node: d.node, name: d.dof, displacement: disp[r], velocity: vel[r], acceleration: acc[r], peakDisplacement: peak, peakTime });
  }
  return { times, responses, method: o.method, modesUsed: m, dampingRatios: zeta, massDirection, massCaptured, massTargetReached };
}
