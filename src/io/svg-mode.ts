/**
 * SVG drawing of a deformed shape (a vibration mode or a buckled shape): the undeformed
 * structure in light grey, the deformed one in colour, the node markers of both, and a caption.
 *
 * Geometry. Deformed node position = undeformed + scale × (node translation of the shape).
 * Members with rotational DOFs (beams) are drawn as curves: along a member of unit axis e and
 * length L, the axial displacement is linear and the transverse one is the cubic Hermite
 * interpolation of the end translations and end slopes θ × e (Przemieniecki 1968, ch. 5, beam
 * shape functions, from memory), which is exact for an Euler-Bernoulli element without span
 * loads and a close picture for a Timoshenko one. Bars are straight. The view is orthographic
 * (svg-common.ts): x–y as drawn for plane models; an axonometric view with Z up for space ones.
 * Model and deformed points are fitted together into the picture with one uniform scale, so
 * screen = origin + k·(right·p, −up·p).
 */
import { ArgumentError } from '../errors';
import type { Direction, ModalAnalysis, ModeSummary } from '../modal/analysis-types';
import type { AssembledModel } from '../model/types';
import { escapeXml, FONT, label, PALETTE, PLANE_VIEW, px, spaceView, type ViewAngles, type ViewAxes } from './svg-common';

/** Options of {@link shapeSvg} and {@link modeShapeSvg}. */
export interface ShapeDrawingOptions {
  /** Picture width, px. @defaultValue 640 */
  width?: number;
  /** Picture height, px (the caption takes 44 px of it). @defaultValue 420 */
  height?: number;
  /**
   * Displacement scale, m per unit of shape. @defaultValue chosen so that the largest node
   * translation is drawn as 12 % of the model's largest dimension
   */
  scale?: number;
  /** Space models: view angles (degrees); plane models are drawn in their own plane. @defaultValue VIEW_DEFAULTS */
  view?: ViewAngles;
  /** Straight pieces per beam curve. @defaultValue 12 */
  segments?: number;
  /** Caption under the picture (plain text). @defaultValue none for shapeSvg; frequency and direction for modeShapeSvg */
  caption?: string;
  /** Colour of the deformed shape (CSS colour). @defaultValue the dominant direction's colour, or PALETTE.ux */
  colour?: string;
}

/** Defaults of {@link ShapeDrawingOptions} with a fixed value. */
export const SHAPE_DRAWING_DEFAULTS = { width: 640, height: 420, segments: 12, fraction: 0.12 } as const;

const MARGIN = 24;
const CAPTION = 44;

/** Node positions of a drawing, px, in the picture's coordinates (y down). */
export interface DrawnNode {
  readonly id: string;
  readonly undeformed: readonly [number, number];
  readonly deformed: readonly [number, number];
}

/** Where everything of a shape drawing lands. */
export interface ShapeLayout {
  /** Displacement scale used, m per unit of shape. */
  readonly scale: number;
  /** px per m. */
  readonly pixelsPerMetre: number;
  /** The view axes. */
  readonly view: ViewAxes;
  /** Per node of the model (model order). */
  readonly nodes: readonly DrawnNode[];
  /** Per element: undeformed end points and the deformed polyline, px. */
  readonly members: ReadonlyArray<{ readonly id: string; readonly undeformed: readonly number[]; readonly deformed: readonly number[] }>;
}

function check(asm: AssembledModel, shape: Float64Array, o: ShapeDrawingOptions): void {
  if (!(shape instanceof Float64Array) || shape.length !== asm.stiffness.n) {
    throw new ArgumentError(`has length ${shape?.length}; give one value per free DOF (${asm.stiffness.n})`, 'shape');
  }
  for (const k of ['width', 'height'] as const) {
    const v = o[k];
    if (v !== undefined && !(Number.isFinite(v) && v >= 120)) throw new ArgumentError(`${k} is ${v}; give at least 120 px`, k);
  }
  if (o.scale !== undefined && !Number.isFinite(o.scale)) throw new ArgumentError(`scale is ${o.scale}; give a finite number (m per unit of shape)`, 'scale');
  if (o.segments !== undefined && !(Number.isInteger(o.segments) && o.segments >= 1 && o.segments <= 200)) {
    throw new ArgumentError(`segments is ${o.segments}; give an integer from 1 to 200`, 'segments');
  }
}

/**
 * Computes where the nodes and members of a deformed shape are drawn.
 * @param asm - the assembled model
 * @param shape - the shape over the free DOFs, length n (m and rad per unit)
 * @param options - see {@link ShapeDrawingOptions}
 * @throws ArgumentError (path `shape`, `width`, `height`, `scale`, `segments`, `view.*`)
 */
export function shapeLayout(asm: AssembledModel, shape: Float64Array, options: ShapeDrawingOptions = {}): ShapeLayout {
  check(asm, shape, options);
  const W = options.width ?? SHAPE_DRAWING_DEFAULTS.width;
  const H = options.height ?? SHAPE_DRAWING_DEFAULTS.height;
  const segs = options.segments ?? SHAPE_DRAWING_DEFAULTS.segments;
  const model = asm.model;
  const view = model.space === 'plane' ? PLANE_VIEW : spaceView(options.view);
  const nn = model.nodes.length;
  const xyz = asm.coordinates;
  const map = asm.dofMap!;
  const at = (node: number, slot: number): number => {
    const g = map[6 * node + slot];
    return g < 0 ? 0 : shape[g];
  };
  // ---- scale: largest translation drawn as a fraction of the model size ----
  let extent = 0;
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity];
  let maxT = 0;
  for (let i = 0; i < nn; i++) {
    for (let c = 0; c < 3; c++) {
      lo[c] = Math.min(lo[c], xyz[3 * i + c]);
      hi[c] = Math.max(hi[c], xyz[3 * i + c]);
    }
    maxT = Math.max(maxT, Math.hypot(at(i, 0), at(i, 1), at(i, 2)));
  }
  for (let c = 0; c < 3; c++) extent = Math.max(extent, hi[c] - lo[c]);
  if (!(extent > 0)) extent = 1;
  const scale = options.scale ?? (maxT > 0 ? (SHAPE_DRAWING_DEFAULTS.fraction * extent) / maxT : 0);

  // ---- model-space points (m), projected before fitting ----
  const proj = (p: readonly number[]): [number, number] => [
    view.right[0] * p[0] + view.right[1] * p[1] + view.right[2] * p[2],
    view.up[0] * p[0] + view.up[1] * p[1] + view.up[2] * p[2],
  ];
  const index = new Map<string, number>();
  model.nodes.forEach((nd, i) => index.set(nd.id, i));
  const nodeU: [number, number][] = [];
  const nodeD: [number, number][] = [];
  for (let i = 0; i < nn; i++) {
    const p = [xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]];
    nodeU.push(proj(p));
    nodeD.push(proj([p[0] + scale * at(i, 0), p[1] + scale * at(i, 1), p[2] + scale * at(i, 2)]));
  }
  const curves: number[][] = model.elements.map((e) => {
    const a = index.get(e.nodes[0])!;
    const b = index.get(e.nodes[1])!;
    const pa = [xyz[3 * a], xyz[3 * a + 1], xyz[3 * a + 2]];
    const pb = [xyz[3 * b], xyz[3 * b + 1], xyz[3 * b + 2]];
    const d = [pb[0] - pa[0], pb[1] - pa[1], pb[2] - pa[2]];
    const L = Math.hypot(d[0], d[1], d[2]);
    const ex = [d[0] / L, d[1] / L, d[2] / L];
    const ua = [at(a, 0), at(a, 1), at(a, 2)];
    const ub = [at(b, 0), at(b, 1), at(b, 2)];
    const out: number[] = [];
    if (e.kind === 'bar' || segs === 1) {
      out.push(...nodeD[a], ...nodeD[b]);
      return out;
    }
    const ta = [at(a, 3), at(a, 4), at(a, 5)];
    const tb = [at(b, 3), at(b, 4), at(b, 5)];
    const cross = (t: number[]) => [t[1] * ex[2] - t[2] * ex[1], t[2] * ex[0] - t[0] * ex[2], t[0] * ex[1] - t[1] * ex[0]];
    const sa = cross(ta), sb = cross(tb);
    const axA = ua[0] * ex[0] + ua[1] * ex[1] + ua[2] * ex[2];
    const axB = ub[0] * ex[0] + ub[1] * ex[1] + ub[2] * ex[2];
    for (let s = 0; s <= segs; s++) {
      const x = s / segs;
      const h1 = 1 - 3 * x * x + 2 * x * x * x, h2 = x - 2 * x * x + x * x * x, h3 = 3 * x * x - 2 * x * x * x, h4 = -x * x + x * x * x;
      const ax = axA * (1 - x) + axB * x;
      const p = [0, 0, 0];
      for (let c = 0; c < 3; c++) {
        const tra = ua[c] - axA * ex[c];
        const trb = ub[c] - axB * ex[c];
        const u = ax * ex[c] + h1 * tra + h2 * L * sa[c] + h3 * trb + h4 * L * sb[c];
        p[c] = pa[c] + x * d[c] + scale * u;
      }
      out.push(...proj(p));
    }
    return out;
  });

  // ---- fit everything into the picture above the caption ----
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
  const grow = (x: number, y: number) => {
    x0 = Math.min(x0, x); x1 = Math.max(x1, x);
    y0 = Math.min(y0, y); y1 = Math.max(y1, y);
  };
  for (let i = 0; i < nn; i++) {
    grow(nodeU[i][0], nodeU[i][1]);
    grow(nodeD[i][0], nodeD[i][1]);
  }
  for (const c of curves) for (let k = 0; k < c.length; k += 2) grow(c[k], c[k + 1]);
  const bw = Math.max(x1 - x0, 1e-12 * extent, Number.MIN_VALUE);
  const bh = Math.max(y1 - y0, 1e-12 * extent, Number.MIN_VALUE);
  const availW = W - 2 * MARGIN;
  const availH = H - 2 * MARGIN - CAPTION;
  const k = Math.min(availW / bw, availH / bh);
  const ox = MARGIN + (availW - k * (x1 - x0)) / 2 - k * x0;
  const oy = MARGIN + (availH - k * (y1 - y0)) / 2 + k * y1;
  const screen = (x: number, y: number): [number, number] => [ox + k * x, oy - k * y];
  const nodes: DrawnNode[] = model.nodes.map((nd, i) => ({ id: nd.id, undeformed: screen(...nodeU[i]), deformed: screen(...nodeD[i]) }));
  const members = model.elements.map((e, m) => {
    const a = index.get(e.nodes[0])!;
    const b = index.get(e.nodes[1])!;
    const c = curves[m];
    const dd: number[] = [];
    for (let q = 0; q < c.length; q += 2) dd.push(...screen(c[q], c[q + 1]));
    return { id: e.id, undeformed: [...screen(...nodeU[a]), ...screen(...nodeU[b])], deformed: dd };
  });
  return { scale, pixelsPerMetre: k, view, nodes, members };
}

/**
 * SVG picture of a deformed shape over the undeformed structure.
 * @param asm - the assembled model
 * @param shape - the shape over the free DOFs, length n
 * @param options - see {@link ShapeDrawingOptions}
 * @returns one `<svg>` element as a string (no XML declaration), self-contained, no ids; the
 *   root carries `data-scale` (m per unit of shape) and `data-pixels-per-metre`, and node markers
 *   carry `data-node`, member lines `data-element`, for machine reading
 * @throws ArgumentError as {@link shapeLayout}
 */
export function shapeSvg(asm: AssembledModel, shape: Float64Array, options: ShapeDrawingOptions = {}): string {
  const lay = shapeLayout(asm, shape, options);
  const W = options.width ?? SHAPE_DRAWING_DEFAULTS.width;
  const H = options.height ?? SHAPE_DRAWING_DEFAULTS.height;
  const colour = escapeXml(options.colour ?? PALETTE.ux);
  const caption = options.caption ?? '';
  const model = asm.model;
  const supported = new Set((model.supports ?? []).filter((s) => s.fixed.length > 0).map((s) => s.node));
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${px(W)}" height="${px(H)}" viewBox="0 0 ${px(W)} ${px(H)}" role="img" aria-label="${escapeXml(caption || 'deformed shape')}" font-family="${escapeXml(FONT)}" data-scale="${lay.scale}" data-pixels-per-metre="${lay.pixelsPerMetre}">`,
  );
  if (caption) out.push(`<title>${escapeXml(caption)}</title>`);
  out.push(`<rect x="0" y="0" width="${px(W)}" height="${px(H)}" fill="#ffffff"/>`);
  out.push(`<g class="undeformed" stroke="${PALETTE.undeformed}" stroke-width="1.5" fill="none" stroke-linecap="round">`);
  for (const m of lay.members) {
    const u = m.undeformed;
    out.push(`<line data-element="${escapeXml(m.id)}" x1="${px(u[0])}" y1="${px(u[1])}" x2="${px(u[2])}" y2="${px(u[3])}"/>`);
  }
  out.push('</g>');
  out.push(`<g class="supports" fill="${PALETTE.undeformed}" stroke="none">`);
  for (const nd of lay.nodes) {
    if (!supported.has(nd.id)) continue;
    const [x, y] = nd.undeformed;
    out.push(`<path data-node="${escapeXml(nd.id)}" d="M${px(x)} ${px(y)} l-6 10 h12 z"/>`);
  }
  out.push('</g>');
  out.push(`<g class="nodes-undeformed" fill="${PALETTE.undeformed}" stroke="none">`);
  for (const nd of lay.nodes) out.push(`<circle data-node="${escapeXml(nd.id)}" cx="${px(nd.undeformed[0])}" cy="${px(nd.undeformed[1])}" r="2"/>`);
  out.push('</g>');
  out.push(`<g class="deformed" stroke="${colour}" stroke-width="2.2" fill="none" stroke-linejoin="round" stroke-linecap="round">`);
  for (const m of lay.members) {
    const pts: string[] = [];
    for (let q = 0; q < m.deformed.length; q += 2) pts.push(`${px(m.deformed[q])},${px(m.deformed[q + 1])}`);
    out.push(`<polyline data-element="${escapeXml(m.id)}" points="${pts.join(' ')}"/>`);
  }
  out.push('</g>');
  out.push(`<g class="nodes-deformed" fill="${colour}" stroke="#ffffff" stroke-width="0.8">`);
  for (const nd of lay.nodes) out.push(`<circle data-node="${escapeXml(nd.id)}" cx="${px(nd.deformed[0])}" cy="${px(nd.deformed[1])}" r="3"/>`);
  out.push('</g>');
  const scaleNote = `displacements drawn × ${label(lay.scale, 3)}`;
  if (caption) out.push(`<text x="${px(W / 2)}" y="${px(H - CAPTION + 18)}" text-anchor="middle" font-size="15" fill="${PALETTE.ink}">${escapeXml(caption)}</text>`);
  out.push(`<text x="${px(W / 2)}" y="${px(H - CAPTION + 36)}" text-anchor="middle" font-size="11" fill="#666666">${escapeXml(scaleNote)}</text>`);
  out.push('</svg>');
  return out.join('\n');
}

const TRANSLATIONS: readonly Direction[] = ['ux', 'uy', 'uz'];

/**
 * The translational direction carrying the largest effective mass of a mode, and its share.
 * @returns the direction and its effective-mass ratio (0..1); undefined when the summary has no
 *   translational participation
 */
export function dominantDirection(mode: ModeSummary): { direction: Direction; ratio: number } | undefined {
  let best: Direction | undefined;
  let ratio = -1;
  for (const d of TRANSLATIONS) {
    const r = mode.effectiveMassRatio[d];
    if (r !== undefined && r > ratio) {
      ratio = r;
      best = d;
    }
  }
  return best === undefined ? undefined : { direction: best, ratio };
}

/**
 * Caption of a mode: number, frequency, period and dominant direction, e.g.
 * `Mode 2 · 3.412 Hz (T = 0.2931 s) · mostly uy, 71.3 % effective mass`.
 */
export function modeCaption(mode: ModeSummary): string {
  const dom = dominantDirection(mode);
  const period = Number.isFinite(mode.period) ? ` (T = ${label(mode.period)} s)` : ' (rigid-body mode)';
  const dir = dom && dom.ratio >= 0.005 ? ` · mostly ${dom.direction}, ${(100 * dom.ratio).toFixed(1)} % effective mass` : ' · no net translational mass';
  return `Mode ${mode.mode} · ${label(mode.frequency)} Hz${period}${dir}`;
}

/**
 * SVG picture of one vibration mode of a modal analysis, captioned with its frequency and
 * dominant direction and coloured by that direction.
 * @param analysis - the modal analysis
 * @param mode - mode number, 1 = lowest
 * @param options - see {@link ShapeDrawingOptions}
 * @throws ArgumentError (path `mode`) for a mode number out of range; otherwise as {@link shapeSvg}
 */
export function modeShapeSvg(analysis: ModalAnalysis, mode: number, options: ShapeDrawingOptions = {}): string {
  const m = analysis.modes.length;
  if (!Number.isInteger(mode) || mode < 1 || mode > m) throw new ArgumentError(`mode ${mode} is not one of the ${m} modes; give a number from 1 to ${m}`, 'mode');
  const n = analysis.assembled.stiffness.n;
  const summary = analysis.modes[mode - 1];
  const dom = dominantDirection(summary);
  const shape = analysis.eigen.vectors.subarray((mode - 1) * n, mode * n);
  return shapeSvg(analysis.assembled, shape, {
    ...options,
    caption: options.caption ?? modeCaption(summary),
    colour: options.colour ?? (dom && dom.ratio >= 0.005 ? PALETTE[dom.direction] : PALETTE.ink),
  });
}
