/**
 * The benchmark model generators: node, element and free-DOF counts derived by formula from the
 * grid, references, member lengths, determinism, bad options, and (for the pin-jointed truss)
 * absence of mechanisms.
 */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { ArgumentError } from '../src/errors';
import { assemble } from '../src/model/assemble';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import {
  BUILDING_SIZES,
  DENSE_SIZES,
  FOOTBRIDGE_SIZES,
  buildingFrame,
  circularHollow,
  footbridgeSupportPoints,
  iSection,
  planeFrame,
  squareHollow,
  trussFootbridge,
} from '../bench/models';

const DOFS_PER_NODE: Record<string, number> = { bar: 3, beam: 6 };

/** Free DOFs counted from the model itself: DOFs used by the elements minus those fixed. */
function countFreeDofs(m: Model): number {
  const perNode = new Map<string, number>();
  for (const e of m.elements) {
    const d = m.space === 'plane' ? 3 : DOFS_PER_NODE[e.kind];
    for (const n of e.nodes) perNode.set(n, Math.max(perNode.get(n) ?? 0, d));
  }
  let total = 0;
  for (const d of perNode.values()) total += d;
  for (const s of m.supports ?? []) total -= s.fixed.length;
  return total;
}

/** Every element references existing nodes, material and section; ids unique; no zero length. */
function checkIntegrity(m: Model): void {
  const byId = new Map(m.nodes.map((n) => [n.id, n]));
  expect(byId.size).toBe(m.nodes.length);
  expect(new Set(m.elements.map((e) => e.id)).size).toBe(m.elements.length);
  const problems: string[] = [];
  let minLength = Infinity;
  for (const e of m.elements) {
    const a = byId.get(e.nodes[0]);
    const b = byId.get(e.nodes[1]);
    if (!a || !b) problems.push(`${e.id}: missing node`);
    if (!m.materials[e.material] || !m.sections[e.section]) problems.push(`${e.id}: missing material or section`);
    if (a && b) minLength = Math.min(minLength, Math.hypot(b.x - a.x, b.y - a.y, (b.z ?? 0) - (a.z ?? 0)));
  }
  for (const s of m.supports ?? []) if (!byId.has(s.node)) problems.push(`support ${s.node}: missing node`);
  for (const p of m.masses ?? []) if (!byId.has(p.node) || !(p.mass > 0)) problems.push(`mass ${p.node}: bad`);
  expect(problems).toEqual([]);
  expect(minLength).toBeGreaterThan(1);
}

describe('buildingFrame', () => {
  it.each([
    [1, 1, 1],
    [3, 2, 4],
    [4, 4, 10],
  ])('%i × %i bays × %i storeys: counts by formula', (bx, by, s) => {
    const m = buildingFrame({ baysX: bx, baysY: by, storeys: s });
    expect(m.space).toBe('space');
    expect(m.nodes.length).toBe((bx + 1) * (by + 1) * (s + 1));
    // columns (bx+1)(by+1)s, x-beams bx(by+1)s, y-beams (bx+1)by·s
    expect(m.elements.length).toBe((bx + 1) * (by + 1) * s + bx * (by + 1) * s + (bx + 1) * by * s);
    expect(m.elements.every((e) => e.kind === 'beam')).toBe(true);
    expect(m.supports!.length).toBe((bx + 1) * (by + 1));
    expect(m.supports!.every((sp) => sp.fixed.length === 6)).toBe(true);
    expect(countFreeDofs(m)).toBe(6 * (bx + 1) * (by + 1) * s);
    checkIntegrity(m);
  });

  it('headline size 12 × 12 × 40: 6,929 nodes and 40,560 free DOFs (design brief)', () => {
    const m = buildingFrame(BUILDING_SIZES[BUILDING_SIZES.length - 1]);
    expect(m.nodes.length).toBe(13 * 13 * 41);
    expect(countFreeDofs(m)).toBe(40_560);
    checkIntegrity(m);
  });

  it('floor mass by tributary area sums to floorMass × plan area × storeys', () => {
    const m = buildingFrame({ baysX: 3, baysY: 2, storeys: 4, bay: 5, floorMass: 400 });
    const total = m.masses!.reduce((s, p) => s + p.mass, 0);
    expect(total).toBeCloseTo(400 * 15 * 10 * 4, 6);
  });

  it('is deterministic', () => {
    expect(JSON.stringify(buildingFrame({ baysX: 2, baysY: 3, storeys: 2 }))).toBe(JSON.stringify(buildingFrame({ baysX: 2, baysY: 3, storeys: 2 })));
  });

  it('rejects a bad count or length with ArgumentError naming the option', () => {
    expect(() => buildingFrame({ baysX: 0, baysY: 1, storeys: 1 })).toThrow(ArgumentError);
    try {
      buildingFrame({ baysX: 2, baysY: 1.5, storeys: 1 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('baysY');
    }
    try {
      buildingFrame({ baysX: 2, baysY: 1, storeys: 1, storeyHeight: -3 });
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('storeyHeight');
    }
  });
});

describe('trussFootbridge', () => {
  it.each([
    [1, 20],
    [7, 3],
    [40, 20],
    [45, 20],
  ])('%i panels, spans of %i: counts by formula', (P, span) => {
    const m = trussFootbridge({ panels: P, spanPanels: span });
    // supports at 0, every multiple of span, and P
    const S = Math.floor(P / span) + 1 + (P % span === 0 ? 0 : 1);
    expect(footbridgeSupportPoints(P, span).length).toBe(S);
    expect(m.nodes.length).toBe(4 * (P + 1));
    // per panel: 4 chords, 2 side diagonals, 2 plan braces; per panel point: 2 verticals,
    // cross-beam, top strut; per support point: one sway brace
    expect(m.elements.length).toBe(8 * P + 4 * (P + 1) + S);
    expect(m.elements.every((e) => e.kind === 'bar')).toBe(true);
    // bar-only nodes carry ux uy uz; ends pinned (2 nodes × 3), piers guided (2 nodes × 2)
    expect(countFreeDofs(m)).toBe(12 * (P + 1) - 12 - 4 * (S - 2));
    checkIntegrity(m);
  });

  it('headline size: ≈ 84,000 free DOFs on ≈ 28,000 nodes (design brief)', () => {
    const m = trussFootbridge(FOOTBRIDGE_SIZES[FOOTBRIDGE_SIZES.length - 1]);
    expect(m.nodes.length).toBe(4 * 7101);
    expect(countFreeDofs(m)).toBe(83_784);
    checkIntegrity(m);
  });

  it('has no mechanism: the free stiffness matrix is positive definite (dense ml-matrix check)', () => {
    // Source of the check: a pin-jointed frame is rigid iff its free stiffness matrix is
    // nonsingular; smallest/largest eigenvalue by ml-matrix's symmetric decomposition.
    for (const [panels, spanPanels] of [
      [1, 1],
      [6, 3],
      [7, 20],
    ]) {
      const m = trussFootbridge({ panels, spanPanels });
      const index = new Map(m.nodes.map((n, i) => [n.id, i]));
      const N = 3 * m.nodes.length;
      const K = Matrix.zeros(N, N);
      for (const e of m.elements) {
        const a = index.get(e.nodes[0])!;
        const b = index.get(e.nodes[1])!;
        const pa = m.nodes[a];
        const pb = m.nodes[b];
        const d = [pb.x - pa.x, pb.y - pa.y, (pb.z ?? 0) - (pa.z ?? 0)];
        const L = Math.hypot(d[0], d[1], d[2]);
        const k = (m.materials[e.material].E * m.sections[e.section].A) / L;
        for (let i = 0; i < 3; i++) {
          for (let j = 0; j < 3; j++) {
            const v = (k * d[i] * d[j]) / (L * L);
            K.set(3 * a + i, 3 * a + j, K.get(3 * a + i, 3 * a + j) + v);
            K.set(3 * b + i, 3 * b + j, K.get(3 * b + i, 3 * b + j) + v);
            K.set(3 * a + i, 3 * b + j, K.get(3 * a + i, 3 * b + j) - v);
            K.set(3 * b + i, 3 * a + j, K.get(3 * b + i, 3 * a + j) - v);
          }
        }
      }
      const fixed = new Set<number>();
      for (const s of m.supports!) for (const f of s.fixed) fixed.add(3 * index.get(s.node)! + ['ux', 'uy', 'uz'].indexOf(f));
      const free = [...Array(N).keys()].filter((i) => !fixed.has(i));
      const ev = new EigenvalueDecomposition(K.selection(free, free), { assumeSymmetric: true }).realEigenvalues;
      expect(Math.min(...ev) / Math.max(...ev)).toBeGreaterThan(1e-5);
    }
  });

  it('deck mass sums to deckMass × width × length', () => {
    const m = trussFootbridge({ panels: 10, panelLength: 2, width: 3, deckMass: 200 });
    const total = m.masses!.reduce((s, p) => s + p.mass, 0);
    expect(total).toBeCloseTo(200 * 3 * 20, 6);
  });

  it('is deterministic', () => {
    expect(JSON.stringify(trussFootbridge({ panels: 30 }))).toBe(JSON.stringify(trussFootbridge({ panels: 30 })));
  });

  it('rejects a bad option with ArgumentError naming it', () => {
    try {
      trussFootbridge({ panels: 10, spanPanels: 0 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('spanPanels');
    }
    try {
      trussFootbridge({ panels: 10, width: Number.NaN });
      expect.unreachable();
    } catch (e) {
      expect((e as ArgumentError).path).toBe('width');
    }
  });
});

describe('planeFrame (dense baselines)', () => {
  it('the four baseline sizes have exactly 300, 600, 1,200 and 1,500 free DOFs', () => {
    expect(DENSE_SIZES.map((o) => countFreeDofs(planeFrame(o)))).toEqual([300, 600, 1200, 1500]);
  });

  it.each([
    [1, 1],
    [4, 20],
  ])('%i bays × %i storeys: counts by formula', (b, s) => {
    const m = planeFrame({ bays: b, storeys: s });
    expect(m.space).toBe('plane');
    expect(m.nodes.length).toBe((b + 1) * (s + 1));
    expect(m.elements.length).toBe((b + 1) * s + b * s);
    expect(countFreeDofs(m)).toBe(3 * (b + 1) * s);
    checkIntegrity(m);
  });
});

describe('section properties', () => {
  it('circular hollow: A = π(D − t)t exactly for a tube; J = 2I', () => {
    // Source: thin-ring identity (D² − d²)/4 = (D − t)t with d = D − 2t.
    const s = circularHollow(0.2191, 0.01);
    expect(s.A).toBeCloseTo(Math.PI * 0.2091 * 0.01, 12);
    expect(s.J).toBeCloseTo(2 * s.Iy!, 15);
  });
  it('square hollow 400×20: A and I by hand', () => {
    // A = 0.4² − 0.36² = 0.0304 m²; I = (0.4⁴ − 0.36⁴)/12 = 7.3365e-4 m⁴ (hand computed)
    const s = squareHollow(0.4, 0.02);
    expect(s.A).toBeCloseTo(0.0304, 12);
    expect(s.Iy).toBeCloseTo((0.0256 - 0.01679616) / 12, 12);
  });
  it('I-section: plate sum; strong axis exceeds weak axis', () => {
    const s = iSection(0.45, 0.19, 0.0094, 0.0146);
    // A = 2·0.19·0.0146 + 0.4208·0.0094 (hand computed)
    expect(s.A).toBeCloseTo(2 * 0.19 * 0.0146 + 0.4208 * 0.0094, 12);
    expect(s.Iy!).toBeGreaterThan(10 * s.Iz!);
  });
});

describe('generated models pass the model layer', () => {
  it.each([
    ['building 2 × 3 × 2', () => buildingFrame({ baysX: 2, baysY: 3, storeys: 2 }), 6 * 3 * 4 * 2],
    ['footbridge 45 panels', () => trussFootbridge({ panels: 45 }), 12 * 46 - 12 - 4 * (4 - 2)],
    ['plane frame 4 × 20', () => planeFrame({ bays: 4, storeys: 20 }), 300],
  ])('%s: validateModel accepts it and assemble numbers the formula DOF count', (_name, make, dof) => {
    const m = validateModel(JSON.parse(JSON.stringify(make())));
    const a = assemble(m);
    expect(a.stiffness.n).toBe(dof);
    expect(a.mass.n).toBe(dof);
  });
});
