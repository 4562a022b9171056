/**
 * docs/app in a real browser: Debian's headless chromium opens the page with `?auto=demo`, its
 * Web Worker solves the demo footbridge with the self-contained browser build of the library
 * (dist/browser/eigenframe.js: ml-matrix bundled in, no import map, no shim), and the frequencies the page shows must equal those the
 * Node library computes for the same model (reference: `modalAnalysis` in Node, same count),
 * with no console error, no uncaught exception and no failed request. Then a model picked
 * through the file input is solved too, and a bad one shows its typed error and path.
 *
 * Chromium is driven over the Chrome DevTools Protocol on a pipe (`--remote-debugging-pipe`:
 * JSON messages separated by NUL bytes, the browser reading fd 3 and writing fd 4), which needs
 * no WebSocket client. The repository root is served read-only by a small node:http server on
 * 127.0.0.1 at a random port. Skipped (with a message) when /usr/bin/chromium or
 * dist/browser/eigenframe.js is absent; CI installs chromium and builds first.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { modalAnalysis } from '../src/modal/analysis';
import { Cdp } from './chromium';
import { parseModel } from '../src/model/read';
import { simplySupportedBeam } from './beam-fixture';

const CHROMIUM = '/usr/bin/chromium';
const ROOT = resolve(new URL('..', import.meta.url).pathname);
const hasChromium = existsSync(CHROMIUM);
const hasBuild = existsSync(join(ROOT, 'dist', 'browser', 'eigenframe.js'));
const skip = !hasChromium || !hasBuild;
if (!hasChromium) console.warn(`browser.test: skipped, ${CHROMIUM} not found (install it: apt-get install -y chromium)`);
else if (!hasBuild) console.warn('browser.test: skipped, dist/browser/eigenframe.js not found (run npm run build first)');

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.cjs': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
};

/** Read-only static server of the repository root: GET and HEAD of files under ROOT, else 404/405. */
function serveRoot(): Promise<{ server: Server; origin: string; failures: string[]; requests: string[] }> {
  const failures: string[] = [];
  const requests: string[] = [];
  const server = createServer((req, res) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { allow: 'GET, HEAD' }).end();
      return;
    }
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    requests.push(path);
    const file = normalize(join(ROOT, path));
    if ((file !== ROOT && !file.startsWith(ROOT + sep)) || !existsSync(file) || !statSync(file).isFile()) {
      failures.push(`${res.statusCode = 404} ${path}`);
      res.end();
      return;
    }
    res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store' });
    res.end(req.method === 'HEAD' ? undefined : readFileSync(file));
  });
  return new Promise((ok) => server.listen(0, '127.0.0.1', () => {
    const a = server.address();
    ok({ server, origin: `http://127.0.0.1:${typeof a === 'object' && a ? a.port : 0}`, failures, requests });
  }));
}

let chrome: ChildProcess | undefined;
let cdp: Cdp | undefined;
let profile = '';
let served: Awaited<ReturnType<typeof serveRoot>> | undefined;

beforeAll(async () => {
  if (skip) return;
  served = await serveRoot();
  profile = mkdtempSync(join(tmpdir(), 'eigenframe-chromium-'));
}, 30_000);

afterAll(async () => {
  if (chrome && chrome.exitCode === null) {
    // Browser.close lets chromium end its own helper processes before the profile is removed.
    const exited = new Promise((ok) => chrome!.once('exit', ok));
    await Promise.race([cdp?.send('Browser.close').catch(() => undefined), new Promise((ok) => setTimeout(ok, 3000))]);
    await Promise.race([exited, new Promise((ok) => setTimeout(ok, 5000))]);
    if (chrome.exitCode === null) chrome.kill('SIGKILL');
  }
  served?.server.close();
  if (profile) rmSync(profile, { recursive: true, force: true, maxRetries: 10, retryDelay: 200 });
});

describe('docs/app in headless chromium', () => {
  it.skipIf(skip)('solves the demo in a Web Worker and shows the frequencies the Node library computes, without console errors', async () => {
    chrome = spawn(
      CHROMIUM,
      [
        '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
        '--disable-background-networking', '--disable-component-update', '--disable-sync',
        '--disable-dev-shm-usage', '--remote-debugging-pipe', `--user-data-dir=${profile}`, 'about:blank',
      ],
      { stdio: ['ignore', 'ignore', 'pipe', 'pipe', 'pipe'] },
    );
    let stderr = '';
    chrome.stderr!.on('data', (d) => (stderr += d));
    cdp = new Cdp(chrome.stdio[3] as Writable, chrome.stdio[4] as Readable);
    const c = cdp;

    // Page and workers: console errors, uncaught exceptions, log entries of level error.
    const problems: string[] = [];
    const attached: string[] = [];
    c.onEvent((e) => {
      if (e.method === 'Runtime.consoleAPICalled' && (e.params.type === 'error' || e.params.type === 'assert')) {
        problems.push(`console.${e.params.type}: ${e.params.args.map((a: any) => a.value ?? a.description).join(' ')}`);
      } else if (e.method === 'Runtime.exceptionThrown') {
        problems.push(`exception: ${e.params.exceptionDetails.exception?.description ?? e.params.exceptionDetails.text}`);
      } else if (e.method === 'Log.entryAdded' && e.params.entry.level === 'error') {
        problems.push(`log: ${e.params.entry.text} ${e.params.entry.url ?? ''}`);
      } else if (e.method === 'Target.attachedToTarget') {
        // The Web Worker: watch its console too, then let it run.
        attached.push(e.params.targetInfo.type);
        const s = e.params.sessionId;
        void c.send('Runtime.enable', {}, s).then(() => c.send('Runtime.runIfWaitingForDebugger', {}, s)).catch(() => undefined);
      }
    });

    const { targetId } = await c.send('Target.createTarget', { url: 'about:blank' });
    const { sessionId } = await c.send('Target.attachToTarget', { targetId, flatten: true });
    await c.send('Runtime.enable', {}, sessionId);
    await c.send('Log.enable', {}, sessionId);
    await c.send('Page.enable', {}, sessionId);
    await c.send('Target.setAutoAttach', { autoAttach: true, waitForDebuggerOnStart: true, flatten: true }, sessionId);
    await c.send('Page.navigate', { url: `${served!.origin}/docs/app/index.html?auto=demo` }, sessionId);

    const evaluate = async (expression: string): Promise<any> => {
      const r = await c.send('Runtime.evaluate', { expression, returnByValue: true }, sessionId);
      return r.result?.value;
    };
    // Poll the page until the worker's result is in the DOM (or an error is shown).
    let state: string | undefined;
    const deadline = Date.now() + 90_000;
    while (Date.now() < deadline) {
      state = await evaluate('document.documentElement.dataset.state');
      if (state === 'done' || state === 'error') break;
      await new Promise((ok) => setTimeout(ok, 200));
    }
    const status = await evaluate('document.getElementById("status").textContent');
    expect(state, `page state (status line: ${status}; chromium stderr: ${stderr.slice(-400)})`).toBe('done');

    const page = JSON.parse(await evaluate(`JSON.stringify({
      full: JSON.parse(document.getElementById('modes').dataset.frequencies),
      shown: [...document.querySelectorAll('#modes-body td.hz')].map((td) => td.textContent),
      rows: document.querySelectorAll('#modes-body tr').length,
      head: [...document.querySelectorAll('#modes-head th')].map((th) => th.textContent),
      svgLines: document.querySelectorAll('#figure svg line, #figure svg path, #figure svg polyline').length,
      caution: document.getElementById('caution').textContent,
      version: document.documentElement.dataset.version ?? null,
    })`)) as { full: number[]; shown: string[]; rows: number; head: string[]; svgLines: number; caution: string; version: string | null };

    // Reference: the Node library on the same file, same count (the page's default, 12).
    const node = modalAnalysis(parseModel(readFileSync(join(ROOT, 'examples', 'footbridge.json'), 'utf8')), { count: 12 });
    expect(page.rows).toBe(12);
    expect(page.full).toHaveLength(12);
    const formatPath = join(ROOT, 'docs', 'app', 'format.js'); // the page's own formatter
    const { formatNumber } = (await import(/* @vite-ignore */ formatPath)) as { formatNumber: (x: number) => string };
    node.modes.forEach((m, j) => {
      // Same algorithm, same IEEE double arithmetic: agreement to round-off.
      expect(Math.abs(page.full[j] - m.frequency) / m.frequency).toBeLessThan(1e-10);
      expect(page.shown[j]).toBe(formatNumber(m.frequency));
    });
    expect(page.head.slice(0, 3)).toEqual(['Mode', 'Frequency (Hz)', 'Period (s)']);
    expect(page.head.some((h) => /Eff\. mass uz/.test(h))).toBe(true);
    expect(page.svgLines).toBeGreaterThan(10);
    expect(page.caution).toMatch(/support, and never replace, design to the local codes by a licensed engineer/);
    expect(page.version).toMatch(/^\d+\.\d+\.\d+/); // the main thread loaded the browser build too
    expect(problems).toEqual([]);
    expect(served!.failures).toEqual([]);
    // The one self-contained module, nothing from node_modules (no shim, no import map).
    expect(served!.requests).toContain('/dist/browser/eigenframe.js');
    expect(served!.requests.filter((p) => p.startsWith('/node_modules/') || p === '/dist/index.js')).toEqual([]);
    expect(attached).toContain('worker'); // the solve ran in a Web Worker

    // The file picker: a model chosen by the user, then a bad one (its typed error is shown).
    const pick = async (name: string, text: string): Promise<string | undefined> => {
      const file = join(profile, name);
      writeFileSync(file, text);
      await evaluate('document.documentElement.dataset.state = "picking"');
      const { result } = await c.send('Runtime.evaluate', { expression: 'document.getElementById("file")' }, sessionId);
      await c.send('DOM.setFileInputFiles', { files: [file], objectId: result.objectId }, sessionId);
      const until = Date.now() + 60_000;
      let st: string | undefined;
      while (Date.now() < until) {
        st = await evaluate('document.documentElement.dataset.state');
        if (st === 'done' || st === 'error') break;
        await new Promise((ok) => setTimeout(ok, 100));
      }
      return st;
    };
    await c.send('DOM.enable', {}, sessionId);
    const beam = simplySupportedBeam('picked beam');
    expect(await pick('beam.json', JSON.stringify(beam))).toBe('done');
    const picked = JSON.parse(await evaluate('document.getElementById("modes").dataset.frequencies')) as number[];
    const nodeBeam = modalAnalysis(parseModel(JSON.stringify(beam)), { count: 12 });
    expect(picked).toHaveLength(12);
    picked.forEach((f, j) => expect(Math.abs(f - nodeBeam.modes[j].frequency) / nodeBeam.modes[j].frequency).toBeLessThan(1e-10));
    // Source: Euler–Bernoulli simply supported beam, f1 = (π / 2L²)·√(EI/ρA) (closed form).
    const f1 = (Math.PI / (2 * 36)) * Math.sqrt((2.1e11 * 2.2e-6) / (7850 * 1.5e-3));
    expect(Math.abs(picked[0] - f1) / f1).toBeLessThan(1e-5);

    const bad = { ...beam, elements: [{ id: 'e0', kind: 'beam', nodes: ['n0', 'n1'], material: 'steel', section: 'tube2' }] };
    expect(await pick('bad.json', JSON.stringify(bad))).toBe('error');
    const shownError = await evaluate('document.getElementById("status").textContent');
    expect(shownError).toMatch(/^ModelError at elements\[0\]\.section: .*tube2/);
    // The page reports the failure once on the console, as an error; nothing else went wrong.
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(/console\.error: eigenframe: ModelError at elements\[0\]\.section/);
  }, 120_000);
});
