/**
 * Test helper: a minimal Chrome DevTools Protocol client over chromium's debugging pipe
 * (`--remote-debugging-pipe`: JSON messages separated by NUL bytes, the browser reading fd 3 and
 * writing fd 4), so no WebSocket client is needed, and the launch flags that work here as root.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import type { Readable, Writable } from 'node:stream';

/** Where Debian's chromium lives. */
export const CHROMIUM = '/usr/bin/chromium';

/** A minimal CDP client over chromium's debugging pipe. */
export class Cdp {
  private nextId = 1;
  private buffer = '';
  private readonly calls = new Map<number, { ok: (v: any) => void; fail: (e: Error) => void }>();
  readonly events: Array<{ method: string; params: any; sessionId?: string }> = [];
  private listeners: Array<(e: { method: string; params: any; sessionId?: string }) => void> = [];

  constructor(private readonly out: Writable, input: Readable) {
    input.setEncoding('utf8');
    input.on('data', (chunk: string) => {
      this.buffer += chunk;
      let k: number;
      while ((k = this.buffer.indexOf('\0')) >= 0) {
        const msg = JSON.parse(this.buffer.slice(0, k));
        this.buffer = this.buffer.slice(k + 1);
        if (msg.id !== undefined) {
          const c = this.calls.get(msg.id);
          this.calls.delete(msg.id);
          if (msg.error) c?.fail(new Error(`${msg.error.message} (${msg.error.code})`));
          else c?.ok(msg.result);
        } else {
          this.events.push(msg);
          for (const l of this.listeners) l(msg);
        }
      }
    });
  }

  send(method: string, params: object = {}, sessionId?: string): Promise<any> {
    const id = this.nextId++;
    return new Promise((ok, fail) => {
      this.calls.set(id, { ok, fail });
      this.out.write(`${JSON.stringify({ id, method, params, ...(sessionId ? { sessionId } : {}) })}\0`);
    });
  }

  onEvent(l: (e: { method: string; params: any; sessionId?: string }) => void): void {
    this.listeners.push(l);
  }
}


/** Starts headless chromium with a fresh profile and a CDP pipe. */
export function launchChromium(profile: string): { chrome: ChildProcess; cdp: Cdp; stderr: () => string } {
  const chrome = spawn(
    CHROMIUM,
    [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
      '--disable-dev-shm-usage', '--remote-debugging-pipe', `--user-data-dir=${profile}`, 'about:blank',
    ],
    { stdio: ['ignore', 'ignore', 'pipe', 'pipe', 'pipe'] },
  );
  let err = '';
  chrome.stderr!.on('data', (d) => (err += d));
  const cdp = new Cdp(chrome.stdio[3] as Writable, chrome.stdio[4] as Readable);
  return { chrome, cdp, stderr: () => err };
}

/** Closes chromium politely, then by force. */
export async function closeChromium(chrome: ChildProcess | undefined, cdp: Cdp | undefined): Promise<void> {
  if (!chrome || chrome.exitCode !== null) return;
  const exited = new Promise((ok) => chrome.once('exit', ok));
  await Promise.race([cdp?.send('Browser.close').catch(() => undefined), new Promise((ok) => setTimeout(ok, 3000))]);
  await Promise.race([exited, new Promise((ok) => setTimeout(ok, 5000))]);
  if (chrome.exitCode === null) chrome.kill('SIGKILL');
}
