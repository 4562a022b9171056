/**
 * The HTML report in a real browser: `eigenframe report` writes the demo footbridge's report,
 * Debian's headless chromium opens it from disk, and the page must render with no console error,
 * no exception and no request for anything outside the file (the report is self-contained), show
 * its headings, tables and one drawing per mode picture, and lay out at a sensible size. A
 * screenshot is saved as a test artifact (test-artifacts/report.png). Skipped with a message when
 * /usr/bin/chromium is absent; CI installs it.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/run';
import { CHROMIUM, closeChromium, launchChromium, type Cdp } from './chromium';

const ROOT = resolve(new URL('..', import.meta.url).pathname);
const hasChromium = existsSync(CHROMIUM);
if (!hasChromium) console.warn(`report-browser.test: skipped, ${CHROMIUM} not found (install it: apt-get install -y chromium)`);

let chrome: ChildProcess | undefined;
let cdp: Cdp | undefined;
const work = mkdtempSync(join(tmpdir(), 'eigenframe-report-'));

afterAll(async () => {
  await closeChromium(chrome, cdp);
  rmSync(work, { recursive: true, force: true, maxRetries: 10, retryDelay: 200 });
});

describe('HTML report in headless chromium', () => {
  it.skipIf(!hasChromium)('renders the demo report: headings, tables, drawings, caution, no console errors', async () => {
    const file = join(work, 'report.html');
    const r = runCli(['report', join(ROOT, 'examples', 'footbridge.json'), '--output', file, '--count', '8']);
    expect(r.status, r.stderr).toBe(0);

    const launched = launchChromium(join(work, 'profile'));
    chrome = launched.chrome;
    cdp = launched.cdp;
    const c = cdp;
    const problems: string[] = [];
    const requests: string[] = [];
    c.onEvent((e) => {
      if (e.method === 'Runtime.consoleAPICalled' && (e.params.type === 'error' || e.params.type === 'warning')) {
        problems.push(`console.${e.params.type}: ${e.params.args.map((a: { value?: unknown; description?: string }) => a.value ?? a.description).join(' ')}`);
      } else if (e.method === 'Runtime.exceptionThrown') {
        problems.push(`exception: ${e.params.exceptionDetails.text}`);
      } else if (e.method === 'Log.entryAdded' && e.params.entry.level === 'error') {
        problems.push(`log: ${e.params.entry.text}`);
      } else if (e.method === 'Network.requestWillBeSent') {
        requests.push(e.params.request.url);
      }
    });
    const { targetId } = await c.send('Target.createTarget', { url: 'about:blank' });
    const { sessionId } = await c.send('Target.attachToTarget', { targetId, flatten: true });
    for (const domain of ['Runtime', 'Log', 'Page', 'Network']) await c.send(`${domain}.enable`, {}, sessionId);
    await c.send('Emulation.setDeviceMetricsOverride', { width: 1200, height: 900, deviceScaleFactor: 1, mobile: false }, sessionId);
    const url = `file://${file}`;
    const loaded = new Promise<void>((ok) => c.onEvent((e) => e.method === 'Page.loadEventFired' && ok()));
    await c.send('Page.navigate', { url }, sessionId);
    await Promise.race([loaded, new Promise((ok) => setTimeout(ok, 30_000))]);

    const evaluate = async (expression: string): Promise<any> =>
      (await c.send('Runtime.evaluate', { expression, returnByValue: true }, sessionId)).result?.value;
    const page = JSON.parse(await evaluate(`JSON.stringify({
      title: document.title,
      h1: [...document.querySelectorAll('h1')].map((h) => h.textContent),
      h2: [...document.querySelectorAll('h2')].map((h) => h.textContent),
      modeRows: document.querySelectorAll('table.modes tbody tr').length,
      svgs: document.querySelectorAll('svg').length,
      shapes: document.querySelectorAll('#mode-shapes svg').length,
      width: document.documentElement.scrollWidth,
      height: document.documentElement.scrollHeight,
      svgBoxes: [...document.querySelectorAll('svg')].map((s) => { const b = s.getBoundingClientRect(); return [b.width, b.height]; }),
      text: document.body.innerText,
    })`));

    expect(page.h1).toHaveLength(1);
    expect(page.h2).toEqual(expect.arrayContaining(['Model', 'Modes', 'Mode shapes', 'Verification']));
    expect(page.modeRows).toBe(8);
    expect(page.shapes).toBeGreaterThan(0);
    for (const [w, h] of page.svgBoxes) {
      expect(w).toBeGreaterThan(50); // every drawing laid out at a visible size
      expect(h).toBeGreaterThan(50);
    }
    expect(page.width).toBeLessThanOrEqual(1200); // no horizontal overflow at a laptop width
    expect(page.text).toMatch(/never replace, design to the local codes by a licensed engineer/);
    expect(problems).toEqual([]);
    expect(requests.filter((u) => u !== url)).toEqual([]); // self-contained: nothing else is fetched

    const shot = await c.send('Page.captureScreenshot', { format: 'png', captureBeyondViewport: true }, sessionId);
    const artifacts = join(ROOT, 'test-artifacts');
    mkdirSync(artifacts, { recursive: true });
    writeFileSync(join(artifacts, 'report.png'), Buffer.from(shot.data, 'base64'));
    expect(shot.data.length).toBeGreaterThan(10_000);
  }, 90_000);
});
