/**
 * Reports of responses by modal superposition: a harmonic sweep and a walker at an antinode
 * (text and JSON). The text carries the engineering caution.
 */
import type { HarmonicResult } from '../modal/harmonic';
import type { PedestrianResult } from '../modal/harmonic-pedestrian';
import { ENGINEERING_CAUTION } from './caution';
import { sig } from './number-format';

/** What the sweep was asked for, for the report header. */
export interface SweepDescription {
  readonly title: string;
  /** e.g. `1 N at node m3 uz`. */
  readonly load: string;
}

/** Table of a harmonic sweep: one block per response DOF; peak line; caution. */
export function formatHarmonicText(result: HarmonicResult, about: SweepDescription): string {
  const lines: string[] = [];
  if (about.title) lines.push(about.title);
  const z = result.dampingRatios;
  const zMin = Math.min(...z);
  const zMax = Math.max(...z);
  lines.push(
    `Steady harmonic response to ${about.load}, by superposition of ${result.modesUsed} modes, damping ${zMin === zMax ? `${sig(100 * zMin, 3)} %` : `${sig(100 * zMin, 3)}–${sig(100 * zMax, 3)} %`} of critical.`,
  );
  lines.push('Amplitudes of u(t) = |U| cos(Ωt + phase); phase relative to the load, degrees.');
  for (const r of result.responses) {
    lines.push('');
    lines.push(`Node ${r.node}, ${r.name}:`);
    const rot = r.name.startsWith('r');
    const head = ['frequency', 'displacement', 'velocity', 'acceleration', 'phase'];
    const units = ['Hz', rot ? 'rad' : 'm', rot ? 'rad/s' : 'm/s', rot ? 'rad/s²' : 'm/s²', 'deg'];
    const rows = Array.from(result.frequencies, (f, k) => [sig(f, 5), sig(r.displacement[k]), sig(r.velocity[k]), sig(r.acceleration[k]), ((r.phase[k] * 180) / Math.PI).toFixed(1)]);
    const w = head.map((h, c) => Math.max(h.length, units[c].length, ...rows.map((x) => x[c].length)));
    const fmt = (x: string[]): string => x.map((s, c) => s.padStart(w[c])).join('  ');
    lines.push(fmt(head), fmt(units), w.map((n) => '-'.repeat(n)).join('  '), ...rows.map(fmt));
    let kp = 0;
    for (let k = 1; k < r.displacement.length; k++) if (r.displacement[k] > r.displacement[kp]) kp = k;
    lines.push(`Largest displacement ${sig(r.displacement[kp])} at ${sig(result.frequencies[kp], 5)} Hz; largest acceleration ${sig(Math.max(...r.acceleration))}.`);
  }
  lines.push('');
  lines.push(ENGINEERING_CAUTION);
  return lines.join('\n') + '\n';
}

/** JSON object of a sweep. */
export function harmonicJsonObject(result: HarmonicResult, about: SweepDescription): Record<string, unknown> {
  return {
    format: 'eigenframe-harmonic/1',
    title: about.title,
    load: about.load,
    modesUsed: result.modesUsed,
    dampingRatios: Array.from(result.dampingRatios),
    frequencies: Array.from(result.frequencies),
    responses: result.responses.map((r) => ({
      node: r.node,
      dof: r.name,
      index: r.dof,
      displacement: Array.from(r.displacement),
      velocity: Array.from(r.velocity),
      acceleration: Array.from(r.acceleration),
      phase: Array.from(r.phase),
    })),
    caution: ENGINEERING_CAUTION,
  };
}

/** Text of a walker-at-antinode check. */
export function formatPedestrianText(r: PedestrianResult, title: string): string {
  const lines: string[] = [];
  if (title) lines.push(title);
  lines.push(`Walker on mode ${r.mode} (${sig(r.modeFrequency, 4)} Hz, ${r.direction}): ${sig(r.force, 4)} N at ${sig(r.frequency, 4)} Hz applied at node ${r.node}, ${r.dofName} (the antinode).`);
  lines.push(`Damping of the mode ${sig(100 * r.dampingRatio, 3)} %; steady acceleration amplitude there ${sig(r.acceleration, 4)} m/s²${r.singleModeAcceleration !== null ? ` (single-mode estimate F·φ²/(2ζ) = ${sig(r.singleModeAcceleration, 4)} m/s²)` : ''}.`);
  if (r.comfortLimit !== null) {
    lines.push(`Against the limit of ${sig(r.comfortLimit, 3)} m/s² you gave: ${r.verdict === 'within-limit' ? 'within the limit' : 'EXCEEDS the limit'}.`);
  }
  for (const w of r.warnings) lines.push(`Warning: ${w}.`);
  lines.push('One walker in steady resonance, force from the single-pedestrian amplitudes of the Sétra 2006 guide (recalled from memory); crowds, lock-in and the reduction factors of the guidance are not modelled.');
  lines.push('');
  lines.push(ENGINEERING_CAUTION);
  return lines.join('\n') + '\n';
}

/** JSON object of a walker check. */
export function pedestrianJsonObject(r: PedestrianResult, title: string): Record<string, unknown> {
  return { format: 'eigenframe-walker/1', title, ...r, caution: ENGINEERING_CAUTION };
}
