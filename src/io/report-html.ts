/**
 * Self-contained HTML report of a modal analysis: one file with its own style sheet and inline
 * SVG pictures, no scripts, no external resources, so it can be mailed, archived or printed as
 * is. Sections: title and caution, model summary, modes table with effective mass, the
 * cumulative effective-mass chart, one picture per mode, optionally linear buckling, and the
 * verification figures of the solver. Timings are left out, so the same input gives the same
 * file byte for byte. The markup is also well-formed XML (void elements are
 * self-closed), which keeps it easy to check.
 */
import { ArgumentError } from '../errors';
import type { BucklingResult } from '../modal/buckling';
import type { Direction, ModalAnalysis } from '../modal/analysis-types';
import { VERSION } from '../version';
import { ENGINEERING_CAUTION } from './caution';
import { escapeXml as esc, label } from './svg-common';
import { effectiveMassChartSvg } from './svg-chart';
import { modeShapeSvg, shapeSvg } from './svg-mode';

/** Options of {@link htmlReport}. */
export interface HtmlReportOptions {
  /** Document title. @defaultValue the model title, or 'Modal analysis' */
  title?: string;
  /** Name of the model file shown in the summary. @defaultValue none */
  source?: string;
  /** Modes drawn, lowest first (0 draws none). @defaultValue every mode of the analysis, at most 24 */
  shapes?: number;
  /** A linear buckling result of the same model to include. @defaultValue none */
  buckling?: BucklingResult;
  /** A line naming when or by whom the report was made (plain text). @defaultValue none (the output depends on the input only) */
  note?: string;
}

/** Defaults of {@link HtmlReportOptions} with a fixed value. */
export const HTML_REPORT_DEFAULTS = { title: 'Modal analysis', maxShapes: 24 } as const;

const TRANSLATIONS: readonly Direction[] = ['ux', 'uy', 'uz'];

const STYLE = `
:root { color-scheme: light; }
body { font-family: system-ui, -apple-system, "Segoe UI", Helvetica, Arial, sans-serif; color: #222; margin: 0; background: #f6f6f4; line-height: 1.45; }
main { max-width: 980px; margin: 0 auto; padding: 28px 32px 48px; background: #fff; }
h1 { font-size: 1.7rem; margin: 0 0 4px; }
h2 { font-size: 1.2rem; margin: 34px 0 10px; padding-bottom: 4px; border-bottom: 2px solid #e4e4e0; }
p.sub { color: #666; margin: 0 0 14px; }
.caution { border-left: 4px solid #c8502a; background: #fbf1ec; padding: 10px 14px; margin: 16px 0; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; font-size: 0.92rem; }
th, td { padding: 4px 10px; border-bottom: 1px solid #e6e6e6; text-align: right; }
th { background: #f2f2ef; font-weight: 600; }
td.l, th.l { text-align: left; }
.figures { display: grid; grid-template-columns: repeat(auto-fill, minmax(440px, 1fr)); gap: 14px; }
figure { margin: 0; border: 1px solid #e6e6e6; padding: 6px; background: #fff; }
figure svg { width: 100%; height: auto; display: block; }
figcaption { font-size: 0.85rem; color: #555; padding: 4px 2px 0; }
.ok { color: #2e7d32; font-weight: 600; }
.fail { color: #b00020; font-weight: 600; }
@media print { body { background: #fff; } main { padding: 0; } figure { break-inside: avoid; } }
`;

/**
 * Straight pieces per drawn beam curve, fewer for bigger models so that the file stays small:
 * 8 up to 300 elements, 4 up to 1,500, straight lines beyond.
 */
export function pictureSegments(elements: number): number {
  return elements <= 300 ? 8 : elements <= 1500 ? 4 : 1;
}

function pct(v: number | undefined): string {
  return v === undefined ? '–' : (100 * v).toFixed(1);
}

function row(cells: readonly string[], firstLeft = false): string {
  return `<tr>${cells.map((c, i) => `<td${firstLeft && i === 0 ? ' class="l"' : ''}>${c}</td>`).join('')}</tr>`;
}

/**
 * The report as one HTML document string (UTF-8 text, starting with `<!DOCTYPE html>`).
 * @param analysis - the modal analysis to report
 * @param options - see {@link HtmlReportOptions}
 * @throws ArgumentError (path `shapes`) for a bad number of pictures; (path `buckling`) for a
 *   buckling result of a different model
 */
export function htmlReport(analysis: ModalAnalysis, options: HtmlReportOptions = {}): string {
  const m = analysis.modes.length;
  const shapes = options.shapes ?? Math.min(m, HTML_REPORT_DEFAULTS.maxShapes);
  if (!Number.isInteger(shapes) || shapes < 0 || shapes > m) throw new ArgumentError(`shapes is ${shapes}; give a whole number from 0 to the ${m} modes`, 'shapes');
  const bk = options.buckling;
  if (bk && bk.assembled.stiffness.n !== analysis.assembled.stiffness.n) {
    throw new ArgumentError('the buckling result belongs to another model; run both analyses on the same model', 'buckling');
  }
  const asm = analysis.assembled;
  const model = asm.model;
  const title = options.title ?? (analysis.title || HTML_REPORT_DEFAULTS.title);
  const dirs = analysis.directions.filter((d) => TRANSLATIONS.includes(d));
  const eigen = analysis.eigen;
  const segments = pictureSegments(model.elements.length);
  const out: string[] = [];
  out.push('<!DOCTYPE html>');
  out.push('<html lang="en">');
  out.push('<head>');
  out.push('<meta charset="utf-8"/>');
  out.push('<meta name="viewport" content="width=device-width, initial-scale=1"/>');
  out.push(`<meta name="generator" content="eigenframe ${esc(VERSION)}"/>`);
  out.push(`<title>${esc(title)}</title>`);
  out.push(`<style>${STYLE}</style>`);
  out.push('</head>');
  out.push('<body>');
  out.push('<main>');
  out.push(`<h1>${esc(title)}</h1>`);
  const sub = [`Natural frequencies and mode shapes by eigenframe ${VERSION}`];
  if (options.source) sub.push(`model file ${options.source}`);
  if (options.note) sub.push(options.note);
  out.push(`<p class="sub">${esc(sub.join(' · '))}</p>`);
  out.push(`<p class="caution" role="note">${esc(ENGINEERING_CAUTION)}</p>`);

  // ---- model summary ----
  out.push('<section id="model">');
  out.push('<h2>Model</h2>');
  const kinds = new Map<string, number>();
  for (const e of model.elements) kinds.set(e.kind, (kinds.get(e.kind) ?? 0) + 1);
  const summary: [string, string][] = [
    ['Space', model.space === 'plane' ? 'plane (x–y; DOFs ux, uy, rz)' : 'space (DOFs ux, uy, uz, rx, ry, rz)'],
    ['Nodes', String(model.nodes.length)],
    ['Elements', `${model.elements.length} (${[...kinds].map(([k, c]) => `${c} ${k}`).join(', ')})`],
    ['Free DOFs', String(asm.dofs.length)],
    ['Supports', String((model.supports ?? []).length)],
    ['Springs, point masses', `${(model.springs ?? []).length}, ${(model.masses ?? []).length}`],
    ['Mass formulation', model.mass ?? 'consistent'],
    ['Materials', Object.keys(model.materials).join(', ')],
    ['Sections', Object.keys(model.sections).join(', ')],
  ];
  for (const d of dirs) summary.push([`Participating mass ${d}`, `${label(analysis.totalMass[d] ?? 0, 5)} kg`]);
  out.push('<table class="summary">');
  out.push('<tbody>');
  for (const [k, v] of summary) out.push(`<tr><th class="l" scope="row">${esc(k)}</th><td class="l">${esc(v)}</td></tr>`);
  out.push('</tbody>');
  out.push('</table>');
  out.push('</section>');

  // ---- modes table ----
  out.push('<section id="modes">');
  out.push('<h2>Modes</h2>');
  out.push(`<p>${m} mode${m === 1 ? '' : 's'}, lowest first. Effective mass is the share of the participating mass in each direction; the cumulative share is over modes 1 to j.</p>`);
  out.push('<table class="modes">');
  out.push('<thead>');
  out.push(`<tr><th>mode</th><th>frequency (Hz)</th><th>period (s)</th><th>ω (rad/s)</th>${dirs.map((d) => `<th>${d} mass (%)</th><th>${d} cumulative (%)</th>`).join('')}</tr>`);
  out.push('</thead>');
  out.push('<tbody>');
  for (const md of analysis.modes) {
    const cells = [String(md.mode), label(md.frequency, 5), Number.isFinite(md.period) ? label(md.period, 4) : 'rigid', label(md.angularFrequency, 5)];
    for (const d of dirs) cells.push(pct(md.effectiveMassRatio[d]), pct(md.cumulativeRatio[d]));
    out.push(row(cells));
  }
  out.push('</tbody>');
  out.push('</table>');
  out.push('</section>');

  // ---- effective mass chart ----
  if (m > 0 && dirs.length > 0) {
    out.push('<section id="effective-mass">');
    out.push('<h2>Cumulative effective mass</h2>');
    out.push('<p>Bars: share of each mode; lines: cumulative share. The dashed line marks 90 %, the share seismic checks commonly ask the retained modes to reach (common practice; the governing code decides).</p>');
    out.push(`<figure>${effectiveMassChartSvg(analysis)}</figure>`);
    out.push('</section>');
  }

  // ---- mode shapes ----
  if (shapes > 0) {
    out.push('<section id="mode-shapes">');
    out.push('<h2>Mode shapes</h2>');
    out.push(`<p>Grey: undeformed structure; colour: the mode shape, coloured by the direction carrying most of its effective mass${model.space === 'space' ? ', in an axonometric view with Z up' : ''}. Shapes are drawn to an arbitrary scale.</p>`);
    out.push('<div class="figures">');
    for (let j = 1; j <= shapes; j++) out.push(`<figure class="mode" data-mode="${j}">${modeShapeSvg(analysis, j, { width: 560, height: 380, segments })}</figure>`);
    out.push('</div>');
    out.push('</section>');
  }

  // ---- buckling ----
  if (bk) {
    out.push('<section id="buckling">');
    out.push('<h2>Linear buckling</h2>');
    const loads = bk.load.reduce((s, v) => s + Math.abs(v), 0);
    out.push(`<p>Critical load factors μ of the reference load case (sum of |nodal loads| ${esc(label(loads, 4))} N): the structure buckles, by linear theory, under μ times that load. Imperfections and plasticity lower the real capacity.</p>`);
    out.push('<table class="buckling">');
    out.push('<thead><tr><th>shape</th><th>load factor μ</th><th>residual</th></tr></thead>');
    out.push('<tbody>');
    bk.loadFactors.forEach((mu, j) => out.push(row([String(j + 1), label(mu, 5), bk.residuals[j].toExponential(1)])));
    out.push('</tbody>');
    out.push('</table>');
    if (bk.sturm) out.push(`<p>Sturm count: ${bk.sturm.countBelow} positive load factor(s) below ${esc(label(bk.sturm.shift, 5))}, ${bk.sturm.passed ? '<span class="ok">none missed</span>' : '<span class="fail">MISMATCH</span>'}.</p>`);
    out.push('<div class="figures">');
    const n = bk.assembled.stiffness.n;
    bk.loadFactors.forEach((mu, j) => {
      const cap = `Buckled shape ${j + 1} · μ = ${label(mu, 5)}`;
      out.push(`<figure class="buckled" data-shape="${j + 1}">${shapeSvg(bk.assembled, bk.shapes.subarray(j * n, (j + 1) * n), { width: 560, height: 380, segments, caption: cap, colour: '#6a4c93' })}</figure>`);
    });
    out.push('</div>');
    out.push('</section>');
  }

  // ---- verification ----
  out.push('<section id="verification">');
  out.push('<h2>Verification</h2>');
  const maxRes = eigen.residuals.reduce((a, b) => Math.max(a, b), 0);
  const ver: [string, string][] = [
    ['Solver', eigen.method],
    ['Largest relative residual ‖Kφ − λMφ‖ / (‖K‖‖φ‖)', `${maxRes.toExponential(2)} (limit 1e-8)`],
    ['M-orthonormality error max |ΦᵀMΦ − I|', `${eigen.orthogonalityError.toExponential(2)} (limit 1e-10)`],
  ];
  out.push('<table class="verification">');
  out.push('<tbody>');
  for (const [k, v] of ver) out.push(`<tr><th class="l" scope="row">${esc(k)}</th><td class="l">${esc(v)}</td></tr>`);
  if (eigen.sturm) {
    const s = eigen.sturm;
    const hz = Math.sqrt(Math.max(s.shift, 0)) / (2 * Math.PI);
    const verdict = s.passed ? '<span class="ok">passed</span>' : '<span class="fail">FAILED</span>';
    out.push(`<tr><th class="l" scope="row">Sturm count</th><td class="l">${verdict}: ${s.countBelow - (s.countBelowLower ?? 0)} eigenvalue(s) counted, ${s.returnedBelow} computed, below ${esc(label(hz, 5))} Hz</td></tr>`);
  } else out.push('<tr><th class="l" scope="row">Sturm count</th><td class="l">not performed</td></tr>');
  out.push('</tbody>');
  out.push('</table>');
  out.push('<table class="residuals">');
  out.push('<thead><tr><th>mode</th><th>eigenvalue λ (rad²/s²)</th><th>relative residual</th></tr></thead>');
  out.push('<tbody>');
  analysis.modes.forEach((md, j) => out.push(row([String(md.mode), md.eigenvalue.toPrecision(10), eigen.residuals[j].toExponential(2)])));
  out.push('</tbody>');
  out.push('</table>');
  out.push('</section>');
  out.push('</main>');
  out.push('</body>');
  out.push('</html>');
  return out.join('\n') + '\n';
}
