/** Test fixture: a simply supported steel beam, 6 m, 12 plane beam elements (invented for the tests). */
export function simplySupportedBeam(title: string): Record<string, unknown> {
  return {
    format: 'eigenframe-model/1',
    title,
    space: 'plane',
    materials: { steel: { E: 2.1e11, density: 7850 } },
    sections: { box: { A: 1.5e-3, Iz: 2.2e-6 } },
    nodes: Array.from({ length: 13 }, (_, i) => ({ id: `n${i}`, x: i / 2, y: 0 })),
    elements: Array.from({ length: 12 }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: 'box' })),
    supports: [{ node: 'n0', fixed: ['ux', 'uy'] }, { node: 'n12', fixed: ['uy'] }],
  };
}
