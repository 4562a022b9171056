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
 * Element matrices are rebuilt here exactly as model/assemble.ts builds them (same element
 * functions, same global axes and DOF slots), so φ_eᵀk_eφ_e summed over all members plus the
 * springs' share equals φᵀKφ.
 */
import { barConsistentMassPlane, barConsistentMassSpace, barLumpedMassPlane, barLumpedMassSpace, barStiffnessPlane, barStiffnessSpace } from '../elements/bar';
import { planeFrameConsistentMass, planeFrameLumpedMass, planeFrameStiffness } from '../elements/planeFrame';
import { spaceFrameConsistentMass, spaceFrameLumpedMass, spaceFrameStiffness } from '../elements/spaceFrame';
import type { PlaneFrameProps, SpaceFrameProps } from '../elements/types';
import { ArgumentError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse/symmetric';
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

/** Global-axis element matrices of one member and where its DOFs sit in the free-DOF system. */
export interface ElementMatrices {
  /** Element DOF count d (4 plane bar, 6 space bar or plane frame, 12 space frame). */
  readonly size: number;
  /** Free DOF index of each element DOF, or −1 when that DOF is supported; length d. */
  readonly dofs: Int32Array;
  /** k_e, d × d row-major, global axes, N/m (N, N·m on rotations). */
  readonly stiffness: Float64Array;
  /** m_e, d × d row-major, global axes, kg (kg·m on rotations). */
  readonly mass: Float64Array;
  /** Member mass ρ A L, kg. */
  readonly memberMass: number;
}

const SLOTS_BAR_PLANE = [0, 1];
const SLOTS_BAR_SPACE = [0, 1, 2];
const SLOTS_FRAME_PLANE = [0, 1, 5];
const SLOTS_FRAME_SPACE = [0, 1, 2, 3, 4, 5];

/**
 * Element stiffness and mass of element `k` in global axes, as assembled into K and M.
 * @param asm - the assembled model (its dofMap and coordinates)
 * @param k - element index in model.elements
 * @throws ArgumentError (path `element`) for an index out of range
 */
export function elementMatrices(asm: AssembledModel, k: number): ElementMatrices {
  const model = asm.model;
  const e = model.elements[k];
  if (!Number.isInteger(k) || e === undefined) throw new ArgumentError(`element index ${k} is out of range; use 0..${model.elements.length - 1}`, 'element');
  const plane = model.space === 'plane';
  const lumped = model.mass === 'lumped';
  const a = nodeIndexOf(model, e.nodes[0]);
  const b = nodeIndexOf(model, e.nodes[1]);
  const xyz = asm.coordinates;
  const dx = xyz[3 * b] - xyz[3 * a], dy = xyz[3 * b + 1] - xyz[3 * a + 1], dz = xyz[3 * b + 2] - xyz[3 * a + 2];
  const mat = model.materials[e.material];
  const sec = model.sections[e.section];
  const ke = new Float64Array(144);
  const me = new Float64Array(144);
  let slots: number[];
  if (e.kind === 'bar') {
    if (plane) {
      barStiffnessPlane(mat.E, sec.A, dx, dy, ke);
      (lumped ? barLumpedMassPlane : barConsistentMassPlane)(mat.density, sec.A, dx, dy, me);
      slots = SLOTS_BAR_PLANE;
    } else {
      barStiffnessSpace(mat.E, sec.A, dx, dy, dz, ke);
      (lumped ? barLumpedMassSpace : barConsistentMassSpace)(mat.density, sec.A, dx, dy, dz, me);
      slots = SLOTS_BAR_SPACE;
    }
  } else {
    const theory = e.kind === 'timoshenko' ? 'timoshenko' : 'euler-bernoulli';
    if (plane) {
      const p: PlaneFrameProps = { E: mat.E, A: sec.A, I: sec.Iz!, density: mat.density, theory, G: mat.G, kappa: sec.kappa };
      planeFrameStiffness(p, dx, dy, ke);
      if (lumped) planeFrameLumpedMass(p, Math.hypot(dx, dy), me);
      else planeFrameConsistentMass(p, dx, dy, me);
      slots = SLOTS_FRAME_PLANE;
    } else {
      const p: SpaceFrameProps = { E: mat.E, G: mat.G!, A: sec.A, Iz: sec.Iz!, Iy: sec.Iy!, J: sec.J!, Ip: sec.Ip, density: mat.density, theory, kappa: sec.kappa };
      spaceFrameStiffness(p, dx, dy, dz, e.orientation, ke);
      (lumped ? spaceFrameLumpedMass : spaceFrameConsistentMass)(p, dx, dy, dz, e.orientation, me);
      slots = SLOTS_FRAME_SPACE;
    }
  }
  const per = slots.length;
  const d = 2 * per;
  const dofs = new Int32Array(d);
  const dofMap = asm.dofMap!;
  for (let s = 0; s < per; s++) {
    dofs[s] = dofMap[6 * a + slots[s]];
    dofs[per + s] = dofMap[6 * b + slots[s]];
  }
  return { size: d, dofs, stiffness: ke.slice(0, d * d), mass: me.slice(0, d * d), memberMass: mat.density * sec.A * Math.hypot(dx, dy, dz) };
}

// Node id → index, cached per nodes array (checked on every use, rebuilt if the array changed).
const NODE_INDEX = new WeakMap<readonly unknown[], Map<string, number>>();

function nodeIndexOf(model: Model, id: string): number {
  let map = NODE_INDEX.get(model.nodes);
  let i = map?.get(id);
  if (i === undefined || model.nodes[i]?.id !== id) {
    map = new Map(model.nodes.map((nd, k) => [nd.id, k]));
    NODE_INDEX.set(model.nodes, map);
    i = map.get(id);
  }
  if (i === undefined) throw new ArgumentError(`node "${id}" is not in the model; validate the model first`, 'nodes');
  return i;
}

/** Sensitivity of one mode to one member. */
export interface ElementSensitivity {
  /** Element id. */
  readonly element: string;
  /** Index in model.elements. */
  readonly index: number;
  /** Section name of the element. */
  readonly section: string;
  /** dλ/dα for k_e → α k_e at α = 1, rad²/s² (≥ 0). */
  readonly stiffness: number;
  /** dλ/dβ for m_e → β m_e at β = 1, rad²/s² (≤ 0). */
  readonly mass: number;
  /** dλ/ds for k_e and m_e scaled together (material added to the member), rad²/s². */
  readonly material: number;
  /** Member mass ρAL, kg. */
  readonly memberMass: number;
  /** material / memberMass: eigenvalue gained per kg added this way, rad²/s² per kg (NaN for a massless member). */
  readonly efficiency: number;
  /** df/dα, Hz per unit stiffness scale. */
  readonly stiffnessFrequency: number;
  /** df/dβ, Hz per unit mass scale. */
  readonly massFrequency: number;
  /** Share of the mode's strain energy stored in this member, φ_eᵀk_eφ_e / φᵀKφ, 0..1. */
  readonly energyShare: number;
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
export interface GroupSensitivity {
  /** Group label. */
  readonly name: string;
  /** Element indices of the group. */
  readonly elements: readonly number[];
  /** dλ/dα for the whole group's stiffness scaled by α, rad²/s². */
  readonly stiffness: number;
  /** dλ/dβ for the group's mass scaled by β, rad²/s². */
  readonly mass: number;
  /** dλ/ds with stiffness and mass scaled together, rad²/s². */
  readonly material: number;
  /** Group mass, kg. */
  readonly memberMass: number;
  /** material / memberMass, rad²/s² per kg. */
  readonly efficiency: number;
  /** df/dα, Hz. */
  readonly stiffnessFrequency: number;
  /** df/dβ, Hz. */
  readonly massFrequency: number;
  /** Share of the mode's strain energy in the group, 0..1. */
  readonly energyShare: number;
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
