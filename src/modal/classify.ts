/**
 * Dominant direction of motion of each mode: vertical, lateral, longitudinal or torsional, in
 * the structure's own axes, from the kinetic energy of its modal displacements.
 *
 * Axes (a choice of this library, documented in docs/guides/resonance.md):
 * - vertical: global z in space, global y in a plane model;
 * - longitudinal: the long horizontal axis of the structure, the principal axis of the node
 *   cloud projected on the horizontal plane (the axis of largest spread); in a plane model, x;
 *   when the horizontal spread is the same in every direction (a square tower), x;
 * - lateral: horizontal and perpendicular to it (space only);
 * - torsional: twisting about the longer of the longitudinal and the vertical axis (a bridge
 *   twists about its span, a tower about its height); space only.
 *
 * Energy split. Each node k carries a translational mass m_k, the row sum of M against the
 * rigid translation of its free translational DOFs (exact for lumped mass, the usual lumping of
 * a consistent one), and moves u_k (the mode's translations). Nodes are grouped into stations
 * along the torsion axis a (nodes within `stationTolerance` × the structure's extent along a of
 * the station's first node). In each station the rigid twist about a through the station's mass
 * centre is fitted by mass-weighted least squares,
 *   θ = Σ m_k (a × r_k)·u_k / Σ m_k |r_k|²   (r_k ⟂ a, from the station's mass centre),
 * and removed: u_k = θ a × r_k + w_k, which splits the energy exactly, Σ m|u|² = θ² Σ m|r|² +
 * Σ m|w|². The twist energy is torsional; w_k is split on the vertical, longitudinal and lateral
 * axes. Rotational DOFs add M_ii φ_i² of their component about a to the torsional share (a deck
 * modelled as one line of beams twists through its rotations only); their other components are
 * bending rotations and are left out. Shares are normalised to sum to 1.
 *
 * The effective mass ratios of the analysis are mapped to the same four directions as a second
 * opinion: they tell what a uniform (seismic-like) excitation sees, while the energy split also
 * sees antisymmetric modes that uniform excitation does not drive but a walker at mid-span does.
 */
import { ArgumentError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse/symmetric';
import type { DofName } from '../model/types';
import type { ModalAnalysis } from './analysis-types';
import { MOTION_DIRECTIONS, type MotionDirection } from './bands';

/** Unit vectors of the structure's axes in global coordinates. */
export interface StructureAxes {
  /** Global z in space, global y in the plane. */
  readonly vertical: readonly [number, number, number];
  /** Long horizontal axis. */
  readonly longitudinal: readonly [number, number, number];
  /** vertical × longitudinal (space); null in a plane model. */
  readonly lateral: readonly [number, number, number] | null;
  /** Axis the structure twists about; null in a plane model. */
  readonly torsionAxis: 'longitudinal' | 'vertical' | null;
}

/** Classification of one mode. */
export interface ModeClassification {
  /** Mode number, 1 = lowest. */
  readonly mode: number;
  /** Hz. */
  readonly frequency: number;
  /** Direction with the largest kinetic energy share. */
  readonly direction: MotionDirection;
  /** Kinetic energy shares, 0..1, summing to 1 (all 0 for a mode that moves no mass). */
  readonly shares: Readonly<Record<MotionDirection, number>>;
  /**
   * Effective mass ratios of the analysis mapped to these directions, 0..1: each global
   * translation goes to the structure axis nearest it; the rotation about the global axis nearest
   * the torsion axis is torsional.
   */
  readonly massRatios: Readonly<Record<MotionDirection, number>>;
}

/** Options of {@link classifyModes}. */
export interface ClassifyOptions {
  /**
   * Width of a station along the torsion axis, as a fraction of the structure's extent along
   * it (nodes closer than this to a station's first node twist together). @defaultValue 0.01
   */
  stationTolerance?: number;
}

/** Defaults of {@link ClassifyOptions}. */
export const CLASSIFY_DEFAULTS = { stationTolerance: 0.01 } as const;

/** Result of {@link classifyModes}. */
export interface Classification {
  readonly axes: StructureAxes;
  /** One per mode of the analysis, in its order. */
  readonly modes: readonly ModeClassification[];
}

type V3 = [number, number, number];
const TRANS: readonly DofName[] = ['ux', 'uy', 'uz'];
const ROT: readonly DofName[] = ['rx', 'ry', 'rz'];

function zeroShares(): Record<MotionDirection, number> {
  return { vertical: 0, lateral: 0, longitudinal: 0, torsional: 0 };
}

/**
 * The structure's axes from its node coordinates (see the file comment).
 * @param coordinates - x, y, z per node, length 3·nodes, m
 * @param space - `plane` or `space`
 */
export function structureAxes(coordinates: Float64Array, space: 'plane' | 'space'): StructureAxes {
  if (space === 'plane') return { vertical: [0, 1, 0], longitudinal: [1, 0, 0], lateral: null, torsionAxis: null };
  const nn = coordinates.length / 3;
  let mx = 0;
  let my = 0;
  for (let k = 0; k < nn; k++) {
    mx += coordinates[3 * k];
    my += coordinates[3 * k + 1];
  }
  mx /= Math.max(nn, 1);
  my /= Math.max(nn, 1);
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let k = 0; k < nn; k++) {
    const dx = coordinates[3 * k] - mx;
    const dy = coordinates[3 * k + 1] - my;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  // Principal axis of the 2 × 2 scatter matrix: angle ½·atan2(2sxy, sxx − syy).
  let L: V3 = [1, 0, 0];
  const spread = sxx + syy;
  if (spread > 0 && Math.hypot(sxx - syy, 2 * sxy) > 1e-9 * spread) {
    const t = 0.5 * Math.atan2(2 * sxy, sxx - syy);
    L = [Math.cos(t), Math.sin(t), 0];
    if (Math.abs(L[0]) >= Math.abs(L[1]) ? L[0] < 0 : L[1] < 0) L = [-L[0], -L[1], 0];
  }
  const T: V3 = [-L[1], L[0], 0]; // ez × eL
  let sMin = Infinity;
  let sMax = -Infinity;
  let zMin = Infinity;
  let zMax = -Infinity;
  for (let k = 0; k < nn; k++) {
    const s = coordinates[3 * k] * L[0] + coordinates[3 * k + 1] * L[1];
    sMin = Math.min(sMin, s);
    sMax = Math.max(sMax, s);
    zMin = Math.min(zMin, coordinates[3 * k + 2]);
    zMax = Math.max(zMax, coordinates[3 * k + 2]);
  }
  const torsionAxis = zMax - zMin > sMax - sMin ? 'vertical' : 'longitudinal';
  return { vertical: [0, 0, 1], longitudinal: L, lateral: T, torsionAxis };
}

/**
 * Dominant direction and kinetic energy shares of every mode of an analysis.
 * @param analysis - a modal analysis (its assembled model and mass-normalised shapes)
 * @param options - see {@link ClassifyOptions}; defaults in {@link CLASSIFY_DEFAULTS}
 * @throws ArgumentError (path `stationTolerance`) unless it is in (0, 1]
 */
export function classifyModes(analysis: ModalAnalysis, options: ClassifyOptions = {}): Classification {
  const o = { ...CLASSIFY_DEFAULTS, ...options };
  if (!(o.stationTolerance > 0 && o.stationTolerance <= 1)) {
    throw new ArgumentError(`${o.stationTolerance} is not in (0, 1]; give the station width as a fraction of the structure's length, e.g. 0.01`, 'stationTolerance');
  }
  const { assembled, eigen } = analysis;
  const space = assembled.model.space;
  const axes = structureAxes(assembled.coordinates, space);
  const n = assembled.dofs.length;
  const nn = assembled.coordinates.length / 3;
  const M = assembled.mass;

  // ---- nodal translational masses (row sums of M against rigid translations) ----
  const massSum = new Float64Array(nn);
  const massCount = new Int32Array(nn);
  const r = new Float64Array(n);
  const Mr = new Float64Array(n);
  for (const t of space === 'space' ? TRANS : TRANS.slice(0, 2)) {
    r.fill(0);
    for (let i = 0; i < n; i++) if (assembled.dofs[i].dof === t) r[i] = 1;
    symmetricMultiply(M, r, Mr);
    for (let i = 0; i < n; i++) {
      if (assembled.dofs[i].dof !== t) continue;
      massSum[assembled.dofs[i].nodeIndex] += Mr[i];
      massCount[assembled.dofs[i].nodeIndex]++;
    }
  }
  const nodeMass = new Float64Array(nn);
  for (let k = 0; k < nn; k++) nodeMass[k] = massCount[k] > 0 ? Math.max(0, massSum[k] / massCount[k]) : 0;
  const Mdiag = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let p = M.colPtr[j]; p < M.colPtr[j + 1]; p++) if (M.rowIdx[p] === j) Mdiag[j] = M.values[p];
  }

  // ---- stations along the torsion axis ----
  const a: V3 | null = axes.torsionAxis === null ? null : axes.torsionAxis === 'vertical' ? [...axes.vertical] as V3 : [...axes.longitudinal] as V3;
  const station = new Int32Array(nn);
  let stationCount = 1;
  if (a) {
    const s = new Float64Array(nn);
    for (let k = 0; k < nn; k++) s[k] = a[0] * assembled.coordinates[3 * k] + a[1] * assembled.coordinates[3 * k + 1] + a[2] * assembled.coordinates[3 * k + 2];
    const order = Array.from({ length: nn }, (_, k) => k).sort((p, q) => s[p] - s[q]);
    const extent = nn > 0 ? s[order[nn - 1]] - s[order[0]] : 0;
    const tol = o.stationTolerance * extent;
    let start = nn > 0 ? s[order[0]] : 0;
    let id = 0;
    for (const k of order) {
      if (s[k] - start > tol) {
        id++;
        start = s[k];
      }
      station[k] = id;
    }
    stationCount = id + 1;
  }

  // ---- twist pattern a × r_k of each node about its station's mass centre (mode-independent) ----
  const ar = new Float64Array(3 * nn);
  const den = new Float64Array(stationCount);
  if (a) {
    const sm = new Float64Array(stationCount);
    const sc = new Float64Array(3 * stationCount);
    for (let k = 0; k < nn; k++) {
      sm[station[k]] += nodeMass[k];
      for (let c = 0; c < 3; c++) sc[3 * station[k] + c] += nodeMass[k] * assembled.coordinates[3 * k + c];
    }
    for (let st = 0; st < stationCount; st++) if (sm[st] > 0) for (let c = 0; c < 3; c++) sc[3 * st + c] /= sm[st];
    for (let k = 0; k < nn; k++) {
      const st = station[k];
      const r0 = assembled.coordinates[3 * k] - sc[3 * st];
      const r1 = assembled.coordinates[3 * k + 1] - sc[3 * st + 1];
      const r2 = assembled.coordinates[3 * k + 2] - sc[3 * st + 2];
      const s = r0 * a[0] + r1 * a[1] + r2 * a[2];
      const p0 = r0 - s * a[0];
      const p1 = r1 - s * a[1];
      const p2 = r2 - s * a[2];
      ar[3 * k] = a[1] * p2 - a[2] * p1;
      ar[3 * k + 1] = a[2] * p0 - a[0] * p2;
      ar[3 * k + 2] = a[0] * p1 - a[1] * p0;
      den[st] += nodeMass[k] * (p0 * p0 + p1 * p1 + p2 * p2);
    }
  }

  // ---- per mode ----
  const dofSlot = new Int32Array(n);
  const dofNode = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const d = assembled.dofs[i];
    dofSlot[i] = TRANS.includes(d.dof) ? TRANS.indexOf(d.dof) : 3 + ROT.indexOf(d.dof);
    dofNode[i] = d.nodeIndex;
  }
  const u = new Float64Array(3 * nn);
  const num = new Float64Array(stationCount);
  const theta = new Float64Array(stationCount);
  const V = axes.vertical;
  const Lx = axes.longitudinal;
  const T = axes.lateral;
  const modes: ModeClassification[] = [];
  for (let j = 0; j < analysis.modes.length; j++) {
    const phi = eigen.vectors.subarray(j * n, (j + 1) * n);
    u.fill(0);
    let rotTorsion = 0;
    for (let i = 0; i < n; i++) {
      const slot = dofSlot[i];
      if (slot < 3) u[3 * dofNode[i] + slot] = phi[i];
      else if (a) rotTorsion += Mdiag[i] * (phi[i] * a[slot - 3]) ** 2;
    }
    const e = zeroShares();
    e.torsional = rotTorsion;
    theta.fill(0);
    if (a) {
      num.fill(0);
      for (let k = 0; k < nn; k++) {
        num[station[k]] += nodeMass[k] * (ar[3 * k] * u[3 * k] + ar[3 * k + 1] * u[3 * k + 1] + ar[3 * k + 2] * u[3 * k + 2]);
      }
      for (let st = 0; st < stationCount; st++) {
        // A station on the axis (a line of beams) cannot show twist by translations.
        theta[st] = den[st] > 0 ? num[st] / den[st] : 0;
        e.torsional += theta[st] * theta[st] * den[st];
      }
    }
    for (let k = 0; k < nn; k++) {
      const mk = nodeMass[k];
      if (mk === 0) continue;
      const th = theta[station[k]];
      const w0 = u[3 * k] - th * ar[3 * k];
      const w1 = u[3 * k + 1] - th * ar[3 * k + 1];
      const w2 = u[3 * k + 2] - th * ar[3 * k + 2];
      e.vertical += mk * (w0 * V[0] + w1 * V[1] + w2 * V[2]) ** 2;
      e.longitudinal += mk * (w0 * Lx[0] + w1 * Lx[1] + w2 * Lx[2]) ** 2;
      if (T) e.lateral += mk * (w0 * T[0] + w1 * T[1] + w2 * T[2]) ** 2;
    }
    const total = e.vertical + e.lateral + e.longitudinal + e.torsional;
    const shares = zeroShares();
    let direction: MotionDirection = 'vertical';
    let best = -1;
    for (const d of MOTION_DIRECTIONS) {
      shares[d] = total > 0 ? e[d] / total : 0;
      if (shares[d] > best) {
        best = shares[d];
        direction = d;
      }
    }
    modes.push({
      mode: analysis.modes[j].mode,
      frequency: analysis.modes[j].frequency,
      direction,
      shares,
      massRatios: massRatios(analysis.modes[j].effectiveMassRatio, axes),
    });
  }
  return { axes, modes };
}

/** Effective mass ratios of global directions mapped to the structure's directions. */
function massRatios(ratios: Readonly<Partial<Record<DofName, number>>>, axes: StructureAxes): Record<MotionDirection, number> {
  const out = zeroShares();
  const named: Array<[MotionDirection, readonly [number, number, number] | null]> = [
    ['vertical', axes.vertical],
    ['longitudinal', axes.longitudinal],
    ['lateral', axes.lateral],
  ];
  TRANS.forEach((t, c) => {
    const v = ratios[t];
    if (v === undefined) return;
    let best: MotionDirection = 'vertical';
    let bestAbs = -1;
    for (const [name, e] of named) {
      if (e && Math.abs(e[c]) > bestAbs) {
        bestAbs = Math.abs(e[c]);
        best = name;
      }
    }
    out[best] += v;
  });
  if (axes.torsionAxis) {
    const a = axes.torsionAxis === 'vertical' ? axes.vertical : axes.longitudinal;
    let c = 0;
    for (let q = 1; q < 3; q++) if (Math.abs(a[q]) > Math.abs(a[c])) c = q;
    out.torsional += ratios[ROT[c]] ?? 0;
  }
  return out;
}
