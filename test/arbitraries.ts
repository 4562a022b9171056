/**
 * fast-check arbitraries and helpers for the property, fuzz, hard-case and determinism tests:
 * random valid structural models (plane and space frames and trusses on perturbed grids, with
 * supports that leave no mechanism and properties in physical ranges), random sparse symmetric
 * positive definite pairs, rigid rotations and renumberings of a model, and dense references
 * built on ml-matrix.
 *
 * Property ranges (SI): E 5e10–2.5e11 Pa and density 1,000–8,000 kg/m³ (metals to dense
 * timber-composites, common practice), A 5e-4–2e-2 m², I 1e-7–1e-4 m⁴ (rolled and hollow
 * sections, common practice), spans 2–6 m, storeys 2.5–4.5 m. The models are invented test
 * data; what the tests check are identities that hold for every such model.
 */
import fc from 'fast-check';
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { CooBuilder, toDenseArray, type SymmetricCsc } from '../src/linalg/sparse/symmetric';
import type { ElementKind, ElementSpec, MassKind, Model, NodeSpec } from '../src/model/types';
import { mulberry32 as rng } from '../src/linalg/random';

/** Seeded uniform generator on [0, 1), so every run sees the same data. */
export { rng };

// ---------------------------------------------------------------------------------------------
// Material and section groups

export interface Props {
  E: number;
  density: number;
  A: number;
  Iz: number;
  Iy: number;
  J: number;
  kappa: number;
}

const propsArb: fc.Arbitrary<Props> = fc.record({
  E: fc.double({ min: 5e10, max: 2.5e11, noNaN: true }),
  density: fc.double({ min: 1000, max: 8000, noNaN: true }),
  A: fc.double({ min: 5e-4, max: 2e-2, noNaN: true }),
  Iz: fc.double({ min: 1e-7, max: 1e-4, noNaN: true }),
  Iy: fc.double({ min: 1e-7, max: 1e-4, noNaN: true }),
  J: fc.double({ min: 1e-7, max: 2e-4, noNaN: true }),
  kappa: fc.double({ min: 0.5, max: 0.9, noNaN: true }),
});

/** Materials m0, m1 and sections s0, s1 of a model from two property groups. */
function groups(p: Props[], space: 'plane' | 'space'): Pick<Model, 'materials' | 'sections'> {
  const materials: Model['materials'] = {};
  const sections: Model['sections'] = {};
  p.forEach((g, i) => {
    materials[`m${i}`] = { E: g.E, G: g.E / 2.6, density: g.density };
    sections[`s${i}`] = space === 'plane' ? { A: g.A, Iz: g.Iz, kappa: g.kappa } : { A: g.A, Iz: g.Iz, Iy: g.Iy, J: g.J, kappa: g.kappa };
  });
  return { materials, sections };
}

const jitter = fc.double({ min: -0.2, max: 0.2, noNaN: true });
const unit = fc.double({ min: -1, max: 1, noNaN: true });

// ---------------------------------------------------------------------------------------------
// Model families

/** What kind of structure a generated model is. */
export type Family = 'plane-frame' | 'plane-truss' | 'space-frame' | 'space-truss';

export interface GeneratedModel {
  readonly family: Family;
  readonly model: Model;
}

/**
 * Plane portal frame of `bays` × `storeys` on a perturbed grid, columns clamped at the base
 * (ux, uy, rz fixed): every free node is held by at least two members rigidly jointed.
 */
export function planeFrameArb(mass: MassKind | 'any' = 'any'): fc.Arbitrary<GeneratedModel> {
  return fc
    .record({
      bays: fc.integer({ min: 1, max: 3 }),
      storeys: fc.integer({ min: 1, max: 3 }),
      widths: fc.array(fc.double({ min: 2, max: 6, noNaN: true }), { minLength: 3, maxLength: 3 }),
      heights: fc.array(fc.double({ min: 2.5, max: 4.5, noNaN: true }), { minLength: 3, maxLength: 3 }),
      jx: fc.array(jitter, { minLength: 16, maxLength: 16 }),
      jy: fc.array(jitter, { minLength: 16, maxLength: 16 }),
      props: fc.array(propsArb, { minLength: 2, maxLength: 2 }),
      kind: fc.constantFrom<ElementKind>('beam', 'beam', 'timoshenko'),
      mass: mass === 'any' ? fc.constantFrom<MassKind>('consistent', 'lumped') : fc.constant(mass),
      pointMass: fc.option(fc.double({ min: 10, max: 2000, noNaN: true }), { nil: undefined }),
    })
    .map((s) => {
      const nodes: NodeSpec[] = [];
      const id = (i: number, j: number) => `n${i}_${j}`;
      let k = 0;
      for (let j = 0; j <= s.storeys; j++) {
        let x = 0;
        for (let i = 0; i <= s.bays; i++) {
          const y = s.heights.slice(0, j).reduce((a, b) => a + b, 0);
          nodes.push({ id: id(i, j), x: x + s.jx[k], y: j === 0 ? 0 : y + s.jy[k] });
          k++;
          x += s.widths[i] ?? 0;
        }
      }
      const elements: ElementSpec[] = [];
      for (let j = 0; j < s.storeys; j++) {
        for (let i = 0; i <= s.bays; i++) elements.push({ id: `c${i}_${j}`, kind: s.kind, nodes: [id(i, j), id(i, j + 1)], material: 'm0', section: 's0' });
      }
      for (let j = 1; j <= s.storeys; j++) {
        for (let i = 0; i < s.bays; i++) elements.push({ id: `b${i}_${j}`, kind: s.kind, nodes: [id(i, j), id(i + 1, j)], material: 'm1', section: 's1' });
      }
      const supports = Array.from({ length: s.bays + 1 }, (_, i) => ({ node: id(i, 0), fixed: ['ux', 'uy', 'rz'] as Array<'ux' | 'uy' | 'rz'> }));
      const masses = s.pointMass === undefined ? [] : [{ node: id(s.bays, s.storeys), mass: s.pointMass }];
      const model: Model = { format: 'eigenframe-model/1', space: 'plane', mass: s.mass, ...groups(s.props, 'plane'), nodes, elements, supports, springs: [], masses };
      return { family: 'plane-frame' as const, model };
    });
}

/**
 * Plane Warren truss of `panels` panels, pinned (ux, uy) at both ends of the bottom chord:
 * 4p − 1 bars and 4 reactions for 2(2p + 1) DOFs, triangulated, so stable and once redundant.
 */
export function planeTrussArb(mass: MassKind | 'any' = 'any'): fc.Arbitrary<GeneratedModel> {
  return fc
    .record({
      panels: fc.integer({ min: 2, max: 6 }),
      length: fc.double({ min: 2, max: 5, noNaN: true }),
      height: fc.double({ min: 1.5, max: 4, noNaN: true }),
      jx: fc.array(jitter, { minLength: 14, maxLength: 14 }),
      jy: fc.array(jitter, { minLength: 14, maxLength: 14 }),
      props: fc.array(propsArb, { minLength: 2, maxLength: 2 }),
      mass: mass === 'any' ? fc.constantFrom<MassKind>('consistent', 'lumped') : fc.constant(mass),
    })
    .map((s) => {
      const p = s.panels;
      const nodes: NodeSpec[] = [];
      for (let i = 0; i <= p; i++) nodes.push({ id: `b${i}`, x: i * s.length + s.jx[i], y: s.jy[i] });
      for (let i = 0; i < p; i++) nodes.push({ id: `t${i}`, x: (i + 0.5) * s.length + s.jx[7 + i], y: s.height + s.jy[7 + i] });
      const elements: ElementSpec[] = [];
      const bar = (id: string, a: string, b: string, g: number) => elements.push({ id, kind: 'bar', nodes: [a, b], material: `m${g}`, section: `s${g}` });
      for (let i = 0; i < p; i++) bar(`bc${i}`, `b${i}`, `b${i + 1}`, 0);
      for (let i = 0; i + 1 < p; i++) bar(`tc${i}`, `t${i}`, `t${i + 1}`, 0);
      for (let i = 0; i < p; i++) {
        bar(`du${i}`, `b${i}`, `t${i}`, 1);
        bar(`dd${i}`, `t${i}`, `b${i + 1}`, 1);
      }
      const supports = [
        { node: 'b0', fixed: ['ux', 'uy'] as Array<'ux' | 'uy'> },
        { node: `b${p}`, fixed: ['ux', 'uy'] as Array<'ux' | 'uy'> },
      ];
      const model: Model = { format: 'eigenframe-model/1', space: 'plane', mass: s.mass, ...groups(s.props, 'plane'), nodes, elements, supports, springs: [], masses: [] };
      return { family: 'plane-truss' as const, model };
    });
}

/**
 * Space frame of nx × ny bays and `storeys` storeys on a perturbed grid, base clamped (all six
 * DOFs). Every member gets an explicit `orientation` (a random vector, replaced by one
 * perpendicular to the member when it comes too close to the member axis), so a rigid rotation
 * of the model can rotate it along.
 */
export function spaceFrameArb(mass: MassKind | 'any' = 'any', explicitOrientation = true): fc.Arbitrary<GeneratedModel> {
  return fc
    .record({
      nx: fc.integer({ min: 1, max: 2 }),
      ny: fc.integer({ min: 1, max: 2 }),
      storeys: fc.integer({ min: 1, max: 2 }),
      span: fc.double({ min: 2, max: 6, noNaN: true }),
      height: fc.double({ min: 2.5, max: 4.5, noNaN: true }),
      j: fc.array(jitter, { minLength: 81, maxLength: 81 }),
      orient: fc.array(unit, { minLength: 3 * 64, maxLength: 3 * 64 }),
      props: fc.array(propsArb, { minLength: 2, maxLength: 2 }),
      kind: fc.constantFrom<ElementKind>('beam', 'beam', 'timoshenko'),
      mass: mass === 'any' ? fc.constantFrom<MassKind>('consistent', 'lumped') : fc.constant(mass),
    })
    .map((s) => {
      const nodes: NodeSpec[] = [];
      const id = (i: number, j: number, k: number) => `n${i}_${j}_${k}`;
      let c = 0;
      for (let k = 0; k <= s.storeys; k++) {
        for (let j = 0; j <= s.ny; j++) {
          for (let i = 0; i <= s.nx; i++) {
            nodes.push({ id: id(i, j, k), x: i * s.span + s.j[c], y: j * s.span + s.j[(c + 27) % 81], z: k === 0 ? 0 : k * s.height + s.j[(c + 54) % 81] });
            c++;
          }
        }
      }
      const at = new Map(nodes.map((n) => [n.id, n]));
      const elements: ElementSpec[] = [];
      let e = 0;
      const member = (name: string, a: string, b: string, g: number) => {
        const spec: ElementSpec = { id: name, kind: s.kind, nodes: [a, b], material: `m${g}`, section: `s${g}` };
        if (explicitOrientation) spec.orientation = orientationFor(at.get(a)!, at.get(b)!, s.orient.slice(3 * (e % 64), 3 * (e % 64) + 3));
        e++;
        elements.push(spec);
      };
      for (let k = 0; k < s.storeys; k++) {
        for (let j = 0; j <= s.ny; j++) for (let i = 0; i <= s.nx; i++) member(`c${i}_${j}_${k}`, id(i, j, k), id(i, j, k + 1), 0);
      }
      for (let k = 1; k <= s.storeys; k++) {
        for (let j = 0; j <= s.ny; j++) for (let i = 0; i < s.nx; i++) member(`bx${i}_${j}_${k}`, id(i, j, k), id(i + 1, j, k), 1);
        for (let j = 0; j < s.ny; j++) for (let i = 0; i <= s.nx; i++) member(`by${i}_${j}_${k}`, id(i, j, k), id(i, j + 1, k), 1);
      }
      const supports = [];
      for (let j = 0; j <= s.ny; j++) for (let i = 0; i <= s.nx; i++) supports.push({ node: id(i, j, 0), fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] as Array<'ux'> });
      const model: Model = { format: 'eigenframe-model/1', space: 'space', mass: s.mass, ...groups(s.props, 'space'), nodes, elements, supports, springs: [], masses: [] };
      return { family: 'space-frame' as const, model };
    });
}

/** A vector from `v` that is safely off the member axis a→b (sine ≥ 0.3), as [x, y, z]. */
function orientationFor(a: NodeSpec, b: NodeSpec, v: number[]): [number, number, number] {
  const d = [b.x - a.x, b.y - a.y, (b.z ?? 0) - (a.z ?? 0)];
  const L = Math.hypot(d[0], d[1], d[2]);
  const sine = (u: number[]) => Math.hypot(d[1] * u[2] - d[2] * u[1], d[2] * u[0] - d[0] * u[2], d[0] * u[1] - d[1] * u[0]) / (L * Math.hypot(u[0], u[1], u[2]) || 1);
  if (Math.hypot(v[0], v[1], v[2]) > 0.1 && sine(v) >= 0.3) return [v[0], v[1], v[2]];
  // The global axis least aligned with the member is at least 54.7° away from it.
  const k = [0, 1, 2].reduce((m, i) => (Math.abs(d[i]) < Math.abs(d[m]) ? i : m), 0);
  return [k === 0 ? 1 : 0, k === 1 ? 1 : 0, k === 2 ? 1 : 0];
}

/**
 * Triangular space-truss tower of `levels` levels: three nodes per level on a circle (twisted
 * and perturbed), a ring of three bars per level, three legs and one diagonal per side panel;
 * base nodes pinned (ux, uy, uz). Nine bars per level for nine DOFs: statically determinate
 * and stable (each side panel triangulated, each level a rigid triangle).
 */
export function spaceTrussArb(mass: MassKind | 'any' = 'any'): fc.Arbitrary<GeneratedModel> {
  return fc
    .record({
      levels: fc.integer({ min: 1, max: 5 }),
      radius: fc.double({ min: 0.8, max: 2, noNaN: true }),
      height: fc.double({ min: 1.5, max: 3, noNaN: true }),
      twist: fc.double({ min: -0.3, max: 0.3, noNaN: true }),
      j: fc.array(fc.double({ min: -0.1, max: 0.1, noNaN: true }), { minLength: 54, maxLength: 54 }),
      props: fc.array(propsArb, { minLength: 2, maxLength: 2 }),
      mass: mass === 'any' ? fc.constantFrom<MassKind>('consistent', 'lumped') : fc.constant(mass),
    })
    .map((s) => {
      const nodes: NodeSpec[] = [];
      for (let k = 0; k <= s.levels; k++) {
        for (let c = 0; c < 3; c++) {
          const t = (2 * Math.PI * c) / 3 + k * s.twist;
          const q = 3 * (3 * k + c);
          nodes.push({ id: `p${k}_${c}`, x: s.radius * Math.cos(t) + s.j[q], y: s.radius * Math.sin(t) + s.j[q + 1], z: k * s.height + (k === 0 ? 0 : s.j[q + 2]) });
        }
      }
      const elements: ElementSpec[] = [];
      const bar = (id: string, a: string, b: string, g: number) => elements.push({ id, kind: 'bar', nodes: [a, b], material: `m${g}`, section: `s${g}` });
      for (let k = 1; k <= s.levels; k++) {
        for (let c = 0; c < 3; c++) {
          bar(`r${k}_${c}`, `p${k}_${c}`, `p${k}_${(c + 1) % 3}`, 1);
          bar(`l${k}_${c}`, `p${k - 1}_${c}`, `p${k}_${c}`, 0);
          bar(`d${k}_${c}`, `p${k - 1}_${c}`, `p${k}_${(c + 1) % 3}`, 1);
        }
      }
      const supports = [0, 1, 2].map((c) => ({ node: `p0_${c}`, fixed: ['ux', 'uy', 'uz'] as Array<'ux'> }));
      const model: Model = { format: 'eigenframe-model/1', space: 'space', mass: s.mass, ...groups(s.props, 'space'), nodes, elements, supports, springs: [], masses: [] };
      return { family: 'space-truss' as const, model };
    });
}

/**
 * A random tree of beams in space or in the plane: node 0 clamped, each further node joined to
 * an earlier one by a member of random direction and length 1–3 m. A clamped tree of rigidly
 * jointed members is stable. Skew members make the lumped mass singular without zero rows
 * (a node reached by one member has torsional inertia about that member only). Layouts with
 * two nodes closer than 0.3 m are discarded (they would be refused as coincident or be
 * pathologically short-coupled).
 */
export function treeArb(space: 'plane' | 'space', mass: MassKind | 'any' = 'any'): fc.Arbitrary<GeneratedModel> {
  return fc
    .record({
      count: fc.integer({ min: 2, max: 9 }),
      parents: fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: 9, maxLength: 9 }),
      dirs: fc.array(unit, { minLength: 27, maxLength: 27 }),
      lengths: fc.array(fc.double({ min: 1, max: 3, noNaN: true }), { minLength: 9, maxLength: 9 }),
      orient: fc.array(unit, { minLength: 27, maxLength: 27 }),
      props: fc.array(propsArb, { minLength: 2, maxLength: 2 }),
      kind: fc.constantFrom<ElementKind>('beam', 'beam', 'timoshenko'),
      mass: mass === 'any' ? fc.constantFrom<MassKind>('consistent', 'lumped') : fc.constant(mass),
    })
    .filter((s) => {
      const pts = treePoints(s, space);
      for (let i = 0; i < pts.length; i++) for (let j = 0; j < i; j++) if (Math.hypot(pts[i][0] - pts[j][0], pts[i][1] - pts[j][1], pts[i][2] - pts[j][2]) < 0.3) return false;
      return true;
    })
    .map((s) => {
      const pts = treePoints(s, space);
      const nodes: NodeSpec[] = pts.map((p, i) => (space === 'plane' ? { id: `t${i}`, x: p[0], y: p[1] } : { id: `t${i}`, x: p[0], y: p[1], z: p[2] }));
      const elements: ElementSpec[] = [];
      for (let i = 1; i < s.count; i++) {
        const parent = Math.floor(s.parents[i - 1] * i);
        const e: ElementSpec = { id: `m${i}`, kind: s.kind, nodes: [`t${parent}`, `t${i}`], material: `m${i % 2}`, section: `s${i % 2}` };
        if (space === 'space') e.orientation = orientationFor(nodes[parent], nodes[i], s.orient.slice(3 * (i - 1), 3 * i));
        elements.push(e);
      }
      const fixed = space === 'plane' ? (['ux', 'uy', 'rz'] as Array<'ux'>) : (['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] as Array<'ux'>);
      const model: Model = { format: 'eigenframe-model/1', space, mass: s.mass, ...groups(s.props, space), nodes, elements, supports: [{ node: 't0', fixed }], springs: [], masses: [] };
      return { family: space === 'plane' ? ('plane-frame' as const) : ('space-frame' as const), model };
    });
}

function treePoints(s: { count: number; parents: number[]; dirs: number[]; lengths: number[] }, space: 'plane' | 'space'): Array<[number, number, number]> {
  const pts: Array<[number, number, number]> = [[0, 0, 0]];
  for (let i = 1; i < s.count; i++) {
    const p = pts[Math.floor(s.parents[i - 1] * i)];
    let d = [s.dirs[3 * (i - 1)], s.dirs[3 * (i - 1) + 1], space === 'plane' ? 0 : s.dirs[3 * (i - 1) + 2]];
    let len = Math.hypot(d[0], d[1], d[2]);
    if (len < 0.2) {
      d = [1, 0.5, 0];
      len = Math.hypot(1, 0.5);
    }
    const L = s.lengths[i - 1];
    pts.push([p[0] + (L * d[0]) / len, p[1] + (L * d[1]) / len, p[2] + (L * d[2]) / len]);
  }
  return pts;
}

/** Any of the families. */
export function modelArb(mass: MassKind | 'any' = 'any'): fc.Arbitrary<GeneratedModel> {
  return fc.oneof(planeFrameArb(mass), planeTrussArb(mass), spaceFrameArb(mass), spaceTrussArb(mass), treeArb('plane', mass), treeArb('space', mass));
}

// ---------------------------------------------------------------------------------------------
// Transformations that must not change the frequencies

/** Rotation matrix (row-major 3 × 3) from a unit quaternion built from four numbers. */
export function rotationMatrix(q: readonly number[]): number[] {
  let [w, x, y, z] = q;
  const n = Math.hypot(w, x, y, z) || 1;
  w /= n; x /= n; y /= n; z /= n;
  return [
    1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y),
    2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x),
    2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y),
  ];
}

/**
 * The model turned rigidly about the origin: in the plane by `angle` about z; in space by the
 * rotation R (row-major), orientation vectors rotated along. Supports fix full nodal DOF sets
 * (all translations, or all DOFs), which a rotation maps onto themselves.
 */
export function rotateModel(model: Model, angle: number, R: number[]): Model {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const apply = (v: [number, number, number]): [number, number, number] =>
    model.space === 'plane'
      ? [c * v[0] - s * v[1], s * v[0] + c * v[1], 0]
      : [R[0] * v[0] + R[1] * v[1] + R[2] * v[2], R[3] * v[0] + R[4] * v[1] + R[5] * v[2], R[6] * v[0] + R[7] * v[1] + R[8] * v[2]];
  const nodes = model.nodes.map((n) => {
    const [x, y, z] = apply([n.x, n.y, n.z ?? 0]);
    return model.space === 'plane' ? { id: n.id, x, y } : { id: n.id, x, y, z };
  });
  const elements = model.elements.map((e) => (e.orientation ? { ...e, orientation: apply(e.orientation) } : { ...e }));
  return { ...model, nodes, elements };
}

/** Fisher–Yates shuffle of a copy, driven by a list of numbers in [0, 1). */
function shuffled<T>(a: readonly T[], r: readonly number[], offset: number): T[] {
  const out = a.slice();
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(r[(offset + i) % r.length] * (i + 1));
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

/**
 * The same structure with nodes, elements and supports listed in another order, and some
 * elements' end nodes swapped (the member is the same; its local x axis reverses).
 */
export function renumberModel(model: Model, r: readonly number[]): Model {
  const elements = shuffled(model.elements, r, 0).map((e, i) => (r[(i * 7 + 3) % r.length] < 0.5 ? { ...e, nodes: [e.nodes[1], e.nodes[0]] as [string, string] } : e));
  return {
    ...model,
    nodes: shuffled(model.nodes, r, 11),
    elements,
    supports: shuffled(model.supports ?? [], r, 23),
  };
}

// ---------------------------------------------------------------------------------------------
// Random sparse SPD pairs


export interface PairSpec {
  n: number;
  perRow: number;
  seed: number;
  /** Mass: diagonal, or banded SPD (tridiagonal, diagonally dominant). */
  mass: 'diagonal' | 'banded';
}

export const pairSpecArb: fc.Arbitrary<PairSpec> = fc.record({
  n: fc.integer({ min: 20, max: 300 }),
  perRow: fc.integer({ min: 1, max: 4 }),
  seed: fc.integer({ min: 1, max: 2 ** 30 }),
  mass: fc.constantFrom<'diagonal' | 'banded'>('diagonal', 'banded'),
});

/**
 * A sparse symmetric positive definite pair: K = a spring chain (so it is connected) plus
 * `perRow` random couplings per row, made strictly diagonally dominant (Gershgorin: SPD, and
 * λ_max/λ_min ≲ 1e3);
 * M diagonal or tridiagonal, diagonally dominant, entries 1–3.
 */
export function randomPair(s: PairSpec): { K: SymmetricCsc; M: SymmetricCsc } {
  const r = rng(s.seed);
  const n = s.n;
  const off: Array<[number, number, number]> = [];
  for (let i = 1; i < n; i++) off.push([i, i - 1, -(0.5 + r())]);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < s.perRow; k++) {
      const j = Math.floor(r() * n);
      if (j !== i) off.push([i, j, r() - 0.5]);
    }
  }
  const rowSum = new Float64Array(n);
  const K = new CooBuilder(n, off.length + n);
  for (const [i, j, v] of off) {
    K.add(i, j, v);
    rowSum[i] += Math.abs(v);
    rowSum[j] += Math.abs(v);
  }
  // Diagonal spread 0.05 … 50 with few small values (r³): the low end of the spectrum is
  // sparse, as in structures, instead of one dense cluster.
  for (let i = 0; i < n; i++) K.add(i, i, rowSum[i] + 0.05 + 50 * r() ** 3);
  const M = new CooBuilder(n, 2 * n);
  for (let i = 0; i < n; i++) M.add(i, i, 1 + 2 * r());
  if (s.mass === 'banded') for (let i = 1; i < n; i++) M.add(i, i - 1, 0.4 * (r() - 0.5));
  return { K: K.toCsc(), M: M.toCsc() };
}

// ---------------------------------------------------------------------------------------------
// Dense references (ml-matrix)

/** Dense copy of a lower-stored symmetric matrix as an ml-matrix Matrix. */
export function dense(a: SymmetricCsc): Matrix {
  const d = toDenseArray(a);
  const m = new Matrix(a.n, a.n);
  for (let i = 0; i < a.n; i++) for (let j = 0; j < a.n; j++) m.set(i, j, d[i * a.n + j]);
  return m;
}

/** Numerical rank of a symmetric positive semidefinite matrix (eigenvalues above 1e-10 · largest), by ml-matrix. */
export function psdRank(a: SymmetricCsc): number {
  const ev = new EigenvalueDecomposition(dense(a), { assumeSymmetric: true }).realEigenvalues;
  const top = Math.max(...ev.map(Math.abs));
  return ev.filter((v) => v > 1e-10 * top).length;
}

/** Relative difference |a − b| / |b| (|b| floored at `floor`). */
export const rel = (a: number, b: number, floor = 1e-300): number => Math.abs(a - b) / Math.max(Math.abs(b), floor);

/**
 * Eigenvalues of K x = λ M x, ascending, by ml-matrix on the flexibility form: K = L Lᵀ
 * (Cholesky), μ = eigenvalues of L⁻¹ M L⁻ᵀ, λ = 1/μ (μ > 0 only: massless DOFs give μ = 0).
 * Resolves the lowest λ (largest μ) to about ε·cond(L), whatever the spread of M; needs K
 * positive definite.
 */
export function flexibilityEigenvalues(K: SymmetricCsc, M: SymmetricCsc): number[] {
  const n = K.n;
  const chol = new CholeskyDecomposition(dense(K));
  if (!chol.isPositiveDefinite()) throw new Error('K is not positive definite');
  const L = chol.lowerTriangularMatrix;
  const fwd = (B: Matrix): Matrix => {
    const X = B.clone();
    for (let c = 0; c < n; c++) {
      for (let i = 0; i < n; i++) {
        let s = X.get(i, c);
        for (let k = 0; k < i; k++) s -= L.get(i, k) * X.get(k, c);
        X.set(i, c, s / L.get(i, i));
      }
    }
    return X;
  };
  const C = fwd(fwd(dense(M)).transpose());
  for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) C.set(i, j, 0.5 * (C.get(i, j) + C.get(j, i))), C.set(j, i, C.get(i, j));
  const mu = new EigenvalueDecomposition(C, { assumeSymmetric: true }).realEigenvalues;
  const top = Math.max(...mu);
  return mu.filter((v) => v > 1e-13 * top).map((v) => 1 / v).sort((a, b) => a - b);
}
