/**
 * `eigenframe sensitivity`: how each member's stiffness and mass move one mode, a ranking of
 * the members, and optionally a what-if re-solve with a member group scaled.
 */
import { ArgumentError } from '../../errors';
import type { CommandSpec, ParsedArgs } from '../args';
import { readText, writeFilesAtomically } from '../files';
import type { CommandOutput } from '../output';
import { parseModel } from '../../model/read';
import { modalAnalysis } from '../../modal/analysis';
import type { ModalAnalysis } from '../../modal/analysis-types';
import { assemble } from '../../model/assemble';
import { eigenvalueSensitivity, groupSensitivity, rankMembers, type ElementSensitivity, type GroupSensitivity, type MemberGroup, type RankBy } from '../../modal/sensitivity';
import { stiffnessScaleFor, whatIf, type StiffnessTargetResult, type WhatIfResult } from '../../modal/whatif';
import { ENGINEERING_CAUTION } from '../../io/caution';
import { significant } from '../../io/number-format';

/** `digits` significant figures; NaN as '-', ±∞ as JavaScript writes them. */
const sig = (v: number, digits = 4): string => (Number.isNaN(v) ? '-' : Number.isFinite(v) ? significant(v, digits) : String(v));

export const SENSITIVITY_SPEC: CommandSpec = {
  name: 'sensitivity',
  summary: 'which members move a mode most, and what scaling a group of them does',
  usage: [
    'sensitivity MODEL.json --mode J [--rank stiffness|efficiency|mass] [--top N] [--json]',
    'sensitivity MODEL.json --mode J --members ID,ID,... | --section NAME   (a member group)',
    'sensitivity MODEL.json --mode J --section NAME --stiffness-scale S [--mass-scale S] [--from F1 --to F2]',
    'sensitivity MODEL.json --mode J --members ID,ID,... --target F [--mass-scale S] [--from F1 --to F2]',
  ],
  positionals: { name: 'model file', max: 1 },
  options: [
    { name: 'mode', kind: 'count', value: 'J', help: 'the mode examined, 1 = lowest (default 1)' },
    { name: 'count', kind: 'count', value: 'N', help: 'modes solved (default max(J, 6), at most the free DOFs)' },
    { name: 'rank', kind: 'string', value: 'BY', help: 'order members by stiffness (dλ per unit stiffness scale, default), efficiency (dλ per kg of material added) or mass' },
    { name: 'top', kind: 'count', value: 'N', help: 'members listed in the text table (default 10)' },
    { name: 'members', kind: 'string', value: 'ID,ID,...', help: 'a member group: these element ids' },
    { name: 'section', kind: 'string', value: 'NAME', help: 'a member group: every element of this section' },
    { name: 'stiffness-scale', kind: 'number', value: 'S', help: 'what-if: multiply the group\'s stiffness by S (> 0) and re-solve' },
    { name: 'mass-scale', kind: 'number', value: 'S', help: 'what-if: multiply the group\'s mass by S (≥ 0) and re-solve' },
    { name: 'target', kind: 'number', value: 'F', help: 'find the factor on the group\'s stiffness that puts the mode at F Hz (re-solves by Newton steps)' },
    { name: 'from', kind: 'number', value: 'F1', help: 'what-if: lower end of a frequency band to keep clear, Hz (with --to)' },
    { name: 'to', kind: 'number', value: 'F2', help: 'what-if: upper end of that band, Hz (with --from)' },
    { name: 'json', kind: 'flag', help: 'print one JSON object instead of the tables' },
    { name: 'output', kind: 'file', value: 'FILE', help: 'write the report to FILE (all or nothing) instead of standard output' },
    { name: 'help', kind: 'flag', help: 'show this help' },
  ],
  notes: [
    'Derivatives are of λ = ω² (rad²/s²) and of f (Hz) with respect to a factor on a member\'s stiffness (as on E) or mass (as on its density), at the current design.',
    'A what-if re-solve reuses the factorization analysis of the original model and matches each new mode to the old one it resembles most (MAC).',
  ],
};

const RANKS: readonly RankBy[] = ['stiffness', 'efficiency', 'mass'];

function table(head: string[], rows: string[][], leftCols = 0): string[] {
  const w = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const fmt = (r: string[]) => r.map((s, c) => (c < leftCols ? s.padEnd(w[c]) : s.padStart(w[c]))).join('  ');
  return [fmt(head), w.map((x) => '-'.repeat(x)).join('  '), ...rows.map(fmt)];
}

/** Runs `sensitivity`; returns the text to print (or write). */
export function runSensitivity(args: ParsedArgs): CommandOutput {
  const o = args.options;
  const path = args.positionals[0];
  if (path === undefined) throw new ArgumentError('no model given; write "eigenframe sensitivity MODEL.json --mode 1"', 'sensitivity');
  const rank = (o.rank === undefined ? 'stiffness' : String(o.rank)) as RankBy;
  if (!RANKS.includes(rank)) throw new ArgumentError(`"${rank}" is not a ranking; use one of ${RANKS.join(', ')}`, '--rank');
  if (o.members !== undefined && o.section !== undefined) throw new ArgumentError('give the group either by --members or by --section, not both', '--section');
  const group: MemberGroup | undefined =
    o.members !== undefined ? { elements: String(o.members).split(',').map((s) => s.trim()).filter((s) => s !== '') } : o.section !== undefined ? { section: String(o.section) } : undefined;
  const targeting = o.target !== undefined;
  if (targeting && o['stiffness-scale'] !== undefined) throw new ArgumentError('the stiffness factor is what --target finds; remove --stiffness-scale or --target', '--target');
  if (targeting && !(Number(o.target) > 0)) throw new ArgumentError(`${o.target} Hz is not a frequency above 0; give the target in Hz`, '--target');
  if (targeting && o.members === undefined && o.section === undefined) throw new ArgumentError('needs a member group to stiffen; add --members ID,... or --section NAME', '--target');
  const scaling = targeting || o['stiffness-scale'] !== undefined || o['mass-scale'] !== undefined;
  if (scaling && !group) throw new ArgumentError('a what-if needs a member group; add --members ID,... or --section NAME', o['stiffness-scale'] !== undefined ? '--stiffness-scale' : '--mass-scale');
  const hasFrom = o.from !== undefined, hasTo = o.to !== undefined;
  if (hasFrom !== hasTo) throw new ArgumentError(`a band needs both ends; add ${hasFrom ? '--to F2' : '--from F1'}`, hasFrom ? '--from' : '--to');
  if (hasFrom && !scaling) throw new ArgumentError('a band is checked by a what-if; add --stiffness-scale or --mass-scale', '--from');
  const band: [number, number] | undefined = hasFrom ? [Number(o.from), Number(o.to)] : undefined;
  if (band && band[0] < 0) throw new ArgumentError(`${band[0]} Hz is negative; give a frequency of 0 or more`, '--from');
  if (band && !(band[1] > band[0])) throw new ArgumentError(`${band[1]} Hz is not above --from ${band[0]} Hz; give F2 > F1`, '--to');
  const stiffnessScale = o['stiffness-scale'] === undefined ? 1 : Number(o['stiffness-scale']);
  const massScale = o['mass-scale'] === undefined ? 1 : Number(o['mass-scale']);
  if (!(stiffnessScale > 0)) throw new ArgumentError(`${stiffnessScale} is not a factor > 0; give e.g. 1.5 for 50 % stiffer`, '--stiffness-scale');
  if (!(massScale >= 0)) throw new ArgumentError(`${massScale} is negative; give a factor of 0 or more`, '--mass-scale');

  const model = parseModel(readText(path, 'model file'), path);
  const mode = o.mode === undefined ? 1 : Number(o.mode);
  const top = o.top === undefined ? 10 : Number(o.top);
  const assembled = assemble(model);
  let count: number;
  if (o.count !== undefined) {
    count = Number(o.count);
    if (count < mode) throw new ArgumentError(`${count} modes do not include mode ${mode}; give --count ${mode} or more`, '--count');
  } else count = Math.max(mode, Math.min(6, assembled.dofs.length));
  let base: ModalAnalysis;
  try {
    base = modalAnalysis(assembled, { count });
  } catch (e) {
    if (e instanceof ArgumentError && e.path === 'count' && o.count === undefined) throw new ArgumentError(e.detail.replace(/^count is \d+/, `mode ${mode} is asked for`), '--mode');
    throw e;
  }
  const [sens] = eigenvalueSensitivity(base.assembled, base.eigen, { modes: [mode] });
  let groupResult: GroupSensitivity | undefined;
  if (group) {
    try {
      [groupResult] = groupSensitivity(model, sens, [group]);
    } catch (e) {
      if (e instanceof ArgumentError) throw new ArgumentError(e.detail, o.section !== undefined ? '--section' : '--members');
      throw e;
    }
  }
  let wi: WhatIfResult | undefined;
  let tuned: StiffnessTargetResult | undefined;
  if (targeting) {
    try {
      tuned = stiffnessScaleFor(base, group!, { mode, frequency: Number(o.target), massScale });
    } catch (e) {
      if (e instanceof ArgumentError && e.path === 'frequency') throw new ArgumentError(e.detail, '--target');
      throw e;
    }
    wi = band ? whatIf(base, [{ group: group!, stiffnessScale: tuned.stiffnessScale, massScale }], { band, symbolic: tuned.result.symbolic }) : tuned.result;
  } else if (scaling) wi = whatIf(base, [{ group: group!, stiffnessScale, massScale }], band ? { band } : {});
  const ranked = rankMembers(sens.elements, rank);

  let text: string;
  if (o.json) {
    const obj = sensitivityJsonObject(model.title ?? '', sens.mode, sens.eigenvalue, sens.frequency, sens.repeated, rank, ranked, groupResult, wi);
    if (tuned) obj.target = { frequency: Number(o.target), stiffnessScale: tuned.stiffnessScale, reached: tuned.frequency, mode: tuned.mode, iterations: tuned.iterations, history: tuned.history };
    text = JSON.stringify(obj, null, 2) + '\n';
  } else {
    const lines: string[] = [];
    if (model.title) lines.push(model.title);
    lines.push(`Mode ${mode}: ${sig(sens.frequency, 5)} Hz (λ = ${sig(sens.eigenvalue, 6)} rad²/s²)${sens.repeated ? '; a repeated frequency: derivatives depend on the chosen shape within its eigenspace' : ''}`);
    lines.push(`Members ranked by ${rank === 'stiffness' ? 'stiffness sensitivity' : rank === 'efficiency' ? 'frequency gained per kg of material added' : 'harm done by their mass'} (${Math.min(top, ranked.length)} of ${ranked.length}):`);
    lines.push('');
    const rows = ranked.slice(0, top).map((e, i) => [String(i + 1), e.element, e.section, sig(e.stiffnessFrequency), sig(e.massFrequency), (100 * e.energyShare).toFixed(1), sig(e.efficiency)]);
    lines.push(...table(['rank', 'element', 'section', 'df/dα Hz', 'df/dβ Hz', 'energy %', 'dλ/kg'], rows, 3));
    lines.push('');
    lines.push('α scales a member\'s stiffness, β its mass; dλ/kg is (dλ/dα + dλ/dβ) / member mass, in rad²/s² per kg.');
    if (groupResult) {
      lines.push('');
      lines.push(`Group "${groupResult.name}" (${groupResult.elements.length} member${groupResult.elements.length === 1 ? '' : 's'}, ${sig(groupResult.memberMass, 5)} kg): df/dα = ${sig(groupResult.stiffnessFrequency)} Hz, df/dβ = ${sig(groupResult.massFrequency)} Hz, ${(100 * groupResult.energyShare).toFixed(1)} % of the mode's strain energy.`);
    }
    if (wi) {
      lines.push('');
      if (tuned) lines.push(`Target: mode ${mode} at ${o.target} Hz needs the stiffness of "${wi.changes[0].name}" × ${Number(tuned.stiffnessScale.toPrecision(6))} (reached ${Number(tuned.frequency.toPrecision(7))} Hz as mode ${tuned.mode} after ${tuned.iterations} re-solve${tuned.iterations === 1 ? '' : 's'}).`);
      lines.push(`What-if: "${wi.changes[0].name}" stiffness × ${Number(wi.changes[0].stiffnessScale.toPrecision(6))}, mass × ${massScale}`);
      const rows2 = wi.comparison.map((c) => [String(c.mode), sig(c.frequency, 5), c.matches ? String(c.matches) : '-', sig(c.before, 5), sig(c.predicted, 5), c.mac.toFixed(3)]);
      lines.push(...table(['mode', 'after Hz', 'was mode', 'before Hz', 'predicted Hz', 'MAC'], rows2));
      if (wi.band) {
        const list = (a: readonly number[]) => (a.length ? `mode${a.length > 1 ? 's' : ''} ${a.join(', ')}` : 'none');
        lines.push(`Band ${wi.band.low}–${wi.band.high} Hz: before ${list(wi.band.before)}; after ${list(wi.band.after)}${wi.band.after.length === 0 ? ' (clear among the modes solved)' : ''}.`);
      }
      lines.push('"predicted" is the first-order estimate from the derivatives; "after" is the re-solve.');
    }
    lines.push(ENGINEERING_CAUTION);
    text = lines.join('\n') + '\n';
  }
  if (o.output !== undefined) {
    writeFilesAtomically([{ path: String(o.output), content: text }]);
    return { stdout: '', stderr: `eigenframe: report written to ${String(o.output)}\n` };
  }
  return { stdout: text, stderr: '' };
}

function sensitivityJsonObject(
  title: string, mode: number, eigenvalue: number, frequency: number, repeated: boolean, rank: RankBy,
  ranked: readonly ElementSensitivity[], group: GroupSensitivity | undefined, wi: WhatIfResult | undefined,
): Record<string, unknown> {
  return {
    format: 'eigenframe-sensitivity/1',
    title,
    mode,
    eigenvalue,
    frequency,
    repeated,
    rankedBy: rank,
    members: ranked.map((e) => ({ ...e, efficiency: Number.isNaN(e.efficiency) ? null : e.efficiency })),
    ...(group ? { group: { ...group, efficiency: Number.isNaN(group.efficiency) ? null : group.efficiency } } : {}),
    ...(wi
      ? {
          whatIf: {
            changes: wi.changes,
            modes: wi.comparison.map((c) => ({ ...c, before: Number.isNaN(c.before) ? null : c.before, predicted: Number.isNaN(c.predicted) ? null : c.predicted })),
            ...(wi.band ? { band: wi.band } : {}),
          },
        }
      : {}),
    caution: ENGINEERING_CAUTION,
  };
}
