/**
 * A 3D steel moment-frame building: a regular grid of columns with beams along x and y at every
 * floor, base nodes fully fixed. Invented but plausible member sizes; deterministic output.
 * Pure (no Node imports) so tests can import it.
 */
import type { ElementSpec, MassSpec, Model, NodeSpec, SupportSpec } from '../../src/model/types';
import { requireInteger, requirePositive } from './check';
import { STEEL, iSection, squareHollow } from './sections';

export interface BuildingFrameOptions {
  /** Bays along x (≥ 1). */
  baysX: number;
  /** Bays along y (≥ 1). */
  baysY: number;
  /** Storeys (≥ 1). */
  storeys: number;
  /** Bay width in x and y, m. @defaultValue 6 */
  bay?: number;
  /** Storey height, m. @defaultValue 3.5 */
  storeyHeight?: number;
  /** Floor mass per unit area, kg/m², lumped at the floor nodes by tributary area. @defaultValue 480 */
  floorMass?: number;
}

export const BUILDING_DEFAULTS = { bay: 6, storeyHeight: 3.5, floorMass: 480 } as const;

/** Node id at grid position (i, j) on level k (k = 0 is the base). */
export function buildingNodeId(i: number, j: number, k: number): string {
  return `n${i}_${j}_${k}`;
}

/**
 * Builds the frame. Nodes: (bx+1)(by+1)(s+1); elements: columns (bx+1)(by+1)s, x-beams
 * bx(by+1)s, y-beams (bx+1)by s, all kind "beam"; the (bx+1)(by+1) base nodes are fixed in all
 * six DOFs, so the free DOF count is 6 (bx+1)(by+1) s.
 *
 * Sections (invented, plausible): columns SHS 400×20, beams an I-section 450×190×9.4×14.6.
 * Floor mass: a 200 mm concrete slab ≈ 480 kg/m² (2400 kg/m³ × 0.2 m), as point masses at the
 * floor nodes by tributary area (bay² inside, half on edges, a quarter at corners).
 *
 * @throws ArgumentError naming the option when a count is not a positive integer or a length
 *   is not positive.
 */
export function buildingFrame(options: BuildingFrameOptions): Model {
  const o = { ...BUILDING_DEFAULTS, ...options };
  const bx = requireInteger(o.baysX, 1, 'baysX');
  const by = requireInteger(o.baysY, 1, 'baysY');
  const s = requireInteger(o.storeys, 1, 'storeys');
  const bay = requirePositive(o.bay, 'bay');
  const h = requirePositive(o.storeyHeight, 'storeyHeight');
  const floorMass = requirePositive(o.floorMass, 'floorMass');

  const nodes: NodeSpec[] = [];
  for (let k = 0; k <= s; k++) {
    for (let j = 0; j <= by; j++) {
      for (let i = 0; i <= bx; i++) nodes.push({ id: buildingNodeId(i, j, k), x: i * bay, y: j * bay, z: k * h });
    }
  }

  const elements: ElementSpec[] = [];
  const masses: MassSpec[] = [];
  for (let k = 1; k <= s; k++) {
    for (let j = 0; j <= by; j++) {
      for (let i = 0; i <= bx; i++) {
        elements.push({ id: `c${i}_${j}_${k}`, kind: 'beam', nodes: [buildingNodeId(i, j, k - 1), buildingNodeId(i, j, k)], material: 'steel', section: 'column' });
      }
    }
    for (let j = 0; j <= by; j++) {
      for (let i = 0; i < bx; i++) {
        elements.push({ id: `bx${i}_${j}_${k}`, kind: 'beam', nodes: [buildingNodeId(i, j, k), buildingNodeId(i + 1, j, k)], material: 'steel', section: 'beam' });
      }
    }
    for (let j = 0; j < by; j++) {
      for (let i = 0; i <= bx; i++) {
        elements.push({ id: `by${i}_${j}_${k}`, kind: 'beam', nodes: [buildingNodeId(i, j, k), buildingNodeId(i, j + 1, k)], material: 'steel', section: 'beam' });
      }
    }
    for (let j = 0; j <= by; j++) {
      const ty = j === 0 || j === by ? bay / 2 : bay;
      for (let i = 0; i <= bx; i++) {
        const tx = i === 0 || i === bx ? bay / 2 : bay;
        masses.push({ node: buildingNodeId(i, j, k), mass: floorMass * tx * ty });
      }
    }
  }

  const supports: SupportSpec[] = [];
  for (let j = 0; j <= by; j++) {
    for (let i = 0; i <= bx; i++) supports.push({ node: buildingNodeId(i, j, 0), fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] });
  }

  return {
    format: 'eigenframe-model/1',
    title: `building frame ${bx} × ${by} bays × ${s} storeys`,
    space: 'space',
    mass: 'consistent',
    materials: { steel: { ...STEEL } },
    sections: { column: squareHollow(0.4, 0.02), beam: iSection(0.45, 0.19, 0.0094, 0.0146) },
    nodes,
    elements,
    supports,
    masses,
  };
}
