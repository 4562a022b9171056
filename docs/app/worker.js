/**
 * The solver thread of the page (a module Web Worker): it loads the self-contained browser build
 * of the library (dist/browser/eigenframe.js, ml-matrix bundled in, no bare imports), runs
 * `parseModel` and `modalAnalysis`, and posts plain JSON back, so the page stays responsive
 * during the solve.
 *
 * Messages in:  { type: 'solve', text, source, count }
 * Messages out: { type: 'ready', version }
 *               { type: 'progress', phase, fraction }
 *               { type: 'result', report, model, svgs, ms }   report = modesJsonObject(…, { shapes: true })
 *               { type: 'error', name, path, message }
 */

const libraryUrl = new URL('../../dist/browser/eigenframe.js', import.meta.url).href;

/** A dynamic import, so that a missing build is reported on the page rather than as a bare failure. */
const library = import(libraryUrl).catch((e) => {
  throw new Error(`cannot load ${libraryUrl} (${e?.message ?? e}); run "npm run build" first`);
});

library.then(
  (lib) => postMessage({ type: 'ready', version: lib.VERSION }),
  (e) => postMessage({ type: 'error', name: e?.name ?? 'Error', path: 'dist/browser/eigenframe.js', message: String(e?.message ?? e) }),
);

self.onmessage = async (event) => {
  const msg = event.data;
  if (msg?.type !== 'solve') return;
  let lib;
  try {
    lib = await library;
  } catch {
    return; // already reported
  }
  const t0 = performance.now();
  try {
    const model = lib.parseModel(msg.text, msg.source || 'model');
    const analysis = lib.modalAnalysis(model, {
      count: msg.count,
      onProgress: (phase, fraction) => postMessage({ type: 'progress', phase, fraction }),
    });
    const report = lib.modesJsonObject(analysis, { shapes: true });
    // SVG pictures from the library when it exports them; otherwise the page draws its own.
    const svgs = typeof lib.modeShapeSvg === 'function' ? analysis.modes.map((m) => lib.modeShapeSvg(analysis, m.mode, { width: 720, height: 440 })) : null;
    postMessage({ type: 'result', report, model, svgs, ms: performance.now() - t0 });
  } catch (e) {
    postMessage({
      type: 'error',
      name: e?.name ?? 'Error',
      path: typeof e?.path === 'string' ? e.path : '',
      message: typeof e?.detail === 'string' ? e.detail : String(e?.message ?? e),
    });
  }
};
