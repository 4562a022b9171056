/**
 * Assembly of K and M over the free DOFs (dofs.ts numbering). Element matrices are computed in
 * global axes into reused typed-array buffers and scattered, lower triangle only, into a
 * CooBuilder sized up front; supported DOFs (index −1) are dropped, which imposes the
 * supports by elimination. Springs add to K, point masses to M's diagonal.
 *
 * Pattern: entries that are exactly zero in an element's global matrix (e.g. the axial–bending
 * coupling of a member along a global axis) are not stored; every free DOF's diagonal is.
 * K and M may therefore have different patterns (combine them with `unionPattern`).
 *
 * Mechanisms (free DOFs nothing stiffens) are NOT an error here; see mechanisms.ts.
 */
import { ModelError } from '../errors';
import { CooBuilder } from '../linalg/sparse/symmetric';
import { DOF_SLOT, numberDofs } from './dofs';
import { fillElementMatrices, type FrameProps } from './element-matrices';
import type { AssembledModel, Model } from './types';

/**
 * Assembles stiffness and mass of a validated model (see validateModel / parseModel).
 * @returns K and M over the free DOFs (lower-stored CSC, N/m and kg; N·m/rad and kg·m² on
 *   rotations), the free DOF list, node coordinates (m), and `dofMap`
 *   (dofMap[6·node + slot] = free index or −1; slot order ux uy uz rx ry rz)
 * @throws ModelError (path `elements[i]`) when an element's matrices overflow to a non-finite
 *   entry (properties that are each valid but combine beyond double precision)
 */
export function assemble(model: Model): AssembledModel {
  const plane = model.space === 'plane';
  const { dofMap, dofs, nodeIndex, used } = numberDofs(model);
  const n = dofs.length;
  const nNodes = model.nodes.length;
  const coordinates = new Float64Array(3 * nNodes);
  for (let i = 0; i < nNodes; i++) {
    const p = model.nodes[i];
    coordinates[3 * i] = p.x;
    coordinates[3 * i + 1] = p.y;
    coordinates[3 * i + 2] = p.z ?? 0;
  }

  // Capacity: each element contributes d(d+1)/2 lower entries to each matrix.
  let cap = n;
  for (const e of model.elements) {
    const d = e.kind === 'bar' ? (plane ? 4 : 6) : plane ? 6 : 12;
    cap += (d * (d + 1)) / 2;
  }
  cap += 2 * (model.springs?.length ?? 0) + 1;
  const K = new CooBuilder(n, cap + 3 * (model.springs?.length ?? 0));
  const M = new CooBuilder(n, cap + 6 * (model.masses?.length ?? 0));

  const ke = new Float64Array(144);
  const me = new Float64Array(144);
  const map = new Int32Array(12);
  const propsCache = new Map<string, FrameProps>();

  const scatter = (B: CooBuilder, a: Float64Array, d: number): void => {
    for (let i = 0; i < d; i++) {
      const gi = map[i];
      if (gi < 0) continue;
      const row = i * d;
      for (let j = 0; j <= i; j++) {
        const gj = map[j];
        if (gj < 0) continue;
        const v = a[row + j];
        if (v !== 0 || i === j) B.add(gi, gj, v);
      }
    }
  };

  for (let ei = 0; ei < model.elements.length; ei++) {
    const e = model.elements[ei];
    const a = nodeIndex.get(e.nodes[0])!;
    const b = nodeIndex.get(e.nodes[1])!;
    const dx = coordinates[3 * b] - coordinates[3 * a];
    const dy = coordinates[3 * b + 1] - coordinates[3 * a + 1];
    const dz = coordinates[3 * b + 2] - coordinates[3 * a + 2];
    const slots = fillElementMatrices(model, e, dx, dy, dz, ke, me, propsCache);
    const per = slots.length;
    checkFinite(e.id, ei, ke, me, (2 * per) ** 2);
    for (let s = 0; s < per; s++) {
      map[s] = dofMap[6 * a + slots[s]];
      map[per + s] = dofMap[6 * b + slots[s]];
    }
    scatter(K, ke, 2 * per);
    scatter(M, me, 2 * per);
  }

  for (const s of model.springs ?? []) {
    const slot = DOF_SLOT[s.dof];
    const i = dofMap[6 * nodeIndex.get(s.node)! + slot];
    const j = s.to === undefined ? -1 : dofMap[6 * nodeIndex.get(s.to)! + slot];
    if (i >= 0) K.add(i, i, s.stiffness);
    if (j >= 0) K.add(j, j, s.stiffness);
    if (i >= 0 && j >= 0) K.add(i, j, -s.stiffness);
  }
  for (const pm of model.masses ?? []) {
    const node = nodeIndex.get(pm.node)!;
    const rot = pm.inertia ?? 0;
    for (let slot = 0; slot < 6; slot++) {
      const g = dofMap[6 * node + slot];
      if (g < 0 || !(used[node] & (1 << slot))) continue;
      const v = slot < 3 ? pm.mass : rot;
      if (v !== 0) M.add(g, g, v);
    }
  }
  // Every free DOF gets a stored diagonal in both matrices (zero when nothing adds to it), so
  // the patterns always hold the diagonal the factorization and the mechanism check look at.
  for (let i = 0; i < n; i++) {
    K.add(i, i, 0);
    M.add(i, i, 0);
  }
  return { model, stiffness: K.toCsc(), mass: M.toCsc(), dofs, coordinates, dofMap };
}

/**
 * Every property passes validation one by one (finite, > 0), yet a combination can overflow or
 * underflow in the element formulas (e.g. κ = 1e-300 gives an infinite shear parameter, and
 * 0 · ∞ = NaN in the Timoshenko matrices; E = 1e300 with A = 1e300 overflows). Such an element
 * would reach the solver as NaN; it is refused here, by name.
 * @throws ModelError (path `elements[i]`) when an entry of the element's stiffness or mass is not finite
 */
function checkFinite(id: string, index: number, ke: Float64Array, me: Float64Array, size: number): void {
  for (let k = 0; k < size; k++) {
    if (!Number.isFinite(ke[k]) || !Number.isFinite(me[k])) {
      const which = Number.isFinite(ke[k]) ? 'mass' : 'stiffness';
      throw new ModelError(
        `element "${id}" has a ${which} matrix entry that is ${Number.isFinite(ke[k]) ? me[k] : ke[k]} (its properties overflow or underflow in double precision); check E, G, density, A, Iz, Iy, J and kappa of its material and section for values far outside the physical range`,
        `elements[${index}]`,
      );
    }
  }
}
