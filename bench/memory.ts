/**
 * Peak resident memory of this process. The whole-process peak is getrusage's maxRSS; the peak
 * of one phase is Linux's VmHWM after resetting it (writing "5" to /proc/self/clear_refs resets
 * the high-water mark to the current RSS, Linux ≥ 4.0, proc(5)).
 */
import { readFileSync, writeFileSync } from 'node:fs';

/** Peak RSS of this process so far, MiB (process.resourceUsage().maxRSS is in KiB). */
export function processPeakMiB(): number {
  return process.resourceUsage().maxRSS / 1024;
}

/** Resets the high-water mark to the current RSS; false when the system does not allow it. */
export function resetPeak(): boolean {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
    return true;
  } catch {
    return false;
  }
}

/** VmHWM (peak RSS since the last reset), MiB; NaN when /proc is unavailable. */
export function highWaterMiB(): number {
  try {
    const m = /VmHWM:\s+(\d+)\s+kB/.exec(readFileSync('/proc/self/status', 'utf8'));
    return m ? Number(m[1]) / 1024 : Number.NaN;
  } catch {
    return Number.NaN;
  }
}
