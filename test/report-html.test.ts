/** HTML report (src/io/report-html.ts) and `eigenframe report` (src/cli/commands/report.ts). */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from '../src/cli/args';
import { REPORT_SPEC, runReport } from '../src/cli/commands/report';
import { ArgumentError } from '../src/errors';
import { ENGINEERING_CAUTION } from '../src/io/caution';
import { htmlReport } from '../src/io/report-html';
import { modalAnalysis } from '../src/modal/analysis';
import { bucklingAnalysis } from '../src/modal/buckling';
import { parseModel, validateModel } from '../src/model/read';
import { findAll, parseXml, textOf, type XmlElement } from './svg-helpers';

const VOID = ['meta', 'link', 'br', 'hr', 'img', 'input'];
const dir = mkdtempSync(join(tmpdir(), 'eigenframe-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Invented demo portal in the plane: 2 columns and a girder, 3 elements each. */
const MODEL = {
  format: 'eigenframe-model/1', title: 'Demo portal & <frame>', space: 'plane',
  materials: { steel: { E: 2.1e11, density: 7850 } },
  sections: { col: { A: 5e-3, Iz: 8e-6 }, gir: { A: 6e-3, Iz: 2.5e-5 } },
  nodes: [
    { id: 'A', x: 0, y: 0 }, { id: 'a1', x: 0, y: 1.5 }, { id: 'a2', x: 0, y: 3 }, { id: 'B', x: 0, y: 4.5 },
    { id: 'b1', x: 2, y: 4.5 }, { id: 'b2', x: 4, y: 4.5 }, { id: 'C', x: 6, y: 4.5 },
    { id: 'c1', x: 6, y: 3 }, { id: 'c2', x: 6, y: 1.5 }, { id: 'D', x: 6, y: 0 },
  ],
  elements: [
    ['A', 'a1', 'col'], ['a1', 'a2', 'col'], ['a2', 'B', 'col'], ['B', 'b1', 'gir'], ['b1', 'b2', 'gir'], ['b2', 'C', 'gir'],
    ['C', 'c1', 'col'], ['c1', 'c2', 'col'], ['c2', 'D', 'col'],
  ].map(([a, b, s], i) => ({ id: `e${i + 1}`, kind: 'beam', nodes: [a, b], material: 'steel', section: s })),
  supports: [{ node: 'A', fixed: ['ux', 'uy', 'rz'] }, { node: 'D', fixed: ['ux', 'uy', 'rz'] }],
  masses: [{ node: 'b1', mass: 150 }, { node: 'b2', mass: 150 }],
};

function sectionOf(doc: XmlElement, id: string): XmlElement {
  const s = findAll(doc, (e) => e.name === 'section' && e.attrs.id === id);
  expect(s).toHaveLength(1);
  return s[0];
}

describe('htmlReport', () => {
  const model = validateModel(JSON.parse(JSON.stringify(MODEL)));
  const analysis = modalAnalysis(model, { count: 5 });

  it('is one well-formed document with title, sections, caution, modes table and one picture per mode', () => {
    const html = htmlReport(analysis);
    expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    const doc = parseXml(html.replace(/^<!DOCTYPE html>\n/, ''), VOID);
    expect(doc.name).toBe('html');
    const title = findAll(doc, (e) => e.name === 'title' && !findAll(doc, (s) => s.name === 'svg').some((s) => findAll(s, (x) => x === e).length))[0];
    expect(title.text).toBe('Demo portal & <frame>');
    expect(findAll(doc, (e) => e.name === 'h1')[0].text).toBe('Demo portal & <frame>');
    const h2 = findAll(doc, (e) => e.name === 'h2').map((e) => e.text);
    expect(h2).toEqual(['Model', 'Modes', 'Cumulative effective mass', 'Mode shapes', 'Verification']);
    expect(textOf(doc)).toContain(ENGINEERING_CAUTION);
    // modes table: header + one row per mode, frequencies as computed
    const table = findAll(sectionOf(doc, 'modes'), (e) => e.name === 'table')[0];
    const rows = findAll(table, (e) => e.name === 'tr');
    expect(rows).toHaveLength(1 + 5);
    const head = findAll(rows[0], (e) => e.name === 'th').map((e) => e.text);
    expect(head.slice(0, 2)).toEqual(['mode', 'frequency (Hz)']);
    expect(head).toContain('ux mass (%)');
    rows.slice(1).forEach((r, j) => {
      const cells = findAll(r, (e) => e.name === 'td').map((e) => e.text);
      expect(Number(cells[0])).toBe(j + 1);
      expect(Math.abs(Number(cells[1]) / analysis.modes[j].frequency - 1)).toBeLessThan(1e-4);
      expect(Number(cells[4])).toBeCloseTo(100 * (analysis.modes[j].effectiveMassRatio.ux ?? 0), 1);
    });
    // one svg per mode drawn, each inside a figure marked with its mode
    const figs = findAll(sectionOf(doc, 'mode-shapes'), (e) => e.name === 'figure');
    expect(figs.map((f) => Number(f.attrs['data-mode']))).toEqual([1, 2, 3, 4, 5]);
    for (const f of figs) expect(findAll(f, (e) => e.name === 'svg')).toHaveLength(1);
    expect(findAll(sectionOf(doc, 'effective-mass'), (e) => e.name === 'svg')).toHaveLength(1);
    // self-contained: no scripts, no external references
    expect(findAll(doc, (e) => e.name === 'script' || e.name === 'link' || e.name === 'img')).toHaveLength(0);
    expect(html).not.toMatch(/(src|href)="http/);
    // verification figures
    const ver = textOf(sectionOf(doc, 'verification'));
    expect(ver).toContain('Sturm count');
    expect(ver).toContain('passed');
  });

  it('the same input gives the same bytes; options change pictures and title', () => {
    expect(htmlReport(analysis)).toBe(htmlReport(analysis));
    const doc = parseXml(htmlReport(analysis, { shapes: 2, title: 'T' }).replace(/^<!DOCTYPE html>\n/, ''), VOID);
    expect(findAll(sectionOf(doc, 'mode-shapes'), (e) => e.name === 'figure')).toHaveLength(2);
    const none = parseXml(htmlReport(analysis, { shapes: 0 }).replace(/^<!DOCTYPE html>\n/, ''), VOID);
    expect(findAll(none, (e) => e.name === 'section' && e.attrs.id === 'mode-shapes')).toHaveLength(0);
    expect(() => htmlReport(analysis, { shapes: 6 })).toThrowError(ArgumentError);
  });

  it('includes a buckling section with one picture per load factor', () => {
    const bk = bucklingAnalysis(model, [{ node: 'B', dof: 'uy', value: -1000 }, { node: 'C', dof: 'uy', value: -1000 }], { count: 2 });
    const doc = parseXml(htmlReport(analysis, { buckling: bk }).replace(/^<!DOCTYPE html>\n/, ''), VOID);
    const sec = sectionOf(doc, 'buckling');
    const rows = findAll(findAll(sec, (e) => e.name === 'table')[0], (e) => e.name === 'tr');
    expect(rows).toHaveLength(3);
    expect(Number(findAll(rows[1], (e) => e.name === 'td')[1].text) / bk.loadFactors[0]).toBeCloseTo(1, 4);
    expect(findAll(sec, (e) => e.name === 'svg')).toHaveLength(2);
  });
});

describe('eigenframe report', () => {
  const modelPath = join(dir, 'portal.json');
  writeFileSync(modelPath, JSON.stringify(MODEL));
  const run = (...argv: string[]) => runReport(parseArgs(REPORT_SPEC, argv));

  it('writes the report file atomically and says so on standard error', () => {
    const out = join(dir, 'out', 'report.html');
    const r = run(modelPath, '--output', out, '--count', '4', '--load', 'B:uy:-1000,C:uy:-1000', '--load-factors', '2');
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('report written to');
    const html = readFileSync(out, 'utf8');
    const doc = parseXml(html.replace(/^<!DOCTYPE html>\n/, ''), VOID);
    expect(findAll(sectionOf(doc, 'mode-shapes'), (e) => e.name === 'svg')).toHaveLength(4);
    expect(findAll(sectionOf(doc, 'buckling'), (e) => e.name === 'svg')).toHaveLength(2);
    expect(readdirSync(join(dir, 'out')).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    // same as the library on the same model
    const analysis = modalAnalysis(parseModel(readFileSync(modelPath, 'utf8'), modelPath), { count: 4 });
    const f1 = Number(findAll(findAll(sectionOf(doc, 'modes'), (e) => e.name === 'tr')[1], (e) => e.name === 'td')[1].text);
    expect(Math.abs(f1 / analysis.modes[0].frequency - 1)).toBeLessThan(1e-4);
  });

  it('bad input names the option and leaves no file behind', () => {
    const out = join(dir, 'bad.html');
    const cases: [string[], string][] = [
      [[modelPath], '--output'],
      [[modelPath, '--output', out, '--pictures', 'x'], '--pictures'],
      [[modelPath, '--output', out, '--count', '3', '--pictures', '5'], '--pictures'],
      [[modelPath, '--output', out, '--load', 'B:uy'], '--load'],
      [[modelPath, '--output', out, '--load', 'Q:uy:-5'], '--load'],
      [[modelPath, '--output', out, '--load-factors', '2'], '--load-factors'],
    ];
    for (const [argv, path] of cases) {
      try {
        run(...argv);
        throw new Error(`no error for ${argv.join(' ')}`);
      } catch (e) {
        expect(e).toBeInstanceOf(ArgumentError);
        expect((e as ArgumentError).path).toBe(path);
      }
    }
    expect(existsSync(out)).toBe(false);
  });
});
