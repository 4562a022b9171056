import { describe, expect, it } from 'vitest';
import { parseArgs, commandHelp, type CommandSpec } from '../src/cli/args';
import { frequencyRequest, eigenvalueOf, DEFAULT_COUNT } from '../src/cli/requests';
import { thrown } from './argument-path';

const SPEC: CommandSpec = {
  name: 'demo',
  summary: 'a command for tests',
  usage: ['demo FILE'],
  positionals: { name: 'file', max: 1 },
  options: [
    { name: 'count', kind: 'count', value: 'N', help: 'how many' },
    { name: 'near', kind: 'number', value: 'F', help: 'target' },
    { name: 'json', kind: 'flag', help: 'json' },
  ],
};

describe('command-line parsing', () => {
  it('reads positionals, flags and typed values in either spelling', () => {
    const a = parseArgs(SPEC, ['model.json', '--count', '5', '--near=2.5', '--json']);
    expect(a.positionals).toEqual(['model.json']);
    expect(a.options).toEqual({ count: 5, near: 2.5, json: true });
  });

  it.each([
    [['--count', '0'], '--count', 'out of range'],
    [['--count', '-3'], '--count', '-3 is out of range'],
    [['--count', '2.5'], '--count', 'not a whole number'],
    [['--count', 'ten'], '--count', 'not a whole number'],
    [['--near', 'abc'], '--near', 'not a finite number'],
    [['--count'], '--count', 'needs a value'],
    [['--colour'], '--colour', 'unknown option'],
    [['-c', '3'], '-c', 'two dashes'],
    [['--json=yes'], '--json', 'takes no value'],
    [['--json', '--json'], '--json', 'given twice'],
    [['a.json', 'b.json'], 'b.json', 'at most 1'],
  ])('rejects %j naming %s', (argv, path, fragment) => {
    const e = thrown(() => parseArgs(SPEC, argv));
    expect(e.path).toBe(path);
    expect(e.detail).toContain(fragment);
  });

  it('help lists every option', () => {
    const h = commandHelp(SPEC);
    for (const o of SPEC.options) expect(h).toContain(`--${o.name}`);
  });
});

describe('frequency requests', () => {
  it('converts Hz to eigenvalues λ = (2πf)²', () => {
    // ω = 2πf (definition); f = 1 Hz → λ = 4π².
    expect(eigenvalueOf(1)).toBeCloseTo(4 * Math.PI * Math.PI, 12);
    expect(frequencyRequest({})).toEqual({ count: DEFAULT_COUNT });
    expect(frequencyRequest({ from: 1, to: 2 })).toEqual({ range: [eigenvalueOf(1), eigenvalueOf(2)] });
    expect(frequencyRequest({ near: 3, count: 4 })).toEqual({ count: 4, near: eigenvalueOf(3) });
  });

  it.each([
    [{ from: 1 }, '--from', 'both ends'],
    [{ to: 1 }, '--to', 'both ends'],
    [{ from: 2, to: 1 }, '--to', 'not above'],
    [{ from: -1, to: 1 }, '--from', 'negative'],
    [{ from: 1, to: 2, count: 3 }, '--count', 'window'],
    [{ from: 1, to: 2, near: 3 }, '--near', 'cannot be combined'],
    [{ near: -2 }, '--near', 'negative'],
  ])('rejects %j naming %s', (o, path, fragment) => {
    const e = thrown(() => frequencyRequest(o));
    expect(e.path).toBe(path);
    expect(e.detail).toContain(fragment);
  });
});
