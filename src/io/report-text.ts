/**
 * Plain-text report of a modal analysis: a table a person reads in a terminal.
 */
import type { EigenResult } from '../eigen/types';
import type { Direction, ModalAnalysis } from '../modal/analysis-types';
import { ENGINEERING_CAUTION } from './caution';
import { sig } from './number-format';

const TRANSLATIONS: readonly Direction[] = ['ux', 'uy', 'uz'];

/** A share (0..1) as a percentage with one decimal, "-" when absent. */
function pct(v: number | undefined): string {
  return v === undefined ? '-' : (100 * v).toFixed(1);
}

/** The modes table with header, verification line and the engineering caution. */
export function formatModesText(result: ModalAnalysis): string {
  const { assembled, eigen } = result;
  const dirs = result.directions.filter((d) => TRANSLATIONS.includes(d));
  const lines: string[] = [];
  if (result.title) lines.push(result.title);
  const massKind = assembled.model.mass ?? 'consistent';
  lines.push(
    `${assembled.dofs.length} free DOFs, ${assembled.model.nodes.length} nodes, ${assembled.model.elements.length} elements, ${massKind} mass; solver: ${eigen.method}`,
  );
  lines.push('');
  const head1 = ['mode', 'frequency', 'period', 'angular'];
  const head2 = ['', 'Hz', 's', 'rad/s'];
  for (const d of dirs) {
    head1.push(`${d} mass`, `${d} cum.`);
    head2.push('%', '%');
  }
  const rows: string[][] = result.modes.map((m) => {
    const r = [String(m.mode), sig(m.frequency, 5), Number.isFinite(m.period) ? sig(m.period, 4) : 'rigid', sig(m.angularFrequency, 5)];
    for (const d of dirs) r.push(pct(m.effectiveMassRatio[d]), pct(m.cumulativeRatio[d]));
    return r;
  });
  const widths = head1.map((h, c) => Math.max(h.length, head2[c].length, ...rows.map((r) => r[c].length)));
  const fmt = (r: string[]) => r.map((s, c) => s.padStart(widths[c])).join('  ');
  lines.push(fmt(head1), fmt(head2), widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) lines.push(fmt(r));
  lines.push('');
  const total = dirs.map((d) => `${d} ${sig(result.totalMass[d] ?? 0, 5)} kg`).join(', ');
  lines.push(`Total participating mass: ${total}. Rotational participation is in the --json output.`);
  const maxRes = eigen.residuals.reduce((a, b) => Math.max(a, b), 0);
  const checks = [`largest relative residual ${maxRes.toExponential(1)}`, `M-orthonormality error ${eigen.orthogonalityError.toExponential(1)}`];
  if (eigen.sturm) {
    checks.push(
      eigen.sturm.passed
        ? `Sturm check passed (${eigen.sturm.countBelow} modes below ${sig(Math.sqrt(Math.max(eigen.sturm.shift, 0)) / (2 * Math.PI), 4)} Hz, none missed)`
        : `Sturm check FAILED (${eigen.sturm.countBelow} expected, ${eigen.sturm.returnedBelow} found)`,
    );
  }
  lines.push(`Verification: ${checks.join('; ')}.`);
  lines.push('');
  lines.push(ENGINEERING_CAUTION);
  return lines.join('\n') + '\n';
}

/** Table of a bare K, M pair's modes (no model, so no participation). */
export function formatMatrixModesText(eigen: EigenResult): string {
  const head = ['mode', 'eigenvalue', 'frequency', 'period', 'residual'];
  const units = ['', 'rad²/s²', 'Hz', 's', ''];
  const rows = Array.from(eigen.eigenvalues, (lambda, j) => {
    const f = Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI);
    return [String(j + 1), lambda.toExponential(6), sig(f, 6), f > 0 ? sig(1 / f, 4) : 'rigid', eigen.residuals[j].toExponential(1)];
  });
  const widths = head.map((h, c) => Math.max(h.length, units[c].length, ...rows.map((r) => r[c].length)));
  const fmt = (r: string[]) => r.map((s, c) => s.padStart(widths[c])).join('  ');
  const lines = [`${eigen.n} DOFs; solver: ${eigen.method}`, '', fmt(head), fmt(units), widths.map((w) => '-'.repeat(w)).join('  ')];
  for (const r of rows) lines.push(fmt(r));
  lines.push('');
  const checks = [`M-orthonormality error ${eigen.orthogonalityError.toExponential(1)}`];
  if (eigen.sturm) checks.push(eigen.sturm.passed ? `Sturm check passed (${eigen.sturm.countBelow} eigenvalues below ${eigen.sturm.shift.toExponential(3)})` : 'Sturm check FAILED');
  lines.push(`Verification: ${checks.join('; ')}.`);
  return lines.join('\n') + '\n';
}
