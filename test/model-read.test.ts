/** Validation of eigenframe-model/1 input: every error pins its class, JSON path and message. */
import { describe, expect, it } from 'vitest';
import { ModelError } from '../src/errors';
import { parseModel, validateModel } from '../src/model/read';

// A valid space model (invented demo data) that each case breaks in one place.
const good = () => ({
  format: 'eigenframe-model/1',
  title: 'portal',
  space: 'space',
  materials: { steel: { E: 2.1e11, G: 8.1e10, density: 7850 } },
  sections: { tube: { A: 6e-3, Iz: 3e-5, Iy: 3e-5, J: 6e-5, kappa: 0.53 }, rod: { A: 1e-3 } },
  nodes: [
    { id: 'a', x: 0, y: 0, z: 0 },
    { id: 'b', x: 0, y: 0, z: 3 },
    { id: 'c', x: 4, y: 0, z: 3 },
    { id: 'd', x: 4, y: 0, z: 0 },
  ],
  elements: [
    { id: 'e1', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 'tube' },
    { id: 'e2', kind: 'timoshenko', nodes: ['b', 'c'], material: 'steel', section: 'tube' },
    { id: 'e3', kind: 'beam', nodes: ['c', 'd'], material: 'steel', section: 'tube', orientation: [1, 0, 0] },
    { id: 'e4', kind: 'bar', nodes: ['a', 'c'], material: 'steel', section: 'rod' },
  ],
  supports: [{ node: 'a', fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }, { node: 'd', fixed: ['ux', 'uy', 'uz'] }],
  springs: [{ node: 'c', dof: 'uy', stiffness: 2e6 }],
  masses: [{ node: 'b', mass: 120 }],
});
type Raw = ReturnType<typeof good> & Record<string, unknown>;

function expectModelError(raw: unknown, path: string, fragment: string | RegExp): void {
  try {
    validateModel(raw);
  } catch (e) {
    expect(e).toBeInstanceOf(ModelError);
    expect((e as ModelError).path).toBe(path);
    if (typeof fragment === 'string') expect((e as ModelError).message).toContain(fragment);
    else expect((e as ModelError).message).toMatch(fragment);
    return;
  }
  expect.unreachable(`no error for ${path}`);
}
const broken = (edit: (m: Raw) => void): Raw => {
  const m = good() as Raw;
  edit(m);
  return m;
};

describe('validateModel accepts a good model', () => {
  it('returns a normalised copy and leaves the input unchanged', () => {
    const raw = good();
    const before = JSON.stringify(raw);
    const m = validateModel(raw);
    expect(JSON.stringify(raw)).toBe(before);
    expect(m.mass).toBe('consistent'); // documented default
    expect(m.elements[2].orientation).toEqual([1, 0, 0]);
    expect(m).not.toBe(raw);
  });
});

describe('validateModel errors (class, path, message)', () => {
  const cases: [string, (m: Raw) => void, string, string | RegExp][] = [
    ['missing format', (m) => delete (m as Partial<Raw>).format, 'format', '"format" is missing; add "format": "eigenframe-model/1"'],
    ['wrong format', (m) => (m.format = 'eigenframe-model/9'), 'format', 'set it to "eigenframe-model/1"'],
    ['unknown space', (m) => (m.space = 'solid'), 'space', 'space is the string "solid"; set it to "plane" or "space"'],
    ['unknown mass kind', (m) => (m.mass = 'diagonal'), 'mass', 'set it to "consistent" or "lumped"'],
    ['unknown top-level key', (m) => (m.suports = []), 'suports', 'unknown property "suports"'],
    ['unknown node reference', (m) => (m.elements[1].nodes[1] = 'zz'), 'elements[1].nodes[1]', 'node "zz" of element "e2" is not defined; add it to "nodes" or correct the name'],
    ['undefined section', (m) => (m.elements[3].section = 'tube2'), 'elements[3].section', 'section "tube2" of element "e4" is not defined; add it to "sections" or correct the name'],
    ['undefined material', (m) => (m.elements[0].material = 'alu'), 'elements[0].material', 'material "alu" of element "e1" is not defined; add it to "materials"'],
    ['duplicate node id', (m) => (m.nodes[2].id = 'a'), 'nodes[2].id', 'node id "a" is used twice (nodes[0] and nodes[2])'],
    ['duplicate element id', (m) => (m.elements[2].id = 'e1'), 'elements[2].id', 'element id "e1" is used twice'],
    ['zero-length element', (m) => (m.elements[0].nodes = ['a', 'a']), 'elements[0].nodes', 'element "e1" has zero length'],
    ['two nodes at the same point', (m) => m.nodes.push({ id: 'a2', x: 0, y: 0, z: 0 }), 'nodes[4]', 'node "a2" is at the same point as node "a"'],
    ['negative E', (m) => (m.materials.steel.E = -2e11), 'materials.steel.E', 'E of material "steel" is -200000000000; it must be a number > 0 (Pa)'],
    ['NaN density', (m) => (m.materials.steel.density = NaN), 'materials.steel.density', 'density of material "steel" is NaN'],
    ['Infinity G', (m) => (m.materials.steel.G = Infinity), 'materials.steel.G', 'G of material "steel" is Infinity'],
    ['zero A', (m) => (m.sections.rod.A = 0), 'sections.rod.A', 'A of section "rod" is 0; it must be a number > 0 (m²)'],
    ['negative I', (m) => (m.sections.tube.Iz = -1), 'sections.tube.Iz', 'Iz of section "tube" is -1'],
    ['zero J', (m) => (m.sections.tube.J = 0), 'sections.tube.J', 'J of section "tube" is 0'],
    ['zero kappa', (m) => (m.sections.tube.kappa = 0), 'sections.tube.kappa', 'kappa of section "tube" is 0'],
    ['string where a number belongs', (m) => ((m.materials.steel as Record<string, unknown>).E = '2.1e11'), 'materials.steel.E', 'E of material "steel" is the string "2.1e11"; write it as a number > 0 (Pa), without quotes'],
    ['string coordinate', (m) => ((m.nodes[1] as Record<string, unknown>).z = '3'), 'nodes[1].z', 'z of node "b" is the string "3"'],
    ['zero spring stiffness', (m) => (m.springs[0].stiffness = 0), 'springs[0].stiffness', 'stiffness of spring 0 at node "c" is 0'],
    ['negative point mass', (m) => (m.masses[0].mass = -5), 'masses[0].mass', 'mass of the point mass 0 at node "b" is -5'],
    ['unknown element kind', (m) => ((m.elements[0] as Record<string, unknown>).kind = 'cable'), 'elements[0].kind', 'kind the string "cable" of element "e1" is not an element kind; use "bar", "beam" or "timoshenko"'],
    ['unknown DOF name', (m) => ((m.supports[0].fixed as string[])[0] = 'uw'), 'supports[0].fixed[0]', 'DOF the string "uw" of the support of node "a" is not a DOF name'],
    ['Timoshenko without kappa', (m) => delete (m.sections.tube as Partial<typeof m.sections.tube>).kappa, 'sections.tube.kappa', 'section "tube" has no kappa, which the space timoshenko element "e2" needs'],
    ['Timoshenko / space beam without G', (m) => delete (m.materials.steel as Partial<typeof m.materials.steel>).G, 'materials.steel.G', 'material "steel" has no G, which the space beam element "e1" needs'],
    ['space beam without Iy', (m) => delete (m.sections.tube as Partial<typeof m.sections.tube>).Iy, 'sections.tube.Iy', 'section "tube" has no Iy, which the space beam element "e1" needs; add Iy (m⁴)'],
    ['space beam without J', (m) => delete (m.sections.tube as Partial<typeof m.sections.tube>).J, 'sections.tube.J', 'section "tube" has no J'],
    ['orientation parallel to the member', (m) => (m.elements[2].orientation = [0, 0, -2]), 'elements[2].orientation', 'orientation [0, 0, -2] of element "e3" is zero or parallel to the member'],
    ['support naming an unknown node', (m) => (m.supports[1].node = 'q'), 'supports[1].node', 'node "q" of support 1 is not defined'],
    ['spring naming an unknown node', (m) => ((m.springs[0] as Record<string, unknown>).to = 'q'), 'springs[0].to', 'node "q" of spring 0 at node "c" is not defined'],
    ['mass naming an unknown node', (m) => (m.masses[0].node = 'q'), 'masses[0].node', 'node "q" of mass 0 is not defined'],
    ['all DOFs fixed', (m) => (m.supports = ['a', 'b', 'c', 'd'].map((node) => ({ node, fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] }))), 'supports', 'nothing is free to move'],
    ['unknown section property (typo)', (m) => ((m.sections.rod as Record<string, unknown>).Ix = 1), 'sections.rod.Ix', 'section "rod" has an unknown property "Ix"'],
    ['nodes not an array', (m) => ((m as Record<string, unknown>).nodes = {}), 'nodes', '"nodes" is an object; it must be a JSON array'],
    ['element with three nodes', (m) => ((m.elements[0] as Record<string, unknown>).nodes = ['a', 'b', 'c']), 'elements[0].nodes', 'element "e1" lists 3 nodes; give exactly two node ids'],
  ];
  for (const [name, edit, path, fragment] of cases) it(name, () => expectModelError(broken(edit), path, fragment));

  it('not an object at all', () => expectModelError([1, 2], '(model)', 'the model is an array; it must be a JSON object'));
});

describe('plane models', () => {
  const plane = () => ({
    format: 'eigenframe-model/1',
    space: 'plane',
    materials: { steel: { E: 2.1e11, density: 7850 } },
    sections: { s: { A: 1e-3, Iz: 1e-6 } },
    nodes: [{ id: 'a', x: 0, y: 0 }, { id: 'b', x: 2, y: 0 }],
    elements: [{ id: 'e1', kind: 'beam', nodes: ['a', 'b'], material: 'steel', section: 's' }],
    supports: [{ node: 'a', fixed: ['ux', 'uy', 'rz'] }],
  });
  it('accepts a plane cantilever', () => expect(validateModel(plane()).space).toBe('plane'));
  it('z ≠ 0 in a plane model', () => {
    const m = plane();
    (m.nodes[1] as unknown as Record<string, number>).z = 1;
    expectModelError(m, 'nodes[1].z', 'node "b" has z = 1 in a plane model; set z to 0');
  });
  it('uz, rx or ry named in a plane model', () => {
    for (const d of ['uz', 'rx', 'ry']) {
      const m = plane();
      m.supports[0].fixed = ['ux', d];
      expectModelError(m, 'supports[0].fixed[1]', `DOF "${d}" of the support of node "a" does not exist in a plane model; use one of ux, uy, rz`);
    }
  });
  it('plane beam without Iz', () => {
    const m = plane();
    delete (m.sections.s as Partial<typeof m.sections.s>).Iz;
    expectModelError(m, 'sections.s.Iz', 'section "s" has no Iz, which the plane beam element "e1" needs');
  });
  it('plane Timoshenko without G', () => {
    const m = plane();
    (m.elements[0] as Record<string, unknown>).kind = 'timoshenko';
    expectModelError(m, 'materials.steel.G', 'material "steel" has no G, which the plane timoshenko element "e1" needs');
  });
  it('orientation in a plane model', () => {
    const m = plane();
    (m.elements[0] as Record<string, unknown>).orientation = [0, 1, 0];
    expectModelError(m, 'elements[0].orientation', 'has an orientation in a plane model');
  });
  it('coincident nodes joined by a two-node spring are allowed (a hinge)', () => {
    const m = plane() as Record<string, unknown> & ReturnType<typeof plane>;
    m.nodes.push({ id: 'b2', x: 2, y: 0 });
    m.springs = [{ node: 'b', to: 'b2', dof: 'uy', stiffness: 1e6 }];
    expect(validateModel(m).nodes).toHaveLength(3);
  });
});

describe('parseModel', () => {
  it('reports JSON syntax errors with line and column', () => {
    const text = '{\n  "format": "eigenframe-model/1",\n  "space": "plane"\n  "nodes": []\n}';
    try {
      parseModel(text, 'frame.json');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ModelError);
      expect((e as ModelError).path).toBe('frame.json:4:3');
      expect((e as ModelError).message).toContain('invalid JSON at line 4, column 3');
    }
  });
  it('reports an unexpected token whose V8 message carries no position', () => {
    try {
      parseModel('{"format": x}');
      expect.unreachable();
    } catch (e) {
      expect((e as ModelError).path).toBe('model:1:12');
    }
  });
  it('reports truncated input at its end', () => {
    try {
      parseModel('{"a": [1, 2');
      expect.unreachable();
    } catch (e) {
      expect((e as ModelError).path).toBe('model:1:12');
      expect((e as ModelError).message).toContain('the end of the text');
    }
  });
  it('parses and validates a good model', () => {
    expect(parseModel(JSON.stringify(good())).elements).toHaveLength(4);
  });
});
