/**
 * Eigenvalue sensitivity to member stiffness and mass, per element and per member group, and a
 * ranking of members by how efficiently they move a mode.
 *
 * For K(p) φ = λ(p) M(p) φ with a simple eigenvalue, differentiating and premultiplying by φᵀ
 * gives dλ/dp = φᵀ(∂K/∂p − λ ∂M/∂p)φ / φᵀMφ (Fox & Kapoor 1968, "Rates of change of eigenvalues
 * and eigenvectors", AIAA J. 6(12), eq. for the eigenvalue derivative). With the member's
 * stiffness scaled K = K₀ + (α − 1) K_e and its mass M = M₀ + (β − 1) M_e, at α = β = 1:
 *   dλ/dα = φ_eᵀ k_e φ_e / φᵀMφ      (twice the member's modal strain energy, ≥ 0)
 *   dλ/dβ = −λ φ_eᵀ m_e φ_e / φᵀMφ   (≤ 0)
 * where φ_e gathers the mode at the element's DOFs (supported DOFs are zero). Adding material to
 * a member as a whole (K_e and M_e scaled together, s = α = β) moves λ by dλ/dα + dλ/dβ per unit
 * s, while adding ρAL kg per unit s; their ratio is the efficiency used to rank members.
 * Frequencies follow from f = √λ/2π: df = dλ / (8π² f).
 *
 * Repeated eigenvalues are not differentiable in general (the derivative depends on which vector
 * of the eigenspace is taken; Nelson 1976 and later work treat that case); such modes are flagged.
 *
 * Element matrices come from model/element-matrices.ts, the code assembly itself uses (same
 * element functions, global axes and DOF slots), so φ_eᵀk_eφ_e summed over all members plus the
 * springs' share equals φᵀKφ.
 */
import { ArgumentError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse/symmetric';
import { elementMatrices, type ElementMatrices } from '../model/element-matrices';
import type { AssembledModel, Model } from '../model/types';
import { modeCount, type ModeSet } from './modes';

/** Relative eigenvalue gap below which a mode counts as repeated (its derivative is not unique). */
export const REPEATED_GAP = 1e-8;

/**
 * A set of members changed together: the listed element ids, or every element of one section.
 * Give exactly one of `elements` and `section`.
 */
export interface MemberGroup {
  /** Label used in reports. @defaultValue the section name, or the element ids joined by commas */
  readonly name?: string;
  /** Element ids. */
  readonly elements?: readonly string[];
  /** A section name: the group is every element of that section. */
  readonly section?: string;
}

/**
 * Sensitivity figures of one mode to a member or a member group (a group's are the sums over its
 * members, its energy share the sum of theirs).
 */
export interface SensitivityFigures {
  /** dλ/dα for the stiffness scaled by α (k_e → α k_e) at α = 1, rad²/s² (≥ 0). */
  readonly stiffness: number;
  /** dλ/dβ for the mass scaled by β (m_e → β m_e) at β = 1, rad²/s² (≤ 0). */
  readonly mass: number;
  /** dλ/ds for stiffness and mass scaled together (material added), rad²/s². */
  readonly material: number;
  /** Member (or group) mass ρAL, kg. */
  readonly memberMass: number;
  /** material / memberMass: eigenvalue gained per kg added this way, rad²/s² per kg (NaN when massless). */
  readonly efficiency: number;
  /** df/dα, Hz per unit stiffness scale. */
  readonly stiffnessFrequency: number;
  /** df/dβ, Hz per unit mass scale. */
  readonly massFrequency: number;
  /** Share of the mode's strain energy stored there, φ_eᵀk_eφ_e / φᵀKφ, 0..1. */
  readonly energyShare: number;
}

/** Sensitivity of one mode to one member. */
export interface ElementSensitivity extends SensitivityFigures {
  /** Element id. */
  readonly element: string;
  /** Index in model.elements. */
  readonly index: number;
  /** Section name of the element. */
  readonly section: string;
}

/** Sensitivities of one mode. */
export interface ModeSensitivity {
  /** Mode number, 1 = lowest of the mode set. */
  readonly mode: number;
  /** λ, rad²/s². */
  readonly eigenvalue: number;
  /** f, Hz. */
  readonly frequency: number;
  /** True when a neighbouring eigenvalue is within REPEATED_GAP (relative): derivatives not unique. */
  readonly repeated: boolean;
  /** One entry per member examined, in model order. */
  readonly elements: readonly ElementSensitivity[];
}

/** Options of {@link eigenvalueSensitivity}. */
export interface SensitivityOptions {
  /** Mode numbers (1 = lowest of the set). @defaultValue every mode of the set */
  modes?: readonly number[];
  /** Element indices examined. @defaultValue every element */
  elements?: readonly number[];
}

/**
 * Eigenvalue derivatives of the given modes with respect to every member's stiffness scale and
 * mass scale (Fox & Kapoor 1968; see the file header).
 * @param asm - the assembled model the modes belong to
 * @param modes - eigenvalues (rad²/s²) and shapes, column-major n × m; any normalisation (each
 *   mode is divided by its modal mass φᵀMφ here)
 * @param options - modes and elements to examine
 * @returns one entry per requested mode
 * @throws ArgumentError (path `modes`, `options.modes[i]`, `options.elements[i]`) for mismatched
 *   sizes or numbers out of range
 */
export function eigenvalueSensitivity(asm: AssembledModel, modes: ModeSet, options: SensitivityOptions = {}): ModeSensitivity[] {
  const n = asm.stiffness.n;
  const m = modeCount(modes, n);
  const wanted = options.modes ?? Array.from({ length: m }, (_, j) => j + 1);
  wanted.forEach((j, i) => {
    if (!Number.isInteger(j) || j < 1 || j > m) throw new ArgumentError(`mode ${j} is not one of the ${m} modes; give a mode number from 1 to ${m}`, `options.modes[${i}]`);
  });
  const nel = asm.model.elements.length;
  const elems = options.elements ?? Array.from({ length: nel }, (_, k) => k);
  elems.forEach((k, i) => {
    if (!Number.isInteger(k) || k < 0 || k >= nel) throw new ArgumentError(`element index ${k} is out of range; use 0..${nel - 1}`, `options.elements[${i}]`);
  });
  // ---- per mode: modal mass φᵀMφ and strain φᵀKφ ----
  const mx = new Float64Array(n);
  const kx = new Float64Array(n);
  const modal = new Float64Array(wanted.length);
  const strain = new Float64Array(wanted.length);
  wanted.forEach((j, w) => {
    const phi = modes.vectors.subarray((j - 1) * n, j * n);
    symmetricMultiply(asm.mass, phi, mx);
    symmetricMultiply(asm.stiffness, phi, kx);
    for (let i = 0; i < n; i++) {
      modal[w] += phi[i] * mx[i];
      strain[w] += phi[i] * kx[i];
    }
    if (!(modal[w] > 0)) throw new ArgumentError(`mode ${j} has modal mass ${modal[w]}; pass mode shapes with positive φᵀMφ`, `modes[${j - 1}]`);
  });
  // ---- per element (outer, so each element matrix is built once), per mode (inner) ----
  const rows: ElementSensitivity[][] = wanted.map(() => []);
  const pe = new Float64Array(12);
  const ev = modes.eigenvalues;
  const toHz = wanted.map((j) => {
    const f = Math.sqrt(Math.max(ev[j - 1], 0)) / (2 * Math.PI);
    return f > 0 ? 1 / (8 * Math.PI * Math.PI * f) : NaN;
  });
  for (const k of elems) {
    const em = elementMatrices(asm, k);
    const e = asm.model.elements[k];
    const d = em.size;
    wanted.forEach((j, w) => {
      const o = (j - 1) * n;
      for (let r = 0; r < d; r++) pe[r] = em.dofs[r] < 0 ? 0 : modes.vectors[o + em.dofs[r]];
      const qk = quadratic(em.stiffness, pe, d) / modal[w];
      const qm = quadratic(em.mass, pe, d) / modal[w];
      const stiffness = qk;
      const mass = -ev[j - 1] * qm;
      rows[w].push({
        element: e.id,
        index: k,
        section: e.section,
        stiffness,
        mass,
        material: stiffness + mass,
        memberMass: em.memberMass,
        efficiency: em.memberMass > 0 ? (stiffness + mass) / em.memberMass : NaN,
        stiffnessFrequency: stiffness * toHz[w],
        massFrequency: mass * toHz[w],
        energyShare: strain[w] > 0 ? (qk * modal[w]) / strain[w] : 0,
      });
    });
  }
  return wanted.map((j, w) => {
    const lambda = ev[j - 1];
    const scale = Math.max(Math.abs(lambda), Number.MIN_VALUE);
    const repeated = (j > 1 && Math.abs(ev[j - 1] - ev[j - 2]) <= REPEATED_GAP * scale) || (j < m && Math.abs(ev[j] - ev[j - 1]) <= REPEATED_GAP * scale);
    return { mode: j, eigenvalue: lambda, frequency: Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI), repeated, elements: rows[w] };
  });
}

function quadratic(a: Float64Array, x: Float64Array, d: number): number {
  let s = 0;
  for (let r = 0; r < d; r++) {
    let t = 0;
    for (let c = 0; c < d; c++) t += a[r * d + c] * x[c];
    s += x[r] * t;
  }
  return s;
}

/** A member group resolved to element indices. */
export interface ResolvedGroup {
  /** Label. */
  readonly name: string;
  /** Element indices in model.elements, ascending, no duplicates. */
  readonly elements: readonly number[];
}

/**
 * Element indices of a member group.
 * @param model - the model
 * @param group - element ids or a section name (exactly one)
 * @param path - path used in errors @defaultValue 'group'
 * @throws ArgumentError naming `path.elements[i]` (unknown id), `path.section` (unknown section,
 *   or a section no element uses), or `path` (neither or both given, empty list)
 */
export function resolveGroup(model: Model, group: MemberGroup, path = 'group'): ResolvedGroup {
  const hasList = group?.elements !== undefined;
  const hasSection = group?.section !== undefined;
  if (hasList === hasSection) {
    throw new ArgumentError('give either "elements" (a list of element ids) or "section" (a section name) for the group, not both or neither', path);
  }
  if (hasSection) {
    const s = group.section!;
    if (!(s in model.sections)) throw new ArgumentError(`section "${s}" is not defined; use one of ${Object.keys(model.sections).join(', ')}`, `${path}.section`);
    const elements = model.elements.flatMap((e, k) => (e.section === s ? [k] : []));
    if (elements.length === 0) throw new ArgumentError(`no element uses section "${s}"; name a section that members use`, `${path}.section`);
    return { name: group.name ?? s, elements };
  }
  const ids = group.elements!;
  if (!Array.isArray(ids) || ids.length === 0) throw new ArgumentError('the element list is empty; give at least one element id', `${path}.elements`);
  const index = new Map<string, number>();
  model.elements.forEach((e, k) => index.set(e.id, k));
  const set = new Set<number>();
  ids.forEach((id, i) => {
    const k = index.get(id);
    if (k === undefined) throw new ArgumentError(`element "${id}" is not in the model; use the id of one of its ${model.elements.length} elements`, `${path}.elements[${i}]`);
    set.add(k);
  });
  return { name: group.name ?? ids.join(','), elements: [...set].sort((a, b) => a - b) };
}

/** Sensitivity of one mode to a member group (the sums over its members). */
export interface GroupSensitivity extends SensitivityFigures {
  /** Group label. */
  readonly name: string;
  /** Element indices of the group. */
  readonly elements: readonly number[];
}

/**
 * Sums element sensitivities of one mode over member groups.
 * @param model - the model (to resolve groups)
 * @param sensitivity - one mode's sensitivities, covering every element of the groups
 * @param groups - the groups
 * @throws ArgumentError (path `groups[g]…`) for a bad group or one with members the
 *   sensitivity does not cover
 */
export function groupSensitivity(model: Model, sensitivity: ModeSensitivity, groups: readonly MemberGroup[]): GroupSensitivity[] {
  const byIndex = new Map<number, ElementSensitivity>();
  for (const s of sensitivity.elements) byIndex.set(s.index, s);
  return groups.map((g, gi) => {
    const r = resolveGroup(model, g, `groups[${gi}]`);
    let stiffness = 0, mass = 0, memberMass = 0, sf = 0, mf = 0, share = 0;
    for (const k of r.elements) {
      const s = byIndex.get(k);
      if (!s) throw new ArgumentError(`element "${model.elements[k].id}" was not among the elements examined; compute the sensitivity for every element of the group`, `groups[${gi}]`);
      stiffness += s.stiffness;
      mass += s.mass;
      memberMass += s.memberMass;
      sf += s.stiffnessFrequency;
      mf += s.massFrequency;
      share += s.energyShare;
    }
    return { name: r.name, elements: r.elements, stiffness, mass, material: stiffness + mass, memberMass, efficiency: memberMass > 0 ? (stiffness + mass) / memberMass : NaN, stiffnessFrequency: sf, massFrequency: mf, energyShare: share };
  });
}

/** What a ranking orders by. */
export type RankBy = 'stiffness' | 'efficiency' | 'mass';

/**
 * Members (or groups) ordered by how much they raise the mode's eigenvalue: `stiffness`
 * (dλ/dα per unit stiffness scale), `efficiency` (dλ per kg of material added), or `mass`
 * (dλ/dβ, the least harmful mass first reversed: the members whose mass lowers λ most come
 * first). Entries whose value is NaN (massless members under `efficiency`) go last.
 * @returns a new array, best first
 */
export function rankMembers<T extends { stiffness: number; efficiency: number; mass: number }>(entries: readonly T[], by: RankBy = 'stiffness'): T[] {
  if (!['stiffness', 'efficiency', 'mass'].includes(by)) throw new ArgumentError(`ranking "${by}" is unknown; use stiffness, efficiency or mass`, 'by');
  const key = (e: T): number => (by === 'mass' ? -e.mass : e[by]);
  return [...entries].sort((a, b) => {
    const ka = key(a), kb = key(b);
    if (Number.isNaN(ka)) return Number.isNaN(kb) ? 0 : 1;
    if (Number.isNaN(kb)) return -1;
    return kb - ka;
  });
}
