/** SVG pictures (src/io/svg-*.ts): well-formed XML, geometry that matches the mode, the mass chart. */
import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { modalAnalysis } from '../src/modal/analysis';
import { escapeXml, spaceView } from '../src/io/svg-common';
import { effectiveMassChartSvg, MASS_CHART_DEFAULTS } from '../src/io/svg-chart';
import { dominantDirection, modeShapeSvg, SHAPE_DRAWING_DEFAULTS, shapeSvg } from '../src/io/svg-mode';
import { validateModel } from '../src/model/read';
import type { Model } from '../src/model/types';
import { findAll, parseXml, type XmlElement } from './svg-helpers';

const E = 2.1e11, G = 8.1e10, rho = 7850;

/** Plane portal, 4 elements per member (invented demo data). */
function planePortal(): Model {
  const chain = [[0, 0], [0, 1], [0, 2], [0, 3], [0, 4], [1.5, 4], [3, 4], [4.5, 4], [6, 4], [6, 3], [6, 2], [6, 1], [6, 0]];
  const nodes = chain.map(([x, y], i) => ({ id: `p${i}`, x, y }));
  const elements = chain.slice(0, -1).map((_, i) => ({ id: `e${i}`, kind: 'beam', nodes: [`p${i}`, `p${i + 1}`], material: 'steel', section: 's' }));
  return validateModel({
    format: 'eigenframe-model/1', space: 'plane', title: 'Portal <demo> & "test"',
    materials: { steel: { E, density: rho } }, sections: { s: { A: 5e-3, Iz: 8e-6 } },
    nodes, elements, supports: [{ node: 'p0', fixed: ['ux', 'uy', 'rz'] }, { node: 'p12', fixed: ['ux', 'uy', 'rz'] }],
  });
}

/** Space table: four columns 3 m high on a 4 × 3 m plan, top beams; 2 elements per member (demo). */
function spaceTable(): Model {
  const corners = [[0, 0], [4, 0], [4, 3], [0, 3]];
  const nodes: { id: string; x: number; y: number; z: number }[] = [];
  const elements: { id: string; kind: string; nodes: [string, string]; material: string; section: string }[] = [];
  corners.forEach(([x, y], c) => {
    nodes.push({ id: `b${c}`, x, y, z: 0 }, { id: `m${c}`, x, y, z: 1.5 }, { id: `t${c}`, x, y, z: 3 });
    elements.push({ id: `c${c}a`, kind: 'beam', nodes: [`b${c}`, `m${c}`], material: 'steel', section: 'tube' });
    elements.push({ id: `c${c}b`, kind: 'beam', nodes: [`m${c}`, `t${c}`], material: 'steel', section: 'tube' });
  });
  corners.forEach(([x, y], c) => {
    const d = (c + 1) % 4;
    const [x2, y2] = corners[d];
    nodes.push({ id: `h${c}`, x: (x + x2) / 2, y: (y + y2) / 2, z: 3 });
    elements.push({ id: `g${c}a`, kind: 'beam', nodes: [`t${c}`, `h${c}`], material: 'steel', section: 'tube' });
    elements.push({ id: `g${c}b`, kind: 'beam', nodes: [`h${c}`, `t${d}`], material: 'steel', section: 'tube' });
  });
  return validateModel({
    format: 'eigenframe-model/1', space: 'space',
    materials: { steel: { E, G, density: rho } }, sections: { tube: { A: 3e-3, Iy: 5e-6, Iz: 5e-6, J: 1e-5 } },
    nodes, elements, supports: corners.map((_, c) => ({ node: `b${c}`, fixed: ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] })),
    masses: [{ node: 't0', mass: 200 }, { node: 't2', mass: 200 }],
  });
}

const byClass = (svg: XmlElement, cls: string): XmlElement[] => findAll(svg, (e) => e.attrs.class === cls).flatMap((g) => g.children);
const pt = (e: XmlElement): [number, number] => [Number(e.attrs.cx), Number(e.attrs.cy)];

/**
 * Checks deformed − undeformed = k·scale·(right·u, −up·u) at every node, with k recovered from
 * the undeformed drawing (|ΔU| / |ΔP| of two nodes) and right/up given by the test.
 */
function checkGeometry(svgText: string, model: Model, shapeAt: (node: string) => [number, number, number], right: number[], up: number[]): void {
  const svg = parseXml(svgText);
  const scale = Number(svg.attrs['data-scale']);
  const und = new Map(byClass(svg, 'nodes-undeformed').map((c) => [c.attrs['data-node'], pt(c)]));
  const def = new Map(byClass(svg, 'nodes-deformed').map((c) => [c.attrs['data-node'], pt(c)]));
  expect(und.size).toBe(model.nodes.length);
  expect(def.size).toBe(model.nodes.length);
  const P = (p: number[]) => [right[0] * p[0] + right[1] * p[1] + right[2] * p[2], up[0] * p[0] + up[1] * p[1] + up[2] * p[2]];
  // k from the undeformed drawing: the two nodes farthest apart on screen
  const a = model.nodes[0];
  let best = model.nodes[1], bestD = 0;
  for (const nd of model.nodes) {
    const d = Math.hypot(und.get(nd.id)![0] - und.get(a.id)![0], und.get(nd.id)![1] - und.get(a.id)![1]);
    if (d > bestD) { bestD = d; best = nd; }
  }
  const pa = P([a.x, a.y, a.z ?? 0]), pb = P([best.x, best.y, best.z ?? 0]);
  const k = bestD / Math.hypot(pa[0] - pb[0], pa[1] - pb[1]);
  expect(Math.abs(k - Number(svg.attrs['data-pixels-per-metre'])) / k).toBeLessThan(1e-3);
  // undeformed: screen = origin + k (P_x, −P_y)
  const ua = und.get(a.id)!;
  for (const nd of model.nodes) {
    const p = P([nd.x, nd.y, nd.z ?? 0]);
    const u = und.get(nd.id)!;
    expect(Math.abs(u[0] - ua[0] - k * (p[0] - pa[0]))).toBeLessThan(0.03);
    expect(Math.abs(u[1] - ua[1] + k * (p[1] - pa[1]))).toBeLessThan(0.03);
    // deformed = undeformed + scale × shape, projected
    const s = P(shapeAt(nd.id));
    const d = def.get(nd.id)!;
    expect(Math.abs(d[0] - u[0] - k * scale * s[0])).toBeLessThan(0.03);
    expect(Math.abs(d[1] - u[1] + k * scale * s[1])).toBeLessThan(0.03);
  }
  // each deformed member curve starts and ends at its deformed nodes
  for (const line of byClass(svg, 'deformed')) {
    const e = model.elements.find((x) => x.id === line.attrs['data-element'])!;
    const pts = line.attrs.points.split(' ').map((q) => q.split(',').map(Number));
    const d0 = def.get(e.nodes[0])!, d1 = def.get(e.nodes[1])!;
    expect(Math.hypot(pts[0][0] - d0[0], pts[0][1] - d0[1])).toBeLessThan(0.02);
    expect(Math.hypot(pts[pts.length - 1][0] - d1[0], pts[pts.length - 1][1] - d1[1])).toBeLessThan(0.02);
    expect(pts.length).toBe(SHAPE_DRAWING_DEFAULTS.segments + 1);
  }
}

function shapeReader(analysis: ReturnType<typeof modalAnalysis>, mode: number): (node: string) => [number, number, number] {
  const asm = analysis.assembled;
  const n = asm.stiffness.n;
  const phi = analysis.eigen.vectors.subarray((mode - 1) * n, mode * n);
  return (node) => {
    const v: [number, number, number] = [0, 0, 0];
    asm.dofs.forEach((d, i) => {
      if (d.node !== node) return;
      if (d.dof === 'ux') v[0] = phi[i];
      if (d.dof === 'uy') v[1] = phi[i];
      if (d.dof === 'uz') v[2] = phi[i];
    });
    return v;
  };
}

describe('mode shape pictures', () => {
  const plane = modalAnalysis(planePortal(), { count: 3 });
  const space = modalAnalysis(spaceTable(), { count: 4 });

  it('plane: well-formed, one deformed curve per member, geometry = undeformed + scale × shape', () => {
    for (const mode of [1, 2, 3]) {
      const text = modeShapeSvg(plane, mode);
      checkGeometry(text, plane.assembled.model, shapeReader(plane, mode), [1, 0, 0], [0, 1, 0]);
      const svg = parseXml(text);
      expect(svg.name).toBe('svg');
      expect(byClass(svg, 'deformed')).toHaveLength(12);
      expect(byClass(svg, 'undeformed')).toHaveLength(12);
    }
  });

  it('space: axonometric view with Z up, geometry checked with the view written out here', () => {
    // right = (−sin ψ, cos ψ, 0), up = (−sin ε cos ψ, −sin ε sin ψ, cos ε), ψ = −50°, ε = 30°
    const psi = (-50 * Math.PI) / 180, eps = (30 * Math.PI) / 180;
    const right = [-Math.sin(psi), Math.cos(psi), 0];
    const up = [-Math.sin(eps) * Math.cos(psi), -Math.sin(eps) * Math.sin(psi), Math.cos(eps)];
    const v = spaceView();
    v.right.forEach((c, i) => expect(c).toBeCloseTo(right[i], 14));
    v.up.forEach((c, i) => expect(c).toBeCloseTo(up[i], 14));
    for (const mode of [1, 2, 3, 4]) checkGeometry(modeShapeSvg(space, mode), space.assembled.model, shapeReader(space, mode), right, up);
    // another view and an explicit scale
    const psi2 = (20 * Math.PI) / 180, eps2 = (60 * Math.PI) / 180;
    const text = modeShapeSvg(space, 1, { view: { azimuth: 20, elevation: 60 }, scale: 0.5 });
    expect(Number(parseXml(text).attrs['data-scale'])).toBe(0.5);
    checkGeometry(text, space.assembled.model, shapeReader(space, 1), [-Math.sin(psi2), Math.cos(psi2), 0], [-Math.sin(eps2) * Math.cos(psi2), -Math.sin(eps2) * Math.sin(psi2), Math.cos(eps2)]);
  });

  it('the caption gives frequency and the dominant direction', () => {
    const svg = parseXml(modeShapeSvg(plane, 1));
    const title = findAll(svg, (e) => e.name === 'title')[0].text;
    const m = plane.modes[0];
    const dom = dominantDirection(m)!;
    expect(title).toContain(`Mode 1 · ${m.frequency.toFixed(3).slice(0, 5)}`);
    expect(title).toContain(`mostly ${dom.direction}`);
    // the lowest portal mode sways sideways (ux carries most of the mass)
    expect(dom.direction).toBe('ux');
  });

  it('text is escaped (a caption with < & " stays well-formed)', () => {
    const text = modeShapeSvg(plane, 2, { caption: 'a < b & "c" \'d\'' });
    const svg = parseXml(text);
    expect(findAll(svg, (e) => e.name === 'title')[0].text).toBe('a < b & "c" \'d\'');
    expect(escapeXml('<&>"\'')).toBe('&lt;&amp;&gt;&quot;&apos;');
  });

  it('bad options are typed errors', () => {
    const asm = plane.assembled;
    expect(() => shapeSvg(asm, new Float64Array(3))).toThrowError(ArgumentError);
    expect(() => modeShapeSvg(plane, 4)).toThrowError(/mode 4/);
    expect(() => modeShapeSvg(plane, 1, { width: 10 })).toThrowError(ArgumentError);
    expect(() => modeShapeSvg(space, 1, { view: { elevation: 120 } })).toThrowError(/elevation/);
  });
});

describe('effective mass chart', () => {
  const space = modalAnalysis(spaceTable(), { count: 8 });
  it('well-formed; markers hold the cumulative ratios and sit on one linear scale', () => {
    const svg = parseXml(effectiveMassChartSvg(space));
    const markers = findAll(svg, (e) => e.name === 'circle' && e.attrs['data-direction'] !== undefined);
    expect(markers).toHaveLength(8 * 3);
    const ys: [number, number][] = [];
    for (const c of markers) {
      const d = c.attrs['data-direction'] as 'ux' | 'uy' | 'uz';
      const mode = Number(c.attrs['data-mode']);
      const v = Number(c.attrs['data-value']);
      expect(v).toBe(space.modes[mode - 1].cumulativeRatio[d]);
      ys.push([v, Number(c.attrs.cy)]);
    }
    // cy = a − b·value for one a, b > 0
    const [v0, y0] = ys.reduce((p, q) => (q[0] < p[0] ? q : p));
    const [v1, y1] = ys.reduce((p, q) => (q[0] > p[0] ? q : p));
    const b = (y0 - y1) / (v1 - v0);
    expect(b).toBeGreaterThan(0);
    for (const [v, y] of ys) expect(Math.abs(y - (y0 - b * (v - v0)))).toBeLessThan(0.02);
    // cumulative lines never decrease (cy never increases along a direction)
    for (const d of ['ux', 'uy', 'uz']) {
      const line = findAll(svg, (e) => e.name === 'polyline' && findAll(svg, (g) => g.attrs.class === 'cumulative' && g.attrs['data-direction'] === d)[0].children.includes(e))[0];
      const yv = line.attrs.points.split(' ').map((p) => Number(p.split(',')[1]));
      for (let i = 1; i < yv.length; i++) expect(yv[i]).toBeLessThanOrEqual(yv[i - 1] + 1e-9);
    }
    const texts = findAll(svg, (e) => e.name === 'text').map((e) => e.text);
    expect(texts).toContain(MASS_CHART_DEFAULTS.title);
    expect(texts.some((t) => t.startsWith('ux: '))).toBe(true);
  });
  it('rejects a direction the analysis does not report', () => {
    const plane = modalAnalysis(planePortal(), { count: 2 });
    try {
      effectiveMassChartSvg(plane, { directions: ['uz'] });
      throw new Error('did not throw');
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('directions[0]');
    }
  });
});
