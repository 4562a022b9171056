/**
 * A plane (x–y) steel moment frame: `bays` bays, `storeys` storeys, base nodes fixed. Used for
 * the dense baselines, where its free DOF count 3 (bays+1) storeys is chosen exactly.
 * Invented but plausible sizes; deterministic. Pure (no Node imports).
 */
import type { ElementSpec, MassSpec, Model, NodeSpec, SupportSpec } from '../../src/model/types';
import { requireInteger, requirePositive } from './check';
import { STEEL, iSection } from './sections';

export interface PlaneFrameOptions {
  /** Bays along x (≥ 1). */
  bays: number;
  /** Storeys (≥ 1). */
  storeys: number;
  /** Bay width, m. @defaultValue 6 */
  bay?: number;
  /** Storey height, m. @defaultValue 3.5 */
  storeyHeight?: number;
  /** Floor mass per metre of beam, kg/m, lumped at the floor nodes. @defaultValue 2880 */
  floorMass?: number;
}

export const PLANE_FRAME_DEFAULTS = { bay: 6, storeyHeight: 3.5, floorMass: 2880 } as const;

/** Node id at column line i on level k (k = 0 is the base). */
export function planeFrameNodeId(i: number, k: number): string {
  return `n${i}_${k}`;
}

/**
 * Builds the frame. Nodes (b+1)(s+1); elements: columns (b+1)s and beams b·s, kind "beam";
 * the b+1 base nodes are fixed in ux, uy, rz, so the free DOF count is 3 (b+1) s.
 *
 * Sections (invented, plausible): columns an I-section 360×300×12.5×22.5 bending about its strong
 * axis in the frame plane (Iz), beams an I-section 450×190×9.4×14.6 (strong axis as Iz).
 * Floor mass: 480 kg/m² slab over a 6 m tributary width = 2880 kg/m, by tributary length.
 *
 * @throws ArgumentError naming the option when a count is not a positive integer or a length
 *   is not positive.
 */
export function planeFrame(options: PlaneFrameOptions): Model {
  const o = { ...PLANE_FRAME_DEFAULTS, ...options };
  const b = requireInteger(o.bays, 1, 'bays');
  const s = requireInteger(o.storeys, 1, 'storeys');
  const bay = requirePositive(o.bay, 'bay');
  const h = requirePositive(o.storeyHeight, 'storeyHeight');
  const floorMass = requirePositive(o.floorMass, 'floorMass');

  const nodes: NodeSpec[] = [];
  for (let k = 0; k <= s; k++) for (let i = 0; i <= b; i++) nodes.push({ id: planeFrameNodeId(i, k), x: i * bay, y: k * h });

  const elements: ElementSpec[] = [];
  const masses: MassSpec[] = [];
  for (let k = 1; k <= s; k++) {
    for (let i = 0; i <= b; i++) {
      elements.push({ id: `c${i}_${k}`, kind: 'beam', nodes: [planeFrameNodeId(i, k - 1), planeFrameNodeId(i, k)], material: 'steel', section: 'column' });
    }
    for (let i = 0; i < b; i++) {
      elements.push({ id: `b${i}_${k}`, kind: 'beam', nodes: [planeFrameNodeId(i, k), planeFrameNodeId(i + 1, k)], material: 'steel', section: 'beam' });
    }
    for (let i = 0; i <= b; i++) masses.push({ node: planeFrameNodeId(i, k), mass: floorMass * (i === 0 || i === b ? bay / 2 : bay) });
  }
  const supports: SupportSpec[] = [];
  for (let i = 0; i <= b; i++) supports.push({ node: planeFrameNodeId(i, 0), fixed: ['ux', 'uy', 'rz'] });

  // In the plane the bending inertia is Iz: give each I-section its strong axis there.
  const col = iSection(0.36, 0.3, 0.0125, 0.0225);
  const beam = iSection(0.45, 0.19, 0.0094, 0.0146);
  return {
    format: 'eigenframe-model/1',
    title: `plane frame ${b} bays × ${s} storeys`,
    space: 'plane',
    mass: 'consistent',
    materials: { steel: { ...STEEL } },
    sections: { column: { A: col.A, Iz: col.Iy }, beam: { A: beam.A, Iz: beam.Iy } },
    nodes,
    elements,
    supports,
    masses,
  };
}
