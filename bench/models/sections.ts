/**
 * Section properties of the thin-walled steel shapes the benchmark models use, from their
 * dimensions. Pure functions, no Node imports (tests import them).
 *
 * Formulas: plane-section geometry; torsion constants by Bredt's formula for closed thin-walled
 * sections and by the open thin-walled sum Σ b t³ / 3 for I-sections (Timoshenko & Goodier,
 * Theory of Elasticity, 3rd ed., §112 and §115).
 */
import type { MaterialSpec, SectionSpec } from '../../src/model/types';

/** Structural steel: E = 210 GPa, G = 81 GPa, ρ = 7850 kg/m³ (common practice values). */
export const STEEL: MaterialSpec = { E: 2.1e11, G: 8.1e10, density: 7850 };

/**
 * Circular hollow section.
 * @param d - outside diameter, m
 * @param t - wall thickness, m (0 < t < d/2)
 * @returns A (m²), Iy = Iz (m⁴), J = Iy + Iz (m⁴, exact for a circular tube)
 */
export function circularHollow(d: number, t: number): SectionSpec {
  const di = d - 2 * t;
  const A = (Math.PI / 4) * (d * d - di * di);
  const I = (Math.PI / 64) * (d ** 4 - di ** 4);
  return { A, Iy: I, Iz: I, J: 2 * I };
}

/**
 * Square hollow section (sharp corners).
 * @param b - outside width, m
 * @param t - wall thickness, m (0 < t < b/2)
 * @returns A (m²), Iy = Iz (m⁴), J by Bredt: 4 Am² t / s with Am = (b − t)², s = 4 (b − t) (m⁴)
 */
export function squareHollow(b: number, t: number): SectionSpec {
  const bi = b - 2 * t;
  const A = b * b - bi * bi;
  const I = (b ** 4 - bi ** 4) / 12;
  const bm = b - t;
  const J = (4 * bm ** 4 * t) / (4 * bm);
  return { A, Iy: I, Iz: I, J };
}

/**
 * Doubly symmetric I-section (fillets neglected), web vertical in use.
 * @param h - depth, m; @param b - flange width, m; @param tw - web thickness, m;
 * @param tf - flange thickness, m
 * @returns A (m²); Iy the strong-axis second moment (bending in the vertical plane of a horizontal
 *   member, whose local y axis is horizontal by the default orientation rule), Iz the weak-axis
 *   one (m⁴); J = (2 b tf³ + (h − 2 tf) tw³) / 3 (m⁴)
 */
export function iSection(h: number, b: number, tw: number, tf: number): SectionSpec {
  const hw = h - 2 * tf;
  const A = 2 * b * tf + hw * tw;
  const Iy = (b * h ** 3 - (b - tw) * hw ** 3) / 12;
  const Iz = (2 * tf * b ** 3) / 12 + (hw * tw ** 3) / 12;
  const J = (2 * b * tf ** 3 + hw * tw ** 3) / 3;
  return { A, Iy, Iz, J };
}
