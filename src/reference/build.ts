/**
 * Builders of the straight-line models the reference cases use: n equal elements along one
 * axis, node ids `n0 … nN`, element ids `e1 … eN`.
 */
import { ArgumentError } from '../errors';
import type { DofName, ElementKind, MassSpec, MaterialSpec, Model, NodeSpec, SectionSpec, Space, SupportSpec } from '../model/types';

/** Checks a mesh argument: a whole number ≥ 1. */
export function checkMesh(mesh: number): void {
  if (!Number.isInteger(mesh) || mesh < 1) {
    throw new ArgumentError(`mesh is ${mesh}; give a whole number of elements ≥ 1`, 'mesh');
  }
}

/** Inputs of `lineModel`. */
export interface LineModelSpec {
  readonly title: string;
  readonly space: Space;
  readonly kind: ElementKind;
  readonly material: MaterialSpec;
  readonly section: SectionSpec;
  /** Total length, m. */
  readonly length: number;
  /** Number of elements, ≥ 1. */
  readonly elements: number;
  /** Global axis the line runs along, from the origin. */
  readonly axis: 'x' | 'y' | 'z';
  /** Supported DOFs of node i of 0…elements (omit or return [] for none). */
  readonly supports: (i: number, last: number) => DofName[];
  /** Point masses. */
  readonly masses?: MassSpec[];
  /** Space only: orientation vector of every element. */
  readonly orientation?: [number, number, number];
}

/** A straight line of `elements` equal members along `axis`, eigenframe-model/1. */
export function lineModel(spec: LineModelSpec): Model {
  checkMesh(spec.elements);
  const n = spec.elements;
  const nodes: NodeSpec[] = [];
  for (let i = 0; i <= n; i++) {
    // i·L/n, exact at both ends.
    const s = i === n ? spec.length : (i * spec.length) / n;
    const node: NodeSpec = { id: `n${i}`, x: spec.axis === 'x' ? s : 0, y: spec.axis === 'y' ? s : 0 };
    if (spec.space === 'space') node.z = spec.axis === 'z' ? s : 0;
    nodes.push(node);
  }
  const elements = [];
  for (let e = 1; e <= n; e++) {
    const el: Model['elements'][number] = { id: `e${e}`, kind: spec.kind, nodes: [`n${e - 1}`, `n${e}`], material: 'material', section: 'section' };
    if (spec.orientation) el.orientation = [...spec.orientation];
    elements.push(el);
  }
  const supports: SupportSpec[] = [];
  for (let i = 0; i <= n; i++) {
    const fixed = spec.supports(i, n);
    if (fixed.length) supports.push({ node: `n${i}`, fixed: [...fixed] });
  }
  const model: Model = {
    format: 'eigenframe-model/1',
    title: spec.title,
    space: spec.space,
    mass: 'consistent',
    materials: { material: { ...spec.material } },
    sections: { section: { ...spec.section } },
    nodes,
    elements,
    supports,
  };
  if (spec.masses?.length) model.masses = spec.masses.map((m) => ({ ...m }));
  return model;
}
