/**
 * Turns the frequency options of the CLI (Hz) into a solver request (eigenvalues in rad²/s²).
 */
import { ArgumentError } from '../errors';

/** Default number of modes the CLI asks for. */
export const DEFAULT_COUNT = 12;

/** λ = (2πf)², rad²/s², from f in Hz. */
export function eigenvalueOf(frequency: number): number {
  const w = 2 * Math.PI * frequency;
  return w * w;
}

export interface FrequencyRequest {
  count?: number;
  range?: [number, number];
  near?: number;
}

/** Validates --count, --from/--to and --near together. */
export function frequencyRequest(o: Record<string, string | number | boolean>): FrequencyRequest {
  const hasFrom = o.from !== undefined;
  const hasTo = o.to !== undefined;
  if (hasFrom !== hasTo) {
    throw new ArgumentError(`a frequency window needs both ends; add ${hasFrom ? '--to F2' : '--from F1'}`, hasFrom ? '--from' : '--to');
  }
  if (hasFrom) {
    const f1 = Number(o.from);
    const f2 = Number(o.to);
    if (f1 < 0) throw new ArgumentError(`${f1} Hz is negative; give a frequency of 0 or more`, '--from');
    if (!(f2 > f1)) throw new ArgumentError(`${f2} Hz is not above --from ${f1} Hz; give F2 > F1`, '--to');
    if (o.near !== undefined) throw new ArgumentError('cannot be combined with --from/--to; choose a window or a target', '--near');
    if (o.count !== undefined) throw new ArgumentError('a window returns every mode inside it; remove --count or the window', '--count');
    return { range: [eigenvalueOf(f1), eigenvalueOf(f2)] };
  }
  const count = o.count === undefined ? DEFAULT_COUNT : Number(o.count);
  if (o.near !== undefined) {
    const f = Number(o.near);
    if (f < 0) throw new ArgumentError(`${f} Hz is negative; give a frequency of 0 or more`, '--near');
    return { count, near: eigenvalueOf(f) };
  }
  return { count };
}
