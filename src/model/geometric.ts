/**
 * Assembly of the geometric stiffness K_G over the free DOFs of an assembled model, from one
 * axial force per element (tension positive). Linear buckling under a reference load whose
 * member forces are N solves K φ = μ (−K_G(N)) φ; μ is the load factor. Element matrices are
 * those of elements/geometric.ts; springs and masses contribute nothing.
 */
import { barGeometricStiffnessPlane, barGeometricStiffnessSpace, planeFrameGeometricStiffness, spaceFrameGeometricStiffness } from '../elements/geometric';
import type { PlaneFrameProps, SpaceFrameProps } from '../elements/types';
import { ArgumentError } from '../errors';
import { CooBuilder, type SymmetricCsc } from '../linalg/sparse/symmetric';
import { numberDofs } from './dofs';
import type { AssembledModel } from './types';

const SLOTS_BAR_PLANE = [0, 1];
const SLOTS_BAR_SPACE = [0, 1, 2];
const SLOTS_FRAME_PLANE = [0, 1, 5];
const SLOTS_FRAME_SPACE = [0, 1, 2, 3, 4, 5];

/**
 * Geometric stiffness over the free DOFs of `asm` (same numbering and size as asm.stiffness).
 * @param asm - the assembled model
 * @param axialForce - N per element, tension positive, length = model.elements.length, in the
 *   order of model.elements
 * @returns lower-stored symmetric K_G, N/m (N·m/rad on rotations), every diagonal stored
 * @throws ArgumentError when axialForce has the wrong length or a non-finite entry
 *   (path `axialForce[i]`)
 */
export function assembleGeometric(asm: AssembledModel, axialForce: ArrayLike<number>): SymmetricCsc {
  const model = asm.model;
  const els = model.elements;
  if (axialForce.length !== els.length) {
    throw new ArgumentError(`has ${axialForce.length} entries for ${els.length} elements; give one axial force (N, tension positive) per element, in model order`, 'axialForce');
  }
  const plane = model.space === 'plane';
  const dofMap = asm.dofMap ?? numberDofs(model).dofMap;
  const index = new Map<string, number>();
  model.nodes.forEach((nd, i) => index.set(nd.id, i));
  const xyz = asm.coordinates;
  const n = asm.stiffness.n;
  let cap = n;
  for (const e of els) {
    const d = e.kind === 'bar' ? (plane ? 4 : 6) : plane ? 6 : 12;
    cap += (d * (d + 1)) / 2;
  }
  const B = new CooBuilder(n, cap);
  const ke = new Float64Array(144);
  const map = new Int32Array(12);
  for (let k = 0; k < els.length; k++) {
    const N = axialForce[k];
    if (!Number.isFinite(N)) throw new ArgumentError(`axial force of element "${els[k].id}" is ${N}; give a finite number (N, tension positive)`, `axialForce[${k}]`);
    if (N === 0) continue;
    const e = els[k];
    const a = index.get(e.nodes[0])!;
    const b = index.get(e.nodes[1])!;
    const dx = xyz[3 * b] - xyz[3 * a], dy = xyz[3 * b + 1] - xyz[3 * a + 1], dz = xyz[3 * b + 2] - xyz[3 * a + 2];
    const mat = model.materials[e.material];
    const sec = model.sections[e.section];
    const theory = e.kind === 'timoshenko' ? 'timoshenko' : 'euler-bernoulli';
    let slots: number[];
    if (e.kind === 'bar') {
      if (plane) barGeometricStiffnessPlane(N, dx, dy, ke);
      else barGeometricStiffnessSpace(N, dx, dy, dz, ke);
      slots = plane ? SLOTS_BAR_PLANE : SLOTS_BAR_SPACE;
    } else if (plane) {
      const p: PlaneFrameProps = { E: mat.E, A: sec.A, I: sec.Iz!, density: mat.density, theory, G: mat.G, kappa: sec.kappa };
      planeFrameGeometricStiffness(p, N, dx, dy, ke);
      slots = SLOTS_FRAME_PLANE;
    } else {
      const p: SpaceFrameProps = { E: mat.E, G: mat.G!, A: sec.A, Iz: sec.Iz!, Iy: sec.Iy!, J: sec.J!, Ip: sec.Ip, density: mat.density, theory, kappa: sec.kappa };
      spaceFrameGeometricStiffness(p, N, dx, dy, dz, e.orientation, ke);
      slots = SLOTS_FRAME_SPACE;
    }
    const per = slots.length;
    for (let s = 0; s < per; s++) {
      map[s] = dofMap[6 * a + slots[s]];
      map[per + s] = dofMap[6 * b + slots[s]];
    }
    const d = 2 * per;
    for (let i = 0; i < d; i++) {
      const gi = map[i];
      if (gi < 0) continue;
      for (let j = 0; j <= i; j++) {
        const gj = map[j];
        if (gj < 0) continue;
        const v = ke[i * d + j];
        if (v !== 0) B.add(gi, gj, v);
      }
    }
  }
  for (let i = 0; i < n; i++) B.add(i, i, 0);
  return B.toCsc();
}
