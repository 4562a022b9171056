// Model builders shared by the examples: plain functions that return eigenframe-model/1
// objects. They import nothing, so a test (or your own script) can build the very same model.
//
// Every structure here is invented for the demos; the section formulas are textbook ones
// (cited beside each). SI units throughout: m, m², m⁴, kg, Pa.

/** Structural steel (common values): E = 210 GPa, G = 81 GPa, ρ = 7850 kg/m³. */
export const STEEL = { E: 2.1e11, G: 8.1e10, density: 7850 };

/**
 * Section properties of a rectangular hollow (box) section, width b (horizontal), depth h
 * (vertical), uniform wall t, all in m. A, Iy (bending in the vertical plane, about the
 * horizontal axis) and Iz (bending in the horizontal plane) are the exact differences of two
 * rectangles; J is Bredt's thin-walled closed-section formula J = 4 Am² t / p, with Am and p the
 * area enclosed by and the length of the wall's mid-line (e.g. Roark's Formulas for Stress and
 * Strain, torsion of thin-walled closed sections; from memory).
 */
export function boxSection(b, h, t) {
  const bi = b - 2 * t;
  const hi = h - 2 * t;
  const Am = (b - t) * (h - t);
  const p = 2 * ((b - t) + (h - t));
  return {
    A: b * h - bi * hi,
    Iy: (b * h ** 3 - bi * hi ** 3) / 12,
    Iz: (h * b ** 3 - hi * bi ** 3) / 12,
    J: (4 * Am * Am * t) / p,
  };
}

/**
 * Section properties of a doubly symmetric I-section built from plates: flange width b and
 * thickness tf, overall depth h, web thickness tw (m). Iz is the strong-axis second moment
 * (bending in the plane of the web, the only bending inertia of a plane model): flanges and web
 * as rectangles, root fillets ignored.
 */
export function iSection(h, b, tf, tw) {
  const hw = h - 2 * tf;
  return {
    A: 2 * b * tf + hw * tw,
    Iz: (b * h ** 3 - (b - tw) * hw ** 3) / 12,
  };
}

/**
 * A single-span footbridge modelled as one line of space beams along x (the deck's shear
 * centre), on fork supports: both ends held vertically, laterally and in twist; one end also
 * longitudinally. The deck (surfacing, parapets, cross girders) is a line mass lumped at the
 * nodes. Its twist inertia about the span axis, m·w²/12 per metre for a deck of width w, is
 * carried by the girder section's polar moment `Ip` (torsional inertia per metre is ρ·Ip), so
 * that it acts on the twist only and not on the bending rotations, as a node's rotary inertia
 * would.
 *
 * @param {object} o
 * @param {number} o.span - m
 * @param {number} o.elements - beam elements along the span
 * @param {{A: number, Iy: number, Iz: number, J: number}} o.girder - box girder section
 * @param {number} o.deckMass - kg per metre of span, besides the girder
 * @param {number} o.deckWidth - m
 */
export function footbridgeDeck({ span, elements, girder, deckMass, deckWidth }) {
  const dx = span / elements;
  const nodes = [];
  const els = [];
  const masses = [];
  for (let i = 0; i <= elements; i++) {
    nodes.push({ id: `d${i}`, x: i * dx, y: 0, z: 0 });
    if (i > 0) els.push({ id: `g${i}`, kind: 'beam', nodes: [`d${i - 1}`, `d${i}`], material: 'steel', section: 'girder' });
    const tributary = i === 0 || i === elements ? dx / 2 : dx;
    masses.push({ node: `d${i}`, mass: deckMass * tributary });
  }
  const Ip = girder.Iy + girder.Iz + (deckMass * deckWidth * deckWidth) / (12 * STEEL.density);
  return {
    format: 'eigenframe-model/1',
    title: `Footbridge, ${span} m single span, box girder ${fmtSection(girder)}`,
    space: 'space',
    mass: 'consistent',
    materials: { steel: STEEL },
    sections: { girder: { ...girder, Ip } },
    nodes,
    elements: els,
    supports: [
      { node: 'd0', fixed: ['ux', 'uy', 'uz', 'rx'] },
      { node: `d${elements}`, fixed: ['uy', 'uz', 'rx'] },
    ],
    masses,
  };
}

/**
 * A vertical square-tube mast clamped at its base, with an equipment mass at the top (no rotary
 * inertia, so it loads the bending and axial modes but not the torsional ones).
 *
 * @param {object} o
 * @param {number} o.height - m
 * @param {number} o.elements - space beam elements along the height
 * @param {number} o.width - outer width of the square tube, m
 * @param {number} o.wall - wall thickness, m
 * @param {number} o.headMass - kg at the top
 */
export function squareMast({ height, elements, width, wall, headMass }) {
  const tube = boxSection(width, width, wall);
  const dz = height / elements;
  const nodes = [];
  const els = [];
  for (let i = 0; i <= elements; i++) {
    nodes.push({ id: `m${i}`, x: 0, y: 0, z: i * dz });
    if (i > 0) els.push({ id: `t${i}`, kind: 'beam', nodes: [`m${i - 1}`, `m${i}`], material: 'steel', section: 'tube' });
  }
  return {
    format: 'eigenframe-model/1',
    title: `Square mast, ${height} m, SHS ${width * 1000}x${wall * 1000} mm`,
    space: 'space',
    mass: 'consistent',
    materials: { steel: STEEL },
    sections: { tube },
    nodes,
    elements: els,
    supports: [{ node: 'm0', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }],
    masses: headMass > 0 ? [{ node: `m${elements}`, mass: headMass }] : [],
  };
}

/**
 * A plane portal frame carrying a machine: two columns clamped at their feet and a beam on top
 * with the machine's mass at mid-span.
 *
 * @param {object} o
 * @param {number} o.height - column height, m
 * @param {number} o.span - beam span, m
 * @param {{A: number, Iz: number}} o.column - column section
 * @param {{A: number, Iz: number}} o.beam - beam section
 * @param {number} o.machineMass - kg at mid-span
 * @param {number} o.perMember - elements per column; the beam gets twice as many
 */
export function machinePortal({ height, span, column, beam, machineMass, perMember }) {
  const nodes = [];
  const els = [];
  const nc = perMember;
  const nb = 2 * perMember;
  for (let i = 0; i <= nc; i++) nodes.push({ id: `L${i}`, x: 0, y: (i * height) / nc });
  for (let i = 0; i <= nc; i++) nodes.push({ id: `R${i}`, x: span, y: (i * height) / nc });
  for (let i = 1; i < nb; i++) nodes.push({ id: `B${i}`, x: (i * span) / nb, y: height });
  const beamNode = (i) => (i === 0 ? `L${nc}` : i === nb ? `R${nc}` : `B${i}`);
  for (let i = 1; i <= nc; i++) {
    els.push({ id: `cl${i}`, kind: 'beam', nodes: [`L${i - 1}`, `L${i}`], material: 'steel', section: 'column' });
    els.push({ id: `cr${i}`, kind: 'beam', nodes: [`R${i - 1}`, `R${i}`], material: 'steel', section: 'column' });
  }
  for (let i = 1; i <= nb; i++) {
    els.push({ id: `b${i}`, kind: 'beam', nodes: [beamNode(i - 1), beamNode(i)], material: 'steel', section: 'beam' });
  }
  return {
    format: 'eigenframe-model/1',
    title: `Machine portal, ${span} m x ${height} m`,
    space: 'plane',
    mass: 'consistent',
    materials: { steel: STEEL },
    sections: { column, beam },
    nodes,
    elements: els,
    supports: [
      { node: 'L0', fixed: ['ux', 'uy', 'rz'] },
      { node: 'R0', fixed: ['ux', 'uy', 'rz'] },
    ],
    masses: [{ node: beamNode(nb / 2), mass: machineMass }],
  };
}

function fmtSection(s) {
  return `A ${s.A.toExponential(2)} m², Iy ${s.Iy.toExponential(2)} m⁴`;
}
