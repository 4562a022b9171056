/**
 * Physical range checks of model validation (docs/model-format.md, "Physical ranges"): every
 * value outside its range is a ModelError whose path names the item and whose message gives the
 * value, the allowed range and the fix; values real models use (rigid links, massless point masses,
 * heavy ballast, bounds themselves) pass. Models are invented test data.
 */
import { describe, expect, it } from 'vitest';
import { ModelError } from '../src/errors';
import { modalAnalysis } from '../src/modal/analysis';
import { MODEL_LIMITS, validateModel } from '../src/model/read';

const STEEL_E = 2.1e11; // Pa, steel (from memory, common practice)

/** A plane portal (invented demo data) with a Timoshenko beam, a bar, a spring and a point mass. */
const good = () => ({
  format: 'eigenframe-model/1',
  space: 'plane',
  materials: { steel: { E: STEEL_E, G: 8.1e10, density: 7850 } },
  sections: { col: { A: 6e-3, Iz: 3e-5, kappa: 0.53 }, rod: { A: 1e-3 } },
  nodes: [
    { id: 'a', x: 0, y: 0 },
    { id: 'b', x: 0, y: 3 },
    { id: 'c', x: 4, y: 3 },
    { id: 'd', x: 4, y: 0 },
  ],
  elements: [
    { id: 'c1', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 'col' },
    { id: 'g1', kind: 'timoshenko', nodes: ['b', 'c'], material: 'steel', section: 'col' },
    { id: 'c2', kind: 'beam', nodes: ['c', 'd'], material: 'steel', section: 'col' },
    { id: 'br', kind: 'bar', nodes: ['a', 'c'], material: 'steel', section: 'rod' },
  ],
  supports: [{ node: 'a', fixed: ['ux', 'uy', 'rz'] }, { node: 'd', fixed: ['ux', 'uy', 'rz'] }],
  springs: [{ node: 'c', dof: 'uy', stiffness: 2e6 }],
  masses: [{ node: 'b', mass: 120, inertia: 3 }],
});
type Raw = ReturnType<typeof good>;

function refused(edit: (m: Raw) => void): ModelError {
  const m = good();
  edit(m);
  try {
    validateModel(m);
  } catch (e) {
    expect(e).toBeInstanceOf(ModelError);
    return e as ModelError;
  }
  return expect.unreachable('the model was accepted') as never;
}

function accepted(edit: (m: Raw) => void): void {
  const m = good();
  edit(m);
  expect(() => validateModel(m)).not.toThrow();
}

describe('values outside the physical range are refused with path, value, range and fix', () => {
  // [name, edit, path, value as printed, range fragment, fix fragment]
  const cases: Array<[string, (m: Raw) => void, string, string, string, RegExp]> = [
    // E in Pa entered ×1e12 too large (e.g. a unit slip): beyond the 1e20 Pa bound that still admits E × 1e8 rigid links.
    ['E above 1e20 Pa', (m) => (m.materials.steel.E = 2.1e23), 'materials.steel.E', '2.1e+23', 'a number > 0 (Pa) and ≤ 1e+20', /check the units: E is in Pa/],
    ['G above 1e20 Pa', (m) => (m.materials.steel.G = 8.1e22), 'materials.steel.G', '8.1e+22', 'a number > 0 (Pa) and ≤ 1e+20', /check the units: G is in Pa/],
    ['negative G', (m) => (m.materials.steel.G = -1), 'materials.steel.G', '-1', 'a number > 0 (Pa) and ≤ 1e+20', /check the units/],
    // Steel's 7850 kg/m³ (from memory) entered in g/m³.
    ['density in g/m³', (m) => (m.materials.steel.density = 7.85e9), 'materials.steel.density', '7850000000', 'a number ≥ 0 (kg/m³) and ≤ 1e+6', /density is in kg\/m³.*point masses/],
    ['negative density', (m) => (m.materials.steel.density = -7850), 'materials.steel.density', '-7850', 'a number ≥ 0 (kg/m³) and ≤ 1e+6', /kg\/m³/],
    // A 25,000 mm² plate girder entered in mm² (a slip that the bound catches; smaller sections in mm² stay below it).
    ['A above 1e4 m² (a section in mm²)', (m) => (m.sections.col.A = 2.5e4), 'sections.col.A', '25000', 'a number > 0 (m²) and ≤ 10000', /A is in m²/],
    ['Iz above 1e8 m⁴ (a section in mm⁴)', (m) => (m.sections.col.Iz = 8.356e8), 'sections.col.Iz', '835600000', 'a number > 0 (m⁴) and ≤ 1e+8', /Iz is in m⁴/],
    ['kappa above 1.5 (the reciprocal form factor)', (m) => (m.sections.col.kappa = 2), 'sections.col.kappa', '2', 'a number > 0 (dimensionless) and ≤ 1.5', /not its reciprocal/],
    ['negative kappa', (m) => (m.sections.col.kappa = -0.5), 'sections.col.kappa', '-0.5', 'a number > 0 (dimensionless) and ≤ 1.5', /shear correction factor/],
    ['coordinate beyond 1e7 m', (m) => (m.nodes[2].x = 4e9), 'nodes[2].x', '4000000000', 'a finite number (m) with |value| ≤ 1e+7', /coordinates are in m/],
    ['negative coordinate beyond 1e7 m', (m) => (m.nodes[1].y = -3e7), 'nodes[1].y', '-30000000', 'a finite number (m) with |value| ≤ 1e+7', /coordinates are in m/],
    ['infinite coordinate', (m) => (m.nodes[1].y = Infinity), 'nodes[1].y', 'Infinity', 'with |value| ≤ 1e+7', /coordinates are in m/],
    ['zero spring stiffness', (m) => (m.springs[0].stiffness = 0), 'springs[0].stiffness', '0', 'a number > 0 (N/m or N·m/rad)', /./],
    ['infinite spring stiffness', (m) => (m.springs[0].stiffness = Infinity), 'springs[0].stiffness', 'Infinity', 'a number > 0 (N/m or N·m/rad)', /./],
    ['negative point mass', (m) => (m.masses[0].mass = -120), 'masses[0].mass', '-120', 'a number ≥ 0 (kg)', /./],
    ['negative rotary inertia', (m) => (m.masses[0].inertia = -3), 'masses[0].inertia', '-3', 'a number ≥ 0 (kg·m²)', /./],
  ];
  for (const [name, edit, path, value, range, fix] of cases) {
    it(name, () => {
      const e = refused(edit);
      expect(e.path).toBe(path);
      expect(e.detail).toContain(` is ${value}`);
      expect(e.detail).toContain(range);
      expect(e.detail).toMatch(fix);
    });
  }

  it('a zero-length element (coincident end nodes) names the element, its nodes and the length', () => {
    const e = refused((m) => (m.nodes[2] = { id: 'c', x: 0, y: 3 + 1e-12 }));
    // Nodes b and c coincide: the element between them is refused before the coincident-node check.
    expect(e.path).toBe('elements[1].nodes');
    expect(e.detail).toMatch(/element "g1" has zero length \(its nodes "b" and "c" are at the same point: length [0-9.e-]+ m, at most [0-9.e-]+ m/);
    expect(e.detail).toMatch(/connect two distinct points/);
  });
});

describe('values real models use stay accepted', () => {
  it('a rigid link of E × 1e8 of steel (2.1e19 Pa) and a tiny density, with a massless point mass', () => {
    accepted((m) => {
      (m.materials as Record<string, unknown>).link = { E: STEEL_E * 1e8, G: 8.1e10 * 1e8, density: 1e-6 };
      m.elements[3].material = 'link';
      m.masses[0].mass = 0;
      m.masses[0].inertia = 0;
    });
  });

  it('the bounds themselves are inside the range', () => {
    accepted((m) => {
      m.materials.steel.E = MODEL_LIMITS.modulus;
      m.materials.steel.G = MODEL_LIMITS.modulus;
      m.materials.steel.density = MODEL_LIMITS.density;
      m.sections.col.A = MODEL_LIMITS.area;
      m.sections.col.Iz = MODEL_LIMITS.inertia;
      m.sections.col.kappa = MODEL_LIMITS.kappa;
      m.nodes[2].x = MODEL_LIMITS.coordinate;
      m.nodes[3].x = MODEL_LIMITS.coordinate;
    });
  });

  it('heavy ballast (lead, ≈ 11,340 kg/m³, from memory) and a large box-girder section', () => {
    accepted((m) => {
      m.materials.steel.density = 11340;
      m.sections.col.A = 20; // m², a large concrete box girder (common practice, order of magnitude)
      m.sections.col.Iz = 100; // m⁴
    });
  });

  it('a nearly massless rigid-link member (E × 1e6, density 1e-6 kg/m³) solves to finite frequencies', () => {
    const m = good();
    (m.materials as Record<string, unknown>).link = { E: STEEL_E * 1e6, G: 8.1e10 * 1e6, density: 1e-6 };
    m.elements[1].material = 'link';
    const r = modalAnalysis(validateModel(m), { count: 2, method: 'dense' });
    expect(r.modes).toHaveLength(2);
    for (const mode of r.modes) expect(Number.isFinite(mode.frequency) && mode.frequency > 0).toBe(true);
  });
});

describe('massless members (density 0)', () => {
  it('a massless bar carrying a point mass is one spring and one mass: ω² = (EA/L)/m exactly', () => {
    // Closed form of a single-degree-of-freedom oscillator (any dynamics text): the bar adds
    // stiffness EA/L and, being massless, nothing to the mass. Invented numbers.
    const E = STEEL_E, A = 2e-4, L = 2.5, mass = 40;
    const model = validateModel({
      format: 'eigenframe-model/1',
      space: 'plane',
      materials: { link: { E, density: 0 } },
      sections: { rod: { A } },
      nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: L, y: 0 }],
      elements: [{ id: 'r', kind: 'bar', nodes: ['a', 'b'], material: 'link', section: 'rod' }],
      supports: [{ node: 'a', fixed: ['ux', 'uy'] }, { node: 'b', fixed: ['uy'] }],
      masses: [{ node: 'b', mass }],
    });
    for (const method of ['dense', 'lanczos'] as const) {
      const r = modalAnalysis(model, { count: 1, method });
      expect(r.modes[0].eigenvalue / ((E * A) / L / mass)).toBeCloseTo(1, 12);
    }
  });

  it('a massless beam in a frame changes nothing but the mass: the portal still solves', () => {
    const m = good();
    (m.materials as Record<string, unknown>).link = { E: STEEL_E * 1e3, G: 8.1e10 * 1e3, density: 0 };
    m.elements[1].material = 'link';
    const r = modalAnalysis(validateModel(m), { count: 3 });
    expect(r.modes).toHaveLength(3);
    for (const mode of r.modes) expect(mode.frequency > 0 && Number.isFinite(mode.frequency)).toBe(true);
  });
});
