/**
 * src/node/variant.ts: JSON Merge Patch (IETF RFC 7396), by which solveBatch sends a variant as
 * its difference from the base model each worker holds.
 * Reference: the examples of RFC 7396, Appendix A (target, patch, result), quoted from memory.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyMergePatch, createMergePatch } from '../src/node/variant';

/** Freezes a JSON document all the way down, so that any write to it throws (strict mode). */
function deepFreeze<T>(v: T): T {
  if (typeof v === 'object' && v !== null) {
    for (const child of Object.values(v)) deepFreeze(child);
    Object.freeze(v);
  }
  return v;
}

describe('applyMergePatch', () => {
  // Source: RFC 7396, Appendix A "Example Test Cases" (from memory).
  const cases: Array<[unknown, unknown, unknown]> = [
    [{ a: 'b' }, { a: 'c' }, { a: 'c' }],
    [{ a: 'b' }, { b: 'c' }, { a: 'b', b: 'c' }],
    [{ a: 'b' }, { a: null }, {}],
    [{ a: 'b', b: 'c' }, { a: null }, { b: 'c' }],
    [{ a: ['b'] }, { a: 'c' }, { a: 'c' }],
    [{ a: 'c' }, { a: ['b'] }, { a: ['b'] }],
    [{ a: { b: 'c' } }, { a: { b: 'd', c: null } }, { a: { b: 'd' } }],
    [{ a: [{ b: 'c' }] }, { a: [1] }, { a: [1] }],
    [['a', 'b'], ['c', 'd'], ['c', 'd']],
    [{ a: 'b' }, ['c'], ['c']],
    [{ a: 'foo' }, null, null],
    [{ a: 'foo' }, 'bar', 'bar'],
    [{ e: null }, { a: 1 }, { e: null, a: 1 }],
    [[1, 2], { a: 'b', c: null }, { a: 'b' }],
    [{}, { a: { bb: { ccc: null } } }, { a: { bb: {} } }],
  ];
  it.each(cases)('RFC 7396 appendix A: %j patched with %j is %j', (target, patch, expected) => {
    const t = deepFreeze(structuredClone(target));
    const p = deepFreeze(structuredClone(patch));
    expect(applyMergePatch(t, p)).toEqual(expected);
    // Neither argument modified (frozen: a write would have thrown), and they are unchanged.
    expect(t).toEqual(target);
    expect(p).toEqual(patch);
  });

  it('shares the unchanged members of the target (no copy of the untouched model)', () => {
    const base = { nodes: [{ id: 'a' }], sections: { chord: { A: 1 }, web: { A: 2 } } };
    const out = applyMergePatch(base, { sections: { chord: { A: 3 } } }) as typeof base;
    expect(out.nodes).toBe(base.nodes);
    expect(out.sections.web).toBe(base.sections.web);
    expect(out.sections.chord).toEqual({ A: 3 });
    expect(base.sections.chord).toEqual({ A: 1 });
  });
});

describe('createMergePatch', () => {
  it('gives the small patch of a section change, and it rebuilds the variant', () => {
    const base = { format: 'eigenframe-model/1', nodes: [{ id: 'a', x: 0 }], sections: { chord: { A: 1, Iz: 2 }, web: { A: 2 } }, title: 't' };
    const variant: Omit<typeof base, "title"> & { title?: string } = structuredClone(base);
    variant.sections.chord.A = 1.5;
    delete variant.title;
    const patch = createMergePatch(base, variant);
    expect(patch).toEqual({ sections: { chord: { A: 1.5 } }, title: null });
    expect(applyMergePatch(base, patch)).toEqual(variant);
    expect(createMergePatch(base, structuredClone(base))).toEqual({});
  });

  it('declines what a merge patch cannot say: a null member, a text, a non-JSON value', () => {
    expect(createMergePatch({ a: 1 }, { a: null })).toBeUndefined();
    expect(createMergePatch({ a: 1 }, { b: { c: null } })).toBeUndefined();
    expect(createMergePatch({ a: 1 }, '{"a":2}')).toBeUndefined();
    expect(createMergePatch('{"a":1}', { a: 2 })).toBeUndefined();
    expect(createMergePatch({ a: 1 }, { a: new Float64Array(2) })).toBeUndefined();
    // Nulls inside arrays are data (RFC 7396 replaces arrays whole): fine.
    expect(createMergePatch({ a: [1] }, { a: [null] })).toEqual({ a: [null] });
  });

  it('round trip on random JSON documents: applyMergePatch(base, createMergePatch(base, v)) equals v', () => {
    // Objects of small keys, so that base and variant share members; JSON values inside.
    const key = fc.constantFrom('a', 'b', 'c', 'd');
    const doc = fc.letrec((tie) => ({
      value: fc.oneof({ depthSize: 'small' }, fc.integer(), fc.double({ noNaN: true }), fc.string(), fc.boolean(), fc.constant(null), fc.array(tie('value'), { maxLength: 3 }), tie('object')),
      object: fc.dictionary(key, tie('value'), { maxKeys: 4 }),
    })).object;
    fc.assert(
      fc.property(doc, doc, (base, variant) => {
        const patch = createMergePatch(deepFreeze(structuredClone(base)), variant);
        if (patch === undefined) return; // a null member somewhere outside arrays: sent whole instead
        expect(JSON.parse(JSON.stringify(applyMergePatch(base, patch)))).toEqual(JSON.parse(JSON.stringify(variant)));
      }),
      { numRuns: 300, seed: 7396 },
    );
  });
});
