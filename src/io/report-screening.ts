/**
 * Reports of a resonance screening (text and JSON). The text carries the engineering caution:
 * screening flags candidates for a response check, it decides neither comfort nor safety.
 */
import type { ScreeningResult } from '../modal/screening';
import { ENGINEERING_CAUTION } from './caution';
import { sig } from './number-format';

/** Note printed under every screening report. */
export const SCREENING_NOTE =
  'Screening compares frequencies with excitation bands; whether a structure is comfortable or safe is decided by the local codes and a licensed engineer, usually with a response calculation.';

function table(head: string[], units: string[], rows: string[][], left: number[] = []): string[] {
  const widths = head.map((h, c) => Math.max(h.length, units[c].length, ...rows.map((r) => r[c].length)));
  const fmt = (r: string[]): string => r.map((s, c) => (left.includes(c) ? s.padEnd(widths[c]) : s.padStart(widths[c]))).join('  ').trimEnd();
  return [fmt(head), fmt(units), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(fmt)];
}

const VERDICT_TEXT = { 'in-band': 'IN BAND', 'near-band': 'near band', clear: 'clear' } as const;

/** Plain-text screening report: bands, a table of the modes, the findings, coverage, caution. */
export function formatScreeningText(result: ScreeningResult): string {
  const lines: string[] = [];
  if (result.title) lines.push(result.title);
  lines.push(
    `Resonance screening of ${result.modes.length} modes against ${result.bands.length} band${result.bands.length === 1 ? '' : 's'} ` +
      `(clearance ${sig(100 * result.clearance, 3)} % of the band edge; a mode counts in a direction from ${sig(100 * result.directionShare, 3)} % of its kinetic energy)`,
  );
  const ax = result.axes;
  const v3 = (v: readonly number[]): string => `(${v.map((x) => (Math.abs(x) < 5e-13 ? 0 : x).toFixed(3)).join(', ')})`;
  lines.push(
    ax.lateral
      ? `Axes: vertical ${v3(ax.vertical)}, longitudinal ${v3(ax.longitudinal)}, lateral ${v3(ax.lateral)}; torsion about the ${ax.torsionAxis} axis.`
      : `Axes: vertical ${v3(ax.vertical)}, longitudinal ${v3(ax.longitudinal)} (plane model: no lateral or torsional motion).`,
  );
  lines.push('');
  lines.push('Bands:');
  lines.push(
    ...table(
      ['band', 'from', 'to', 'excites'],
      ['', 'Hz', 'Hz', ''],
      result.bands.map((b) => [b.name, sig(b.fLow), sig(b.fHigh), b.directions.join('+')]),
      [0, 3],
    ).map((l) => `  ${l}`),
  );
  lines.push('Sources:');
  for (const b of result.bands) lines.push(`  ${b.name}: ${b.source}${b.fromMemory ? ' (from memory)' : ''}.`);
  lines.push('');
  const rows = result.modes.map((m) => [
    String(m.mode),
    sig(m.frequency, 5),
    m.direction,
    (100 * m.shares.vertical).toFixed(0),
    (100 * m.shares.lateral).toFixed(0),
    (100 * m.shares.longitudinal).toFixed(0),
    (100 * m.shares.torsional).toFixed(0),
    VERDICT_TEXT[m.verdict],
    m.checks.map((c) => c.band).join(', '),
  ]);
  lines.push(
    ...table(
      ['mode', 'frequency', 'direction', 'vert', 'lat', 'long', 'tors', 'verdict', 'bands'],
      ['', 'Hz', '', '%', '%', '%', '%', '', ''],
      rows,
      [2, 7, 8],
    ),
  );
  lines.push('(vert, lat, long, tors: kinetic energy shares of the mode.)');
  lines.push('');
  const findings = result.modes.flatMap((m) =>
    m.checks.map((c) => {
      const where = c.status === 'inside' ? `inside "${c.band}", ${sig(-c.marginHz, 3)} Hz (${sig(-c.marginPercent, 3)} %) from its nearest edge` : `near "${c.band}", ${sig(c.marginHz, 3)} Hz (${sig(c.marginPercent, 3)} %) outside it`;
      const alt = c.targetBelow !== null ? ` (or ≤ ${sig(c.targetBelow)} Hz)` : '';
      return `  mode ${m.mode} (${sig(m.frequency, 4)} Hz, ${c.directions.join('+')}): ${where}; clears at ${c.target === c.targetAbove ? '≥' : '≤'} ${sig(c.target)} Hz${c.target === c.targetAbove ? alt : ` (or ≥ ${sig(c.targetAbove)} Hz)`}, stiffness × ${sig(c.stiffnessFactor, 3)} with the mass unchanged.`;
    }),
  );
  lines.push(findings.length ? 'Findings:' : 'Findings: no mode lies in or near a band it is excited by.');
  lines.push(...findings);
  lines.push('');
  const cov = result.coverage;
  lines.push(
    cov.complete
      ? `Coverage: every mode up to ${sig(cov.coveredFrequency)} Hz was computed; the bands need ${sig(cov.requiredFrequency)} Hz.`
      : `Coverage INCOMPLETE: modes are known up to ${sig(cov.coveredFrequency)} Hz but the bands reach ${sig(cov.requiredFrequency)} Hz; compute more modes before trusting a "clear".`,
  );
  lines.push(`Verdict: ${VERDICT_TEXT[result.verdict]}${cov.complete ? '' : ' (over the modes computed)'}.`);
  if (result.bands.some((b) => b.fromMemory)) lines.push('Bands marked (from memory) carry recalled numbers: check them against the guidance that governs the project.');
  lines.push('');
  lines.push(SCREENING_NOTE);
  lines.push(ENGINEERING_CAUTION);
  return lines.join('\n') + '\n';
}

function finite(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

/** JSON object of a screening (infinite numbers become null); `caution` carries the caution. */
export function screeningJsonObject(result: ScreeningResult): Record<string, unknown> {
  return {
    format: 'eigenframe-screening/1',
    title: result.title,
    verdict: result.verdict,
    clearance: result.clearance,
    directionShare: result.directionShare,
    axes: result.axes,
    coverage: result.coverage,
    bands: result.bands,
    modes: result.modes.map((m) => ({
      mode: m.mode,
      frequency: m.frequency,
      direction: m.direction,
      shares: m.shares,
      massRatios: m.massRatios,
      verdict: m.verdict,
      checks: m.checks.map((c) => ({ ...c, marginPercent: finite(c.marginPercent), stiffnessFactor: finite(c.stiffnessFactor) })),
    })),
    note: SCREENING_NOTE,
    caution: ENGINEERING_CAUTION,
  };
}
