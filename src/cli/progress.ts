/**
 * Progress and interruption of long CLI work.
 *
 * - A one-line progress display on standard error (phase, percent, elapsed seconds), redrawn in
 *   place with a carriage return, only when that stream is a terminal. Piped or redirected
 *   stderr gets nothing, and standard output (the `--json` object) is never touched.
 * - Ctrl-C (SIGINT) aborts an AbortController; the library's long runs check its signal and
 *   throw AbortedError, so a command stops before it writes any file (and files.ts writes
 *   atomically, so none is ever half-written). A second Ctrl-C exits at once with status 130
 *   (128 + SIGINT, the shell convention).
 *
 * Node runs a signal handler on its event loop. A solve running synchronously on the main thread
 * therefore sees the signal only once it returns; the command must check `signal.aborted` (or
 * pass `signal` on to the next library call) before writing. To stop a long solve at once, run
 * it in a worker thread (`solveBatch` of `eigenframe/node`, which takes the same `signal`,
 * terminates its workers on abort, and forwards the solver's phases via `onVariantProgress`).
 * A command that computes and writes in one synchronous run should pass `signals: null`: an
 * installed handler would only delay Ctrl-C until the end, whereas without one Ctrl-C ends the
 * process at once and files.ts' atomic writes still leave no partial output. The progress line
 * works either way (writes to a terminal are synchronous in Node on Linux and macOS).
 */
import { AbortedError } from '../errors';

/** The stream the display is drawn on (process.stderr, or a fake in tests). */
export interface ProgressStream {
  /** True when the stream is a terminal; anything else means no display. */
  readonly isTTY?: boolean;
  /** Terminal width in characters, when known. */
  readonly columns?: number;
  write(text: string): unknown;
}

/** Where SIGINT comes from and how the process exits (process itself, or fakes in tests). */
export interface SignalSource {
  on(event: 'SIGINT', listener: () => void): unknown;
  off(event: 'SIGINT', listener: () => void): unknown;
}

/** Options of {@link createProgress}. */
export interface ProgressOptions {
  /** Smallest time between two redraws, ms (a phase change or 100 % always redraws). @defaultValue 100 */
  interval?: number;
  /** Clock, ms. @defaultValue performance.now */
  now?: () => number;
  /** Source of SIGINT; null installs no handler. @defaultValue process */
  signals?: SignalSource | null;
  /** Called on a second SIGINT. @defaultValue process.exit(130) */
  exit?: (status: number) => void;
}

/** Defaults of {@link ProgressOptions} with a fixed value. */
export const PROGRESS_DEFAULTS = { interval: 100 } as const;

/** Exit status on a second Ctrl-C: 128 + signal number 2 (shell convention). */
export const INTERRUPT_EXIT_STATUS = 130;

/** What {@link createProgress} returns. */
export interface Progress {
  /** Pass to the library as `onProgress`: phase name and fraction done in [0, 1]. */
  readonly onProgress: (phase: string, fraction: number) => void;
  /** Pass to the library as `signal`; aborted by the first Ctrl-C (reason: an AbortedError). */
  readonly signal: AbortSignal;
  /** Clears the display line and removes the SIGINT handler. Safe to call twice. */
  done(): void;
}

/**
 * Progress display and Ctrl-C handling for one CLI command.
 * @param stream - where the display goes (process.stderr); nothing is drawn unless `isTTY`
 * @param options - see {@link ProgressOptions}; defaults in {@link PROGRESS_DEFAULTS}
 * @returns `{ onProgress, signal, done }`; call `done()` in a `finally` block
 */
export function createProgress(stream: ProgressStream, options: ProgressOptions = {}): Progress {
  const interval = options.interval ?? PROGRESS_DEFAULTS.interval;
  const now = options.now ?? (() => performance.now());
  const signals = options.signals === undefined ? process : options.signals;
  const exit = options.exit ?? ((status: number) => process.exit(status));
  const tty = stream.isTTY === true;
  const start = now();
  const controller = new AbortController();
  let lastDraw = -Infinity;
  let lastPhase = '';
  let drawnWidth = 0;
  let finished = false;

  const clear = (): void => {
    if (drawnWidth > 0) stream.write(`\r${' '.repeat(drawnWidth)}\r`);
    drawnWidth = 0;
  };

  const onProgress = (phase: string, fraction: number): void => {
    if (!tty || finished) return;
    const t = now();
    const f = Number.isFinite(fraction) ? Math.min(1, Math.max(0, fraction)) : 0;
    if (phase === lastPhase && f < 1 && t - lastDraw < interval) return;
    lastDraw = t;
    lastPhase = phase;
    let line = `${phase} ${Math.floor(100 * f).toString().padStart(3)} %  ${((t - start) / 1000).toFixed(1)} s`;
    const width = stream.columns && stream.columns > 1 ? stream.columns - 1 : 79;
    if (line.length > width) line = line.slice(0, width);
    // Pad over a longer previous line so no characters of it remain.
    stream.write(`\r${line.padEnd(drawnWidth)}`);
    drawnWidth = Math.max(drawnWidth, line.length);
  };

  let interrupts = 0;
  const onSigint = (): void => {
    interrupts++;
    if (interrupts === 1) {
      clear();
      stream.write('eigenframe: interrupted; stopping without writing any output (press Ctrl-C again to quit at once)\n');
      controller.abort(new AbortedError('interrupted by Ctrl-C (SIGINT); nothing was written; run the command again to get the results', 'SIGINT'));
    } else {
      exit(INTERRUPT_EXIT_STATUS);
    }
  };
  signals?.on('SIGINT', onSigint);

  return {
    onProgress,
    signal: controller.signal,
    done(): void {
      if (finished) return;
      finished = true;
      if (tty) clear();
      signals?.off('SIGINT', onSigint);
    },
  };
}
