/**
 * Test fixture: a simply supported steel beam, 6 m, of `parts` plane beam elements (steel,
 * 100 × 100 mm box; invented for the tests).
 */
export function simplySupportedBeam(title: string, parts = 12): Record<string, unknown> {
  const L = 6;
  return {
    format: 'eigenframe-model/1',
    title,
    space: 'plane',
    materials: { steel: { E: 2.1e11, density: 7850 } },
    sections: { box: { A: 1.5e-3, Iz: 2.2e-6 } },
    nodes: Array.from({ length: parts + 1 }, (_, i) => ({ id: `n${i}`, x: (L * i) / parts, y: 0 })),
    elements: Array.from({ length: parts }, (_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`n${i}`, `n${i + 1}`], material: 'steel', section: 'box' })),
    supports: [{ node: 'n0', fixed: ['ux', 'uy'] }, { node: `n${parts}`, fixed: ['uy'] }],
  };
}
