/**
 * The page: picks a model (file or demo), hands it to the solver worker, shows the frequency
 * table (mode, Hz, period, effective mass % per translation) and a picture of the selected mode.
 *
 * `?auto=demo` solves the demo at once; when the page is done, <html data-state> is `done` (or
 * `error`), and the table carries the full-precision frequencies in `data-frequencies` (JSON).
 * The main thread imports the library itself only for the caution and the version, from the
 * same self-contained browser build the worker uses (dist/browser/eigenframe.js).
 */

import { formatNumber } from './format.js';

const $ = (id) => document.getElementById(id);
const ui = {
  file: $('file'), demo: $('demo'), count: $('count'), stop: $('stop'), status: $('status'),
  progress: $('progress'), table: $('modes'), head: $('modes-head'), body: $('modes-body'),
  facts: $('facts'), figure: $('figure'), caption: $('caption'), caution: $('caution'),
};
const DEMO_URL = new URL('../../examples/footbridge.json', import.meta.url);
const params = new URLSearchParams(location.search);

let worker;
let ready = false;
let pending; // a solve asked for before the worker was ready
let result; // last { report, model, svgs }
let started = 0;
let ticker = 0;

function setState(state) {
  document.documentElement.dataset.state = state;
}

function setStatus(text, isError = false) {
  ui.status.textContent = text;
  ui.status.classList.toggle('error', isError);
}

function busy(on) {
  ui.demo.disabled = on;
  ui.file.disabled = on;
  ui.stop.disabled = !on;
  ui.progress.hidden = !on;
  clearInterval(ticker);
  if (on) {
    started = performance.now();
    ui.progress.value = 0;
    // Ticks while the worker computes: the page stays responsive.
    ticker = setInterval(() => {
      const phase = ui.status.dataset.phase ?? 'solving';
      setStatus(`${phase}… ${((performance.now() - started) / 1000).toFixed(1)} s`);
    }, 200);
  }
}

function startWorker() {
  worker = new Worker(new URL('./worker.js', import.meta.url), { type: 'module' });
  ready = false;
  worker.onmessage = (event) => onWorkerMessage(event.data);
  worker.onerror = (event) => {
    event.preventDefault();
    fail({ name: 'Error', path: 'worker.js', message: event.message || 'the solver thread failed to start' });
  };
}

function onWorkerMessage(msg) {
  if (msg.type === 'ready') {
    ready = true;
    if (!pending) setStatus(`Ready (eigenframe ${msg.version}). Pick a model file or load the demo.`);
    if (!pending) setState('ready');
    if (pending) {
      worker.postMessage(pending);
      pending = undefined;
    }
  } else if (msg.type === 'progress') {
    ui.status.dataset.phase = msg.phase;
    ui.progress.value = msg.fraction;
  } else if (msg.type === 'result') {
    busy(false);
    result = msg;
    showResult(msg.report, msg.ms);
    setState('done');
  } else if (msg.type === 'error') {
    fail(msg);
  }
}

function fail(e) {
  busy(false);
  const where = e.path ? ` at ${e.path}` : '';
  setStatus(`${e.name}${where}: ${e.message}`, true);
  console.error(`eigenframe: ${e.name}${where}: ${e.message}`);
  setState('error');
}

function solve(text, source) {
  const count = Math.max(1, Math.min(200, Math.floor(Number(ui.count.value) || 12)));
  ui.count.value = String(count);
  const msg = { type: 'solve', text, source, count };
  busy(true);
  delete ui.status.dataset.phase;
  setState('solving');
  setStatus(`Solving ${source}…`);
  if (ready) worker.postMessage(msg);
  else pending = msg;
}

async function loadDemo() {
  try {
    const response = await fetch(DEMO_URL);
    if (!response.ok) throw new Error(`HTTP ${response.status} for ${DEMO_URL.pathname}`);
    solve(await response.text(), 'footbridge.json');
  } catch (e) {
    fail({ name: 'Error', path: 'examples/footbridge.json', message: `cannot load the demo model (${e.message})` });
  }
}

// --- the table --------------------------------------------------------------------------------

function showResult(report, ms) {
  const dirs = report.directions.filter((d) => d === 'ux' || d === 'uy' || d === 'uz');
  ui.head.replaceChildren(
    ...['Mode', 'Frequency (Hz)', 'Period (s)', ...dirs.map((d) => `Eff. mass ${d} (%)`)].map((t) => {
      const th = document.createElement('th');
      th.textContent = t;
      return th;
    }),
  );
  const rows = report.modes.map((m, j) => {
    const tr = document.createElement('tr');
    tr.dataset.mode = String(m.mode);
    const cells = [String(m.mode), formatNumber(m.frequency), formatNumber(m.period), ...dirs.map((d) => (100 * (m.effectiveMassRatio[d] ?? 0)).toFixed(1))];
    for (const [k, text] of cells.entries()) {
      const td = document.createElement('td');
      td.textContent = text;
      if (k === 1) {
        td.className = 'hz';
        td.dataset.hz = String(m.frequency);
      }
      tr.append(td);
    }
    tr.addEventListener('click', () => selectMode(j));
    return tr;
  });
  ui.body.replaceChildren(...rows);
  ui.table.dataset.frequencies = JSON.stringify(report.modes.map((m) => m.frequency));
  ui.table.hidden = false;
  const maxRes = report.verification.maxResidual;
  const sturm = report.verification.sturm;
  ui.facts.textContent =
    `${report.title || 'untitled model'} · ${report.dofCount} DOF · ${report.solver.method} · ` +
    `largest residual ${maxRes.toExponential(1)}` + (sturm ? ` · Sturm check ${sturm.passed ? 'passed' : 'FAILED'}` : '') +
    ` · ${(ms / 1000).toFixed(2)} s in the worker`;
  if (report.caution) ui.caution.textContent = report.caution;
  setStatus(`${report.modes.length} modes of ${report.title || 'the model'}. Click a row to see its shape.`);
  selectMode(0);
}

function selectMode(j) {
  for (const tr of ui.body.children) tr.classList.toggle('selected', Number(tr.dataset.mode) === j + 1);
  const { report, model, svgs } = result;
  const m = report.modes[j];
  if (svgs) {
    ui.figure.innerHTML = svgs[j];
    ui.caption.textContent = '';
  } else {
    ui.figure.replaceChildren(drawMode(model, report.dofs, m.shape));
    ui.caption.textContent = `Mode ${m.mode} · ${formatNumber(m.frequency)} Hz · undeformed in grey`;
  }
}

// --- a simple mode picture (used when the library has no SVG drawing of its own) ---------------

const SVG = 'http://www.w3.org/2000/svg';

/**
 * Straight-line picture of a mode: orthographic view (x–y for plane models; for space models an
 * axonometric view with z up, azimuth 35°, elevation 25°), deformed = node + scale·translation
 * with the largest translation drawn as 10 % of the model's size.
 */
function drawMode(model, dofs, shape) {
  const slot = { ux: 0, uy: 1, uz: 2 };
  const index = new Map(model.nodes.map((n, i) => [n.id, i]));
  const disp = model.nodes.map(() => [0, 0, 0]);
  dofs.forEach((d, k) => {
    if (d.dof in slot) disp[index.get(d.node)][slot[d.dof]] = shape[k];
  });
  const space = model.space === 'space';
  const az = (35 * Math.PI) / 180;
  const el = (25 * Math.PI) / 180;
  const right = space ? [-Math.sin(az), Math.cos(az), 0] : [1, 0, 0];
  const up = space ? [-Math.sin(el) * Math.cos(az), -Math.sin(el) * Math.sin(az), Math.cos(el)] : [0, 1, 0];
  const dot = (a, b) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
  const pts = model.nodes.map((n) => [n.x, n.y, n.z ?? 0]);
  let size = 0;
  for (const p of pts) for (const q of pts) size = Math.max(size, Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]));
  let dmax = 0;
  for (const d of disp) dmax = Math.max(dmax, Math.hypot(d[0], d[1], d[2]));
  const scale = dmax > 0 ? (0.1 * (size || 1)) / dmax : 0;
  const def = pts.map((p, i) => p.map((c, k) => c + scale * disp[i][k]));
  const proj = (p) => [dot(right, p), -dot(up, p)];
  const all = [...pts, ...def].map(proj);
  const xs = all.map((p) => p[0]);
  const ys = all.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const W = 720;
  const H = 420;
  const pad = 24;
  const k = Math.min((W - 2 * pad) / Math.max(x1 - x0, 1e-9), (H - 2 * pad) / Math.max(y1 - y0, 1e-9));
  const screen = (p) => {
    const [u, v] = proj(p);
    return [pad + (u - x0) * k + ((W - 2 * pad) - (x1 - x0) * k) / 2, pad + (v - y0) * k + ((H - 2 * pad) - (y1 - y0) * k) / 2];
  };
  const svg = document.createElementNS(SVG, 'svg');
  svg.setAttribute('viewBox', `0 0 ${W} ${H}`);
  svg.setAttribute('role', 'img');
  const layer = (points, colour, width) => {
    const g = document.createElementNS(SVG, 'g');
    g.setAttribute('stroke', colour);
    g.setAttribute('stroke-width', String(width));
    g.setAttribute('stroke-linecap', 'round');
    for (const e of model.elements) {
      const [a, b] = e.nodes.map((id) => screen(points[index.get(id)]));
      const line = document.createElementNS(SVG, 'line');
      line.setAttribute('x1', a[0].toFixed(1));
      line.setAttribute('y1', a[1].toFixed(1));
      line.setAttribute('x2', b[0].toFixed(1));
      line.setAttribute('y2', b[1].toFixed(1));
      g.append(line);
    }
    return g;
  };
  svg.append(layer(pts, '#c3c9d2', 1.2), layer(def, '#1f6fb2', 2));
  return svg;
}

// --- wiring -----------------------------------------------------------------------------------

ui.demo.addEventListener('click', () => loadDemo());
ui.file.addEventListener('change', async () => {
  const f = ui.file.files?.[0];
  if (f) solve(await f.text(), f.name);
});
ui.stop.addEventListener('click', () => {
  // A busy worker cannot read messages, so stopping means ending the thread and starting anew.
  worker.terminate();
  busy(false);
  setStatus('Stopped. Pick a model file or load the demo.');
  setState('ready');
  startWorker();
});

setState('loading');
startWorker();
if (params.get('auto') === 'demo') loadDemo();

// The caution and version straight from the library (its browser build).
import('../../dist/browser/eigenframe.js').then(
  (lib) => {
    ui.caution.textContent = lib.ENGINEERING_CAUTION;
    document.documentElement.dataset.version = lib.VERSION;
  },
  (e) => console.error(`eigenframe: cannot load dist/browser/eigenframe.js on the page (${e.message}); run "npm run build"`),
);
