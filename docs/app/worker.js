/**
 * The solver thread of the page (a module Web Worker): it loads the built ESM library
 * (dist/index.js), runs `parseModel` and `modalAnalysis`, and posts plain JSON back, so the page
 * stays responsive during the solve.
 *
 * Messages in:  { type: 'solve', text, source, count }
 * Messages out: { type: 'ready', version }
 *               { type: 'progress', phase, fraction }
 *               { type: 'result', report, model, svgs, ms }   report = modesJsonObject(…, { shapes: true })
 *               { type: 'error', name, path, message }
 */

const libraryUrl = new URL('../../dist/index.js', import.meta.url).href;
const mlMatrixUrl = new URL('./ml-matrix.js', import.meta.url).href;

/**
 * Import maps do not apply inside workers (WICG/import-maps issue #2), so the bare specifier
 * `ml-matrix` of the built library is rewritten to the shim's URL and the module is imported
 * from a Blob URL. The library bundles everything else into one file, so nothing else needs it.
 */
async function loadLibrary() {
  const response = await fetch(libraryUrl);
  if (!response.ok) throw new Error(`cannot load ${libraryUrl} (HTTP ${response.status}); run "npm run build" first`);
  const text = (await response.text())
    .replace(/(from\s*)(["'])ml-matrix\2/g, (_, from) => `${from}${JSON.stringify(mlMatrixUrl)}`)
    .replace(/\/\/# sourceMappingURL=(\S+)\s*$/, (_, map) => `//# sourceMappingURL=${new URL(map, libraryUrl).href}`);
  const blobUrl = URL.createObjectURL(new Blob([text], { type: 'text/javascript' }));
  try {
    return await import(blobUrl);
  } finally {
    URL.revokeObjectURL(blobUrl);
  }
}

const library = loadLibrary();

library.then(
  (lib) => postMessage({ type: 'ready', version: lib.VERSION }),
  (e) => postMessage({ type: 'error', name: e?.name ?? 'Error', path: 'dist/index.js', message: String(e?.message ?? e) }),
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
