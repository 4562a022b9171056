/**
 * Modal damping ratios ζⱼ for response by modal superposition (classical damping: the modes of
 * the undamped structure uncouple the damped equations).
 *
 * - constant: one ratio for every mode;
 * - modal: one ratio per mode, as given;
 * - Rayleigh: C = αM + βK, so ζ(ω) = α/(2ω) + βω/2 (Chopra, Dynamics of Structures, §11.4.1, section number from memory);
 *   α and β from two frequencies and the ratios wanted there ({@link rayleighDamping}).
 */
import { ArgumentError } from '../errors';

/** Damping of the modes. Ratios are fractions of critical (0.02 = 2 %). */
export type Damping =
  | { readonly kind: 'constant'; readonly ratio: number }
  | { readonly kind: 'modal'; readonly ratios: ArrayLike<number> }
  | { readonly kind: 'rayleigh'; readonly alpha: number; readonly beta: number };

/**
 * Rayleigh coefficients that give ratio ζ₁ at f₁ and ζ₂ at f₂ (Chopra §11.4.1, the two
 * equations ζᵢ = α/(2ωᵢ) + βωᵢ/2 solved for α, β):
 *   α = 2ω₁ω₂(ζ₁ω₂ − ζ₂ω₁)/(ω₂² − ω₁²),  β = 2(ζ₂ω₂ − ζ₁ω₁)/(ω₂² − ω₁²).
 * @param f1 - first frequency, Hz, > 0
 * @param zeta1 - ratio at f1, ≥ 0
 * @param f2 - second frequency, Hz, > f1
 * @param zeta2 - ratio at f2, ≥ 0
 * @returns α in 1/s and β in s
 * @throws ArgumentError (path `f1`, `f2`, `zeta1`, `zeta2`) for values out of range, or (path
 *   `zeta2`) when the pair needs a negative α or β (a ratio that falls too fast with frequency)
 */
export function rayleighDamping(f1: number, zeta1: number, f2: number, zeta2: number): Damping & { kind: 'rayleigh' } {
  if (!(f1 > 0) || !Number.isFinite(f1)) throw new ArgumentError(`${f1} Hz is not a positive frequency`, 'f1');
  if (!(f2 > f1) || !Number.isFinite(f2)) throw new ArgumentError(`${f2} Hz is not above f1 = ${f1} Hz; give two different frequencies, lower first`, 'f2');
  checkRatio(zeta1, 'zeta1');
  checkRatio(zeta2, 'zeta2');
  const w1 = 2 * Math.PI * f1;
  const w2 = 2 * Math.PI * f2;
  const d = w2 * w2 - w1 * w1;
  const alpha = (2 * w1 * w2 * (zeta1 * w2 - zeta2 * w1)) / d;
  const beta = (2 * (zeta2 * w2 - zeta1 * w1)) / d;
  if (alpha < 0 || beta < 0) {
    throw new ArgumentError(
      `ratios ${zeta1} at ${f1} Hz and ${zeta2} at ${f2} Hz need α = ${alpha.toPrecision(3)}, β = ${beta.toPrecision(3)}; a negative coefficient gives negative damping elsewhere, choose ratios closer together`,
      'zeta2',
    );
  }
  return { kind: 'rayleigh', alpha, beta };
}

function checkRatio(z: number, path: string): void {
  if (!(z >= 0 && z < 1) || !Number.isFinite(z)) {
    throw new ArgumentError(`damping ratio ${z} is not in [0, 1); give a fraction of critical damping such as 0.02 for 2 %`, path);
  }
}

/**
 * Damping ratio of each mode.
 * @param damping - see {@link Damping}
 * @param angular - ω of the modes, rad/s, length m (> 0 for Rayleigh damping with α > 0)
 * @returns ζⱼ, length m, each in [0, 1)
 * @throws ArgumentError (path `damping.ratio`, `damping.ratios[j]`, `damping.alpha`, `damping.beta`)
 *   for negative or non-finite values, ratios of 1 or more (over-critical: the formulas of the
 *   response assume underdamped modes), or a `modal` list shorter than the modes; (path
 *   `modes[j]`) when Rayleigh damping gives mode j a ratio ≥ 1
 */
export function dampingRatios(damping: Damping, angular: ArrayLike<number>): Float64Array {
  const m = angular.length;
  const out = new Float64Array(m);
  switch (damping.kind) {
    case 'constant':
      checkRatio(damping.ratio, 'damping.ratio');
      out.fill(damping.ratio);
      break;
    case 'modal': {
      if (damping.ratios.length < m) {
        throw new ArgumentError(`${damping.ratios.length} ratios given for ${m} modes; give one ratio per mode used`, 'damping.ratios');
      }
      for (let j = 0; j < m; j++) {
        checkRatio(damping.ratios[j], `damping.ratios[${j}]`);
        out[j] = damping.ratios[j];
      }
      break;
    }
    case 'rayleigh': {
      const { alpha, beta } = damping;
      if (!(alpha >= 0) || !Number.isFinite(alpha)) throw new ArgumentError(`α = ${alpha} 1/s is not a finite number ≥ 0`, 'damping.alpha');
      if (!(beta >= 0) || !Number.isFinite(beta)) throw new ArgumentError(`β = ${beta} s is not a finite number ≥ 0`, 'damping.beta');
      for (let j = 0; j < m; j++) {
        const w = angular[j];
        const z = (w > 0 ? alpha / (2 * w) : alpha > 0 ? Infinity : 0) + (beta * w) / 2;
        if (!(z < 1)) {
          throw new ArgumentError(`Rayleigh damping gives ratio ${z.toPrecision(3)} at ω = ${w.toPrecision(4)} rad/s (over-critical); reduce α or β, or leave this mode out`, `modes[${j}]`);
        }
        out[j] = z;
      }
      break;
    }
    default:
      throw new ArgumentError(`kind "${String((damping as { kind?: unknown }).kind)}" is not a damping kind; use constant, modal or rayleigh`, 'damping.kind');
  }
  return out;
}
