/**
 * A long multi-span steel space-truss footbridge made of bars only (pin-jointed, 3 DOF per node):
 * two vertical trusses (top and bottom chords, verticals, diagonals), deck cross-beams and plan
 * bracing at the bottom, top struts and plan bracing at the top, and sway bracing in the
 * cross-section over each support. Supports: pinned at both ends, guided (uy, uz fixed, free to
 * slide along x) over the intermediate piers. Invented but plausible sizes; deterministic.
 * Pure (no Node imports) so tests can import it.
 *
 * Geometry: x along the bridge, y across, z up. Panel point p (0 ≤ p ≤ panels) has four nodes,
 * bottom-left/right at z = 0 (y = 0, y = width) and top-left/right at z = depth.
 */
import type { ElementSpec, MassSpec, Model, NodeSpec, SupportSpec } from '../../src/model/types';
import { requireInteger, requirePositive } from './check';
import { STEEL, circularHollow } from './sections';

export interface TrussFootbridgeOptions {
  /** Number of panels along the bridge (≥ 1). */
  panels: number;
  /** Panel length, m. @defaultValue 2.5 */
  panelLength?: number;
  /** Distance between the two vertical trusses, m. @defaultValue 3 */
  width?: number;
  /** Truss depth (chord centre lines), m. @defaultValue 3 */
  depth?: number;
  /** Panels per span: a pier every `spanPanels` panel points (the last span may be shorter). @defaultValue 20 */
  spanPanels?: number;
  /** Deck mass per unit area, kg/m², lumped at the bottom nodes. @defaultValue 250 */
  deckMass?: number;
}

export const FOOTBRIDGE_DEFAULTS = { panelLength: 2.5, width: 3, depth: 3, spanPanels: 20, deckMass: 250 } as const;

/** The four node ids of panel point p: bottom-left, bottom-right, top-left, top-right. */
export function footbridgeNodeIds(p: number): [string, string, string, string] {
  return [`bl${p}`, `br${p}`, `tl${p}`, `tr${p}`];
}

/** Panel points that carry a support: 0, every multiple of spanPanels, and the last one. */
export function footbridgeSupportPoints(panels: number, spanPanels: number): number[] {
  const pts: number[] = [];
  for (let p = 0; p <= panels; p += spanPanels) pts.push(p);
  if (pts[pts.length - 1] !== panels) pts.push(panels);
  return pts;
}

/**
 * Builds the footbridge. With P panels and S support points: nodes 4(P+1); elements
 * 8P (chords, side diagonals, plan bracing) + 4(P+1) (verticals, cross-beams, top struts)
 * + S (sway braces), all kind "bar"; free DOFs 12(P+1) − 12 − 4(S − 2).
 *
 * Sections (invented, plausible circular hollow sections): chords 219.1×10, verticals and side
 * diagonals 114.3×6.3, deck cross-beams 168.3×8, plan and sway bracing 88.9×5.
 * Deck mass: a 100 mm concrete deck with surfacing ≈ 250 kg/m², lumped at the bottom nodes.
 *
 * @throws ArgumentError naming the option when a count is not a positive integer or a length
 *   is not positive.
 */
export function trussFootbridge(options: TrussFootbridgeOptions): Model {
  const o = { ...FOOTBRIDGE_DEFAULTS, ...options };
  const P = requireInteger(o.panels, 1, 'panels');
  const L = requirePositive(o.panelLength, 'panelLength');
  const W = requirePositive(o.width, 'width');
  const H = requirePositive(o.depth, 'depth');
  const span = requireInteger(o.spanPanels, 1, 'spanPanels');
  const deckMass = requirePositive(o.deckMass, 'deckMass');

  const nodes: NodeSpec[] = [];
  for (let p = 0; p <= P; p++) {
    const [bl, br, tl, tr] = footbridgeNodeIds(p);
    const x = p * L;
    nodes.push({ id: bl, x, y: 0, z: 0 }, { id: br, x, y: W, z: 0 }, { id: tl, x, y: 0, z: H }, { id: tr, x, y: W, z: H });
  }

  const elements: ElementSpec[] = [];
  const bar = (id: string, a: string, b: string, section: string): void => {
    elements.push({ id, kind: 'bar', nodes: [a, b], material: 'steel', section });
  };
  for (let p = 0; p <= P; p++) {
    const [bl, br, tl, tr] = footbridgeNodeIds(p);
    bar(`vl${p}`, bl, tl, 'web');
    bar(`vr${p}`, br, tr, 'web');
    bar(`cb${p}`, bl, br, 'crossBeam');
    bar(`ts${p}`, tl, tr, 'bracing');
    if (p === P) break;
    const [bl1, br1, tl1, tr1] = footbridgeNodeIds(p + 1);
    bar(`bcl${p}`, bl, bl1, 'chord');
    bar(`bcr${p}`, br, br1, 'chord');
    bar(`tcl${p}`, tl, tl1, 'chord');
    bar(`tcr${p}`, tr, tr1, 'chord');
    // Diagonals alternate direction panel by panel (a Warren pattern with verticals).
    const even = p % 2 === 0;
    bar(`dl${p}`, even ? bl : tl, even ? tl1 : bl1, 'web');
    bar(`dr${p}`, even ? br : tr, even ? tr1 : br1, 'web');
    bar(`pb${p}`, even ? bl : br, even ? br1 : bl1, 'bracing');
    bar(`pt${p}`, even ? tl : tr, even ? tr1 : tl1, 'bracing');
  }

  const supportPoints = footbridgeSupportPoints(P, span);
  const supports: SupportSpec[] = [];
  for (const p of supportPoints) {
    const [bl, br, , tr] = footbridgeNodeIds(p);
    // Sway brace: triangulates the cross-section over the support (else the box can rack).
    bar(`sw${p}`, bl, tr, 'bracing');
    const end = p === 0 || p === P;
    supports.push({ node: bl, fixed: end ? ['ux', 'uy', 'uz'] : ['uy', 'uz'] });
    supports.push({ node: br, fixed: end ? ['ux', 'uy', 'uz'] : ['uy', 'uz'] });
  }

  const masses: MassSpec[] = [];
  for (let p = 0; p <= P; p++) {
    const [bl, br] = footbridgeNodeIds(p);
    const m = deckMass * (W / 2) * (p === 0 || p === P ? L / 2 : L);
    masses.push({ node: bl, mass: m }, { node: br, mass: m });
  }

  return {
    format: 'eigenframe-model/1',
    title: `truss footbridge, ${P} panels of ${L} m, spans of ${span} panels`,
    space: 'space',
    mass: 'consistent',
    materials: { steel: { ...STEEL } },
    sections: {
      chord: circularHollow(0.2191, 0.01),
      web: circularHollow(0.1143, 0.0063),
      crossBeam: circularHollow(0.1683, 0.008),
      bracing: circularHollow(0.0889, 0.005),
    },
    nodes,
    elements,
    supports,
    masses,
  };
}
