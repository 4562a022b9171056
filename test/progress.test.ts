/**
 * src/cli/progress.ts: the progress line on a terminal, silence elsewhere, and Ctrl-C through
 * an AbortController that the library's solver honours. Fake stream, clock and signal source.
 */
import { EventEmitter } from 'node:events';
import { describe, expect, it } from 'vitest';
import { createProgress, INTERRUPT_EXIT_STATUS, PROGRESS_DEFAULTS } from '../src/cli/progress';
import { AbortedError } from '../src/errors';
import { modalAnalysis } from '../src/modal/analysis';
import { parseModel } from '../src/model/read';
import { readFileSync } from 'node:fs';

function fakeStream(isTTY: boolean, columns?: number) {
  const chunks: string[] = [];
  return { isTTY, columns, chunks, write: (s: string) => chunks.push(s) };
}

function fakeClock() {
  let t = 1000;
  return { now: () => t, advance: (ms: number) => (t += ms) };
}

/** What a terminal would show: apply carriage returns and newlines to the written text. */
function screen(chunks: string[]): string[] {
  const lines: string[] = [''];
  let col = 0;
  for (const ch of chunks.join('')) {
    if (ch === '\r') col = 0;
    else if (ch === '\n') {
      lines.push('');
      col = 0;
    } else {
      const l = lines[lines.length - 1];
      lines[lines.length - 1] = l.slice(0, col) + ch + l.slice(col + 1);
      col++;
    }
  }
  return lines;
}

describe('createProgress', () => {
  it('draws phase, percent and elapsed time on a terminal, throttled, and clears on done', () => {
    const s = fakeStream(true, 80);
    const c = fakeClock();
    const p = createProgress(s, { now: c.now, signals: null });
    p.onProgress('factorize', 0);
    c.advance(1500);
    p.onProgress('lanczos', 0.25);
    expect(screen(s.chunks)).toEqual(['lanczos  25 %  1.5 s  ']); // padded over the longer line before
    const before = s.chunks.length;
    c.advance(PROGRESS_DEFAULTS.interval / 2);
    p.onProgress('lanczos', 0.3); // same phase within the interval: not redrawn
    expect(s.chunks.length).toBe(before);
    p.onProgress('lanczos', 1); // completion always redrawn
    expect(screen(s.chunks)[0]).toContain('lanczos 100 %  1.6 s');
    p.done();
    expect(screen(s.chunks)[0].trim()).toBe('');
    const after = s.chunks.length;
    p.onProgress('verify', 0.5); // after done: nothing
    p.done();
    expect(s.chunks.length).toBe(after);
  });

  it('writes nothing when the stream is not a terminal', () => {
    const s = fakeStream(false);
    const p = createProgress(s, { signals: null });
    p.onProgress('analyse', 0);
    p.onProgress('lanczos', 0.5);
    p.done();
    expect(s.chunks).toEqual([]);
  });

  it('clamps odd fractions and keeps the line within the terminal width', () => {
    const s = fakeStream(true, 20);
    const p = createProgress(s, { signals: null, interval: 0 });
    p.onProgress('a-very-long-phase-name-indeed', 7);
    expect(screen(s.chunks)[0].length).toBeLessThanOrEqual(19);
    p.onProgress('x', Number.NaN);
    expect(screen(s.chunks)[0]).toMatch(/^x {3}0 %/);
    p.done();
  });

  it('first SIGINT aborts the signal with an AbortedError, second exits with 130; done removes the handler', () => {
    const s = fakeStream(false);
    const signals = new EventEmitter();
    const exits: number[] = [];
    const p = createProgress(s, { signals, exit: (code) => exits.push(code) });
    expect(signals.listenerCount('SIGINT')).toBe(1);
    expect(p.signal.aborted).toBe(false);
    signals.emit('SIGINT');
    expect(p.signal.aborted).toBe(true);
    expect(p.signal.reason).toBeInstanceOf(AbortedError);
    expect((p.signal.reason as AbortedError).path).toBe('SIGINT');
    expect(s.chunks.join('')).toMatch(/interrupted; stopping without writing any output/);
    expect(exits).toEqual([]);
    signals.emit('SIGINT');
    expect(exits).toEqual([INTERRUPT_EXIT_STATUS]);
    p.done();
    expect(signals.listenerCount('SIGINT')).toBe(0);
  });

  it('an aborted signal stops the library with AbortedError (path "signal")', () => {
    const model = parseModel(readFileSync(new URL('../examples/footbridge.json', import.meta.url), 'utf8'));
    const signals = new EventEmitter();
    const p = createProgress(fakeStream(false), { signals });
    signals.emit('SIGINT');
    let caught: unknown;
    try {
      modalAnalysis(model, { count: 6, signal: p.signal, onProgress: p.onProgress });
    } catch (e) {
      caught = e;
    }
    p.done();
    expect(caught).toBeInstanceOf(AbortedError);
    expect((caught as AbortedError).path).toBe('signal');
  });

  it('reports phases of a real solve through onProgress, reaching 100 %', () => {
    const model = parseModel(readFileSync(new URL('../examples/footbridge.json', import.meta.url), 'utf8'));
    const s = fakeStream(true, 100);
    const seen: string[] = [];
    const p = createProgress(s, { signals: null, interval: 0 });
    modalAnalysis(model, {
      count: 6,
      onProgress: (phase, f) => {
        seen.push(phase);
        p.onProgress(phase, f);
      },
    });
    const lines = s.chunks.join('');
    p.done();
    expect(seen.length).toBeGreaterThan(0);
    expect(lines).toMatch(/100 %/);
  });
});
