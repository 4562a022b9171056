/**
 * Reading and validation of `eigenframe-model/1` JSON (see docs/model-format.md).
 *
 * Every problem is a ModelError whose `path` is the JSON path of the offending item
 * (`elements[3].section`, `nodes[2].x`, `materials.steel.E`) — or `source:line:column` for a
 * JSON syntax error — and whose message names the item by id and says what would fix it.
 * Validation returns a fresh, normalised Model and never modifies its input.
 *
 * Unknown properties are errors at every level (a misspelt "Iy" or "supports" would otherwise
 * be ignored silently and change the answer); the allowed keys are listed in the message.
 */
import { PARALLEL_TOLERANCE } from '../elements/spaceFrame';
import { ModelError } from '../errors';
import { DOF_NAMES, numberDofs, SPACE_DOFS } from './dofs';
import type { DofName, ElementKind, ElementSpec, MassSpec, MaterialSpec, Model, NodeSpec, SectionSpec, SpringSpec, SupportSpec } from './types';

/** The format string this reader accepts. */
export const MODEL_FORMAT = 'eigenframe-model/1';
/** Element kinds. */
export const ELEMENT_KINDS: readonly ElementKind[] = ['bar', 'beam', 'timoshenko'];
/**
 * Two nodes closer than this fraction of the model's bounding-box diagonal are at the same
 * point; an element shorter than it has zero length.
 */
export const COINCIDENCE_TOLERANCE = 1e-9;

const TOP_KEYS = ['format', 'title', 'space', 'mass', 'materials', 'sections', 'nodes', 'elements', 'supports', 'springs', 'masses'];
const MATERIAL_KEYS = ['E', 'G', 'density'];
const SECTION_KEYS = ['A', 'Iz', 'Iy', 'J', 'Ip', 'kappa'];
const NODE_KEYS = ['id', 'x', 'y', 'z'];
const ELEMENT_KEYS = ['id', 'kind', 'nodes', 'material', 'section', 'orientation'];
const SUPPORT_KEYS = ['node', 'fixed'];
const SPRING_KEYS = ['node', 'to', 'dof', 'stiffness'];
const MASS_KEYS = ['node', 'mass', 'inertia'];

type Obj = Record<string, unknown>;

const fail = (path: string, message: string): never => {
  throw new ModelError(message, path);
};

function describe(v: unknown): string {
  if (typeof v === 'string') return `the string ${JSON.stringify(v)}`;
  if (Array.isArray(v)) return 'an array';
  if (v === null) return 'null';
  if (typeof v === 'object') return 'an object';
  return String(v);
}

function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function checkKeys(o: Obj, allowed: string[], path: string, what: string): void {
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) {
      fail(path === '' ? (IDENTIFIER.test(k) ? k : `[${JSON.stringify(k)}]`) : keyPath(path, k), `${what} has an unknown property ${JSON.stringify(k)}; use only ${allowed.map((a) => `"${a}"`).join(', ')} (check the spelling)`);
    }
  }
}

function obj(v: unknown, path: string, what: string): Obj {
  if (!isObj(v)) fail(path, `${what} is ${describe(v)}; it must be a JSON object {…}`);
  return v as Obj;
}

function arr(v: unknown, path: string, what: string): unknown[] {
  if (!Array.isArray(v)) fail(path, `${what} is ${describe(v)}; it must be a JSON array […]`);
  return v as unknown[];
}

function str(v: unknown, path: string, what: string): string {
  if (typeof v !== 'string' || v.length === 0) {
    fail(path, v === undefined ? `${what} is missing; add it as a non-empty string` : `${what} is ${describe(v)}; it must be a non-empty string`);
  }
  return v as string;
}

/**
 * Physical ranges of the numbers of a model: generous enough that no real structure trips them,
 * tight enough to catch a wrong unit (a value in mm, g or MPa where m, kg or Pa belong) or
 * garbage. The reasoning behind each bound is in docs/model-format.md ("Physical ranges").
 * Lower bounds: E, G, A, Iz, Iy, J, Ip, kappa and spring stiffness > 0; density, point mass
 * and rotary inertia ≥ 0 (a massless member, e.g. a rigid link, has density 0).
 */
export const MODEL_LIMITS = {
  /** Largest E and G, Pa: admits rigid links of E × 1e8 of steel (2.1e19 Pa). */
  modulus: 1e20,
  /** Largest density, kg/m³: 40 × osmium (22,590); a density in g/m³ (steel 7.85e6) is refused. */
  density: 1e6,
  /** Largest section area, m² (a solid 100 m × 100 m block). */
  area: 1e4,
  /** Largest second moment, torsion constant or polar moment, m⁴ (100 m × 100 m block: 8.3e6). */
  inertia: 1e8,
  /** Largest shear correction factor κ (dimensionless; 5/6 for a rectangle, ≈ 0.9 for a circle). */
  kappa: 1.5,
  /** Largest |coordinate|, m (about 1.5 × the Earth's radius). */
  coordinate: 1e7,
} as const;

/** Where a number must lie besides its sign: an upper bound and the fix to suggest beyond it. */
interface Bound {
  /** Largest allowed absolute value (inclusive). */
  max: number;
  /** What would fix a value out of range, e.g. "check the units: E is in Pa (steel ≈ 2.1e11)". */
  fix: string;
}

/**
 * A finite number; `min` "positive" (> 0) or "nonNegative" (≥ 0) or "any"; with `bound`, |value|
 * must also be ≤ bound.max. The message names the value, the allowed range and the fix.
 */
function num(v: unknown, path: string, what: string, unit: string, min: 'positive' | 'nonNegative' | 'any', bound?: Bound): number {
  const base = min === 'positive' ? `a number > 0 (${unit})` : min === 'nonNegative' ? `a number ≥ 0 (${unit})` : `a finite number (${unit})`;
  let need = base;
  if (bound) {
    const max = bound.max >= 1e5 ? bound.max.toExponential() : String(bound.max);
    need += min === 'any' ? ` with |value| ≤ ${max}` : ` and ≤ ${max}`;
  }
  const fix = bound ? `; ${bound.fix}` : '';
  if (v === undefined) fail(path, `${what} is missing; add it as ${need}`);
  if (typeof v === 'string') fail(path, `${what} is ${describe(v)}; write it as ${base}, without quotes`);
  if (typeof v !== 'number') fail(path, `${what} is ${describe(v)}; it must be ${need}`);
  const x = v as number;
  if (!Number.isFinite(x)) fail(path, `${what} is ${x}; it must be ${need}${fix}`);
  if (min === 'positive' && !(x > 0)) fail(path, `${what} is ${x}; it must be ${need}${fix}`);
  if (min === 'nonNegative' && !(x >= 0)) fail(path, `${what} is ${x}; it must be ${need}${fix}`);
  if (bound && Math.abs(x) > bound.max) fail(path, `${what} is ${x}, outside the physical range; it must be ${need}${fix}`);
  return x;
}

function optNum(o: Obj, key: string, path: string, what: string, unit: string, bound?: Bound): number | undefined {
  return o[key] === undefined ? undefined : num(o[key], `${path}.${key}`, what, unit, 'positive', bound);
}

const MODULUS_FIX = (k: 'E' | 'G') =>
  `check the units: ${k} is in Pa (steel ≈ ${k === 'E' ? '2.1e11' : '8.1e10'} Pa, 1 MPa = 1e6 Pa)${k === 'E' ? '; a rigid link needs no more than E × 1e8 of the members it joins' : ''}`;
const BOUNDS = {
  E: { max: MODEL_LIMITS.modulus, fix: MODULUS_FIX('E') },
  G: { max: MODEL_LIMITS.modulus, fix: MODULUS_FIX('G') },
  density: { max: MODEL_LIMITS.density, fix: 'check the units: density is in kg/m³ (steel ≈ 7850), and give non-structural mass as point masses in "masses"' },
  A: { max: MODEL_LIMITS.area, fix: 'check the units: A is in m² (1 cm² = 1e-4 m², 1 mm² = 1e-6 m²)' },
  inertia: (k: string): Bound => ({ max: MODEL_LIMITS.inertia, fix: `check the units: ${k} is in m⁴ (1 cm⁴ = 1e-8 m⁴, 1 mm⁴ = 1e-12 m⁴)` }),
  kappa: { max: MODEL_LIMITS.kappa, fix: 'kappa is the shear correction factor κ (5/6 for a rectangle, ≈ 0.9 for a solid circle, ≈ 0.5 for a thin tube), not its reciprocal' },
  coordinate: { max: MODEL_LIMITS.coordinate, fix: 'check the units: coordinates are in m' },
} as const;

/** A key that can follow a dot in a JSON path; any other key is written `["key"]`. */
const IDENTIFIER = /^[A-Za-z_$][\w$]*$/;

function keyPath(base: string, key: string): string {
  return IDENTIFIER.test(key) ? `${base}.${key}` : `${base}[${JSON.stringify(key)}]`;
}

// ---------------------------------------------------------------------------------------------
// JSON syntax errors: V8's messages do not always carry a position, so a small scanner
// (RFC 8259 grammar) finds the offset of the first error.

/**
 * Offset of the first JSON syntax error in text (text.length when the input ends early; −1
 * when there is none). Iterative, with an explicit stack of open containers, so that deeply
 * nested input (e.g. 100,000 "[") cannot overflow the call stack.
 */
export function jsonErrorOffset(text: string): number {
  const n = text.length;
  let i = 0;
  const open: number[] = []; // 0: inside an array, 1: inside an object
  const ws = () => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  /** Scans the string starting at text[i] === '"'; returns −1, or the offset of its error. */
  const string = (): number => {
    i++;
    while (i < n) {
      const ch = text.charCodeAt(i);
      if (ch === 34) {
        i++;
        return -1;
      }
      if (ch < 32) return i;
      if (ch === 92) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) return i;
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else return i;
      } else i++;
    }
    return n;
  };
  /** Scans `"key" :` at text[i] (after whitespace); returns −1, or the offset of its error. */
  const key = (): number => {
    ws();
    if (text[i] !== '"') return Math.min(i, n);
    const e = string();
    if (e >= 0) return e;
    ws();
    if (text[i] !== ':') return Math.min(i, n);
    i++;
    return -1;
  };
  let expectValue = true;
  for (;;) {
    if (expectValue) {
      ws();
      if (i >= n) return n;
      const c = text[i];
      if (c === '{' || c === '[') {
        i++;
        ws();
        if (text[i] === (c === '{' ? '}' : ']')) {
          i++;
          expectValue = false;
          continue;
        }
        open.push(c === '{' ? 1 : 0);
        if (c === '{') {
          const e = key();
          if (e >= 0) return e;
        }
        continue;
      }
      if (c === '"') {
        const e = string();
        if (e >= 0) return e;
        expectValue = false;
        continue;
      }
      const lit = ['true', 'false', 'null'].find((l) => text.startsWith(l, i));
      if (lit) {
        i += lit.length;
        expectValue = false;
        continue;
      }
      const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
      if (m && m[0].length > 0) {
        i += m[0].length;
        expectValue = false;
        continue;
      }
      return i;
    }
    // after a value: the end of the text, a comma, or the closer of the innermost container
    ws();
    if (open.length === 0) return i < n ? i : -1;
    const inObject = open[open.length - 1] === 1;
    if (text[i] === ',') {
      i++;
      if (inObject) {
        const e = key();
        if (e >= 0) return e;
      }
      expectValue = true;
      continue;
    }
    if (text[i] === (inObject ? '}' : ']')) {
      i++;
      open.pop();
      continue;
    }
    return Math.min(i, n);
  }
}

/** 1-based line and column of a character offset. */
function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  for (let k = 0; k < offset && k < text.length; k++) {
    if (text.charCodeAt(k) === 10) {
      line++;
      start = k + 1;
    }
  }
  return { line, column: offset - start + 1 };
}

/**
 * Parses and validates a model file.
 * @param text - the JSON text
 * @param source - name used in syntax-error paths (`source:line:column`) @defaultValue "model"
 * @throws ModelError on a syntax error (path `source:line:column`) or any validation problem
 */
export function parseModel(text: string, source = 'model'): Model {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    let offset = jsonErrorOffset(text);
    if (offset < 0) offset = 0;
    const { line, column } = lineColumn(text, offset);
    const near = offset >= text.length ? 'the end of the text' : `${JSON.stringify(text.slice(offset, offset + 12))}`;
    const why = err instanceof Error ? err.message.replace(/, ".*" is not valid JSON$/s, '').replace(/ in JSON at position \d+.*$/s, '') : 'invalid JSON';
    throw new ModelError(`invalid JSON at line ${line}, column ${column}, near ${near} (${why}); fix the syntax there (check commas, quotes and brackets)`, `${source}:${line}:${column}`);
  }
  return validateModel(raw);
}

// ---------------------------------------------------------------------------------------------

/**
 * Checks a parsed model and returns a normalised copy (defaults filled: `mass`, node `z` in
 * space; optional arrays present). See the file header for the error contract.
 * @throws ModelError naming the offending item, its JSON path, and the fix
 */
export function validateModel(raw: unknown): Model {
  const top = obj(raw, '(model)', 'the model');
  checkKeys(top, TOP_KEYS, '', 'the model');
  if (top.format !== MODEL_FORMAT) {
    fail('format', top.format === undefined
      ? `"format" is missing; add "format": "${MODEL_FORMAT}"`
      : `format is ${describe(top.format)}, which this reader does not know; set it to "${MODEL_FORMAT}"`);
  }
  if (top.title !== undefined && typeof top.title !== 'string') fail('title', `title is ${describe(top.title)}; it must be a string`);
  if (top.space !== 'plane' && top.space !== 'space') {
    fail('space', top.space === undefined ? `"space" is missing; set it to "plane" (x–y, DOFs ux uy rz) or "space" (6 DOFs per node)` : `space is ${describe(top.space)}; set it to "plane" or "space"`);
  }
  const space = top.space as 'plane' | 'space';
  if (top.mass !== undefined && top.mass !== 'consistent' && top.mass !== 'lumped') {
    fail('mass', `mass is ${describe(top.mass)}; set it to "consistent" or "lumped" (or leave it out for "consistent")`);
  }
  const massKind = (top.mass ?? 'consistent') as 'consistent' | 'lumped';

  // --- materials and sections -----------------------------------------------------------------
  const materials: Record<string, MaterialSpec> = {};
  const matsRaw = obj(top.materials ?? {}, 'materials', '"materials"');
  for (const [name, v] of Object.entries(matsRaw)) {
    const p = keyPath('materials', name);
    const o = obj(v, p, `material "${name}"`);
    checkKeys(o, MATERIAL_KEYS, p, `material "${name}"`);
    const m: MaterialSpec = {
      E: num(o.E, `${p}.E`, `E of material "${name}"`, 'Pa', 'positive', BOUNDS.E),
      density: num(o.density, `${p}.density`, `density of material "${name}"`, 'kg/m³', 'nonNegative', BOUNDS.density),
    };
    const G = optNum(o, 'G', p, `G of material "${name}"`, 'Pa', BOUNDS.G);
    if (G !== undefined) m.G = G;
    materials[name] = m;
  }
  const sections: Record<string, SectionSpec> = {};
  const secsRaw = obj(top.sections ?? {}, 'sections', '"sections"');
  for (const [name, v] of Object.entries(secsRaw)) {
    const p = keyPath('sections', name);
    const o = obj(v, p, `section "${name}"`);
    checkKeys(o, SECTION_KEYS, p, `section "${name}"`);
    const s: SectionSpec = { A: num(o.A, `${p}.A`, `A of section "${name}"`, 'm²', 'positive', BOUNDS.A) };
    for (const k of ['Iz', 'Iy', 'J', 'Ip'] as const) {
      const x = optNum(o, k, p, `${k} of section "${name}"`, 'm⁴', BOUNDS.inertia(k));
      if (x !== undefined) s[k] = x;
    }
    const kappa = optNum(o, 'kappa', p, `kappa of section "${name}"`, 'dimensionless', BOUNDS.kappa);
    if (kappa !== undefined) s.kappa = kappa;
    sections[name] = s;
  }

  // --- nodes ----------------------------------------------------------------------------------
  const nodesRaw = arr(top.nodes, 'nodes', '"nodes"');
  if (nodesRaw.length === 0) fail('nodes', `"nodes" is empty; add at least one node { "id", "x", "y" }`);
  const nodes: NodeSpec[] = [];
  const nodeAt = new Map<string, number>();
  nodesRaw.forEach((v, i) => {
    const p = `nodes[${i}]`;
    const o = obj(v, p, `node ${i}`);
    const id = str(o.id, `${p}.id`, `id of node ${i}`);
    checkKeys(o, NODE_KEYS, p, `node "${id}"`);
    if (nodeAt.has(id)) fail(`${p}.id`, `node id "${id}" is used twice (nodes[${nodeAt.get(id)}] and nodes[${i}]); give every node its own id`);
    const x = num(o.x, `${p}.x`, `x of node "${id}"`, 'm', 'any', BOUNDS.coordinate);
    const y = num(o.y, `${p}.y`, `y of node "${id}"`, 'm', 'any', BOUNDS.coordinate);
    const z = o.z === undefined ? 0 : num(o.z, `${p}.z`, `z of node "${id}"`, 'm', 'any', BOUNDS.coordinate);
    if (space === 'plane' && z !== 0) fail(`${p}.z`, `node "${id}" has z = ${z} in a plane model; set z to 0 (or remove it), or make the model "space"`);
    nodeAt.set(id, i);
    nodes.push(space === 'space' ? { id, x, y, z } : { id, x, y });
  });
  const xyz = new Float64Array(3 * nodes.length);
  nodes.forEach((nd, i) => {
    xyz[3 * i] = nd.x;
    xyz[3 * i + 1] = nd.y;
    xyz[3 * i + 2] = nd.z ?? 0;
  });
  const coord = (i: number): [number, number, number] => [xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]];
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (let k = 0; k < xyz.length; k++) {
    const c = k % 3;
    if (xyz[k] < lo[c]) lo[c] = xyz[k];
    if (xyz[k] > hi[c]) hi[c] = xyz[k];
  }
  const extent = Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]);
  const tol = COINCIDENCE_TOLERANCE * (extent > 0 ? extent : 1);

  const nodeRef = (v: unknown, p: string, owner: string): number => {
    const id = str(v, p, `node of ${owner}`);
    const i = nodeAt.get(id);
    if (i === undefined) fail(p, `node "${id}" of ${owner} is not defined; add it to "nodes" or correct the name`);
    return i as number;
  };
  const dofName = (v: unknown, p: string, owner: string): DofName => {
    const allowed = SPACE_DOFS[space];
    if (typeof v !== 'string' || !(DOF_NAMES as readonly string[]).includes(v)) {
      fail(p, `DOF ${describe(v)} of ${owner} is not a DOF name; use one of ${allowed.join(', ')}`);
    }
    if (!allowed.includes(v as DofName)) fail(p, `DOF "${v}" of ${owner} does not exist in a ${space} model; use one of ${allowed.join(', ')}${space === 'plane' ? ', or make the model "space"' : ''}`);
    return v as DofName;
  };

  // --- elements -------------------------------------------------------------------------------
  const elemsRaw = arr(top.elements ?? [], 'elements', '"elements"');
  const elements: ElementSpec[] = [];
  const elemAt = new Map<string, number>();
  elemsRaw.forEach((v, i) => {
    const p = `elements[${i}]`;
    const o = obj(v, p, `element ${i}`);
    const id = str(o.id, `${p}.id`, `id of element ${i}`);
    const who = `element "${id}"`;
    checkKeys(o, ELEMENT_KEYS, p, who);
    if (elemAt.has(id)) fail(`${p}.id`, `element id "${id}" is used twice (elements[${elemAt.get(id)}] and elements[${i}]); give every element its own id`);
    elemAt.set(id, i);
    if (typeof o.kind !== 'string' || !(ELEMENT_KINDS as readonly string[]).includes(o.kind)) {
      fail(`${p}.kind`, `kind ${describe(o.kind)} of ${who} is not an element kind; use "bar", "beam" or "timoshenko"`);
    }
    const kind = o.kind as ElementKind;
    const ends = arr(o.nodes, `${p}.nodes`, `"nodes" of ${who}`);
    if (ends.length !== 2) fail(`${p}.nodes`, `${who} lists ${ends.length} nodes; give exactly two node ids`);
    const a = nodeRef(ends[0], `${p}.nodes[0]`, who);
    const b = nodeRef(ends[1], `${p}.nodes[1]`, who);
    const ca = coord(a);
    const cb = coord(b);
    const d = [cb[0] - ca[0], cb[1] - ca[1], cb[2] - ca[2]];
    const L = Math.hypot(d[0], d[1], d[2]);
    if (a === b || L <= tol) {
      fail(`${p}.nodes`, `${who} has zero length (its nodes "${nodes[a].id}" and "${nodes[b].id}" are at the same point: length ${L} m, at most ${tol} m = ${COINCIDENCE_TOLERANCE} × the model's extent); connect two distinct points`);
    }
    const matName = str(o.material, `${p}.material`, `material of ${who}`);
    const mat = materials[matName];
    if (mat === undefined) fail(`${p}.material`, `material "${matName}" of ${who} is not defined; add it to "materials" or correct the name`);
    const secName = str(o.section, `${p}.section`, `section of ${who}`);
    const sec = sections[secName];
    if (sec === undefined) fail(`${p}.section`, `section "${secName}" of ${who} is not defined; add it to "sections" or correct the name`);
    // Properties the element needs.
    const needSec = (k: keyof SectionSpec, unit: string) => {
      if (sec[k] === undefined) fail(`${keyPath('sections', secName)}.${k}`, `section "${secName}" has no ${k}, which the ${space} ${kind} ${who} needs; add ${k} (${unit}), a number > 0`);
    };
    const needG = () => {
      if (mat.G === undefined) fail(`${keyPath('materials', matName)}.G`, `material "${matName}" has no G, which the ${space} ${kind} ${who} needs; add the shear modulus G (Pa), a number > 0`);
    };
    if (kind !== 'bar') {
      needSec('Iz', 'm⁴');
      if (space === 'space') {
        needSec('Iy', 'm⁴');
        needSec('J', 'm⁴');
        needG();
      }
      if (kind === 'timoshenko') {
        needG();
        needSec('kappa', 'dimensionless shear correction factor');
      }
    }
    const e: ElementSpec = { id, kind, nodes: [nodes[a].id, nodes[b].id], material: matName, section: secName };
    if (o.orientation !== undefined) {
      const op = `${p}.orientation`;
      if (space === 'plane') fail(op, `${who} has an orientation in a plane model, where local axes follow from the nodes; remove it`);
      if (kind === 'bar') fail(op, `${who} is a bar, which has no orientation; remove it`);
      const ov = arr(o.orientation, op, `orientation of ${who}`);
      if (ov.length !== 3) fail(op, `orientation of ${who} has ${ov.length} components; give [x, y, z]`);
      const v3 = ov.map((c, k) => num(c, `${op}[${k}]`, `orientation component ${k} of ${who}`, 'any length unit', 'any')) as [number, number, number];
      const cx = d[1] * v3[2] - d[2] * v3[1];
      const cy = d[2] * v3[0] - d[0] * v3[2];
      const cz = d[0] * v3[1] - d[1] * v3[0];
      const vn = Math.hypot(v3[0], v3[1], v3[2]);
      if (!(vn > 0) || Math.hypot(cx, cy, cz) <= PARALLEL_TOLERANCE * vn * L) {
        fail(op, `orientation [${v3.join(', ')}] of ${who} is zero or parallel to the member (from "${nodes[a].id}" to "${nodes[b].id}"); give a vector in the local x–y plane that is not along the member`);
      }
      e.orientation = v3;
    }
    elements.push(e);
  });

  // --- supports, springs, masses --------------------------------------------------------------
  const supports: SupportSpec[] = arr(top.supports ?? [], 'supports', '"supports"').map((v, i) => {
    const p = `supports[${i}]`;
    const o = obj(v, p, `support ${i}`);
    checkKeys(o, SUPPORT_KEYS, p, `support ${i}`);
    const n = nodeRef(o.node, `${p}.node`, `support ${i}`);
    const who = `the support of node "${nodes[n].id}"`;
    const fixed = arr(o.fixed, `${p}.fixed`, `"fixed" of ${who}`).map((d, k) => dofName(d, `${p}.fixed[${k}]`, who));
    return { node: nodes[n].id, fixed };
  });
  const pairs = new Set<string>();
  const springs: SpringSpec[] = arr(top.springs ?? [], 'springs', '"springs"').map((v, i) => {
    const p = `springs[${i}]`;
    const o = obj(v, p, `spring ${i}`);
    checkKeys(o, SPRING_KEYS, p, `spring ${i}`);
    const n = nodeRef(o.node, `${p}.node`, `spring ${i}`);
    const who = `spring ${i} at node "${nodes[n].id}"`;
    const s: SpringSpec = { node: nodes[n].id, dof: dofName(o.dof, `${p}.dof`, who), stiffness: num(o.stiffness, `${p}.stiffness`, `stiffness of ${who}`, 'N/m or N·m/rad', 'positive') };
    if (o.to !== undefined) {
      const t = nodeRef(o.to, `${p}.to`, who);
      if (t === n) fail(`${p}.to`, `${who} joins node "${nodes[n].id}" to itself; name another node in "to", or remove "to" for a grounded spring`);
      s.to = nodes[t].id;
      pairs.add(n < t ? `${n} ${t}` : `${t} ${n}`);
    }
    return s;
  });
  const masses: MassSpec[] = arr(top.masses ?? [], 'masses', '"masses"').map((v, i) => {
    const p = `masses[${i}]`;
    const o = obj(v, p, `mass ${i}`);
    checkKeys(o, MASS_KEYS, p, `mass ${i}`);
    const n = nodeRef(o.node, `${p}.node`, `mass ${i}`);
    const who = `the point mass ${i} at node "${nodes[n].id}"`;
    const m: MassSpec = { node: nodes[n].id, mass: num(o.mass, `${p}.mass`, `mass of ${who}`, 'kg', 'nonNegative') };
    if (o.inertia !== undefined) m.inertia = num(o.inertia, `${p}.inertia`, `inertia of ${who}`, 'kg·m²', 'nonNegative');
    return m;
  });

  // --- two nodes at the same point (allowed only when a two-node spring joins them) -------------
  // Sweep along the axis of largest extent: sorted by that coordinate, a pair within tol in
  // every coordinate lies in a run whose sorted coordinate differs by at most tol; inside the
  // run the other two coordinates are compared. (Sweeping along the widest axis keeps the runs
  // short: only nodes in one cross-section share a coordinate.) Of all such pairs, the one
  // whose later node comes first in "nodes" is reported.
  const span = [hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]];
  const ax = span[0] >= span[1] && span[0] >= span[2] ? 0 : span[1] >= span[2] ? 1 : 2;
  const order = Int32Array.from(nodes, (_, i) => i).sort((p, q) => xyz[3 * p + ax] - xyz[3 * q + ax] || p - q);
  let clash: [number, number] | undefined;
  for (let s = 0; s < order.length; s++) {
    const i = order[s];
    for (let t = s + 1; t < order.length; t++) {
      const j = order[t];
      if (xyz[3 * j + ax] - xyz[3 * i + ax] > tol) break;
      if (Math.abs(xyz[3 * j] - xyz[3 * i]) <= tol && Math.abs(xyz[3 * j + 1] - xyz[3 * i + 1]) <= tol && Math.abs(xyz[3 * j + 2] - xyz[3 * i + 2]) <= tol) {
        if (pairs.has(i < j ? `${i} ${j}` : `${j} ${i}`)) continue;
        const pair: [number, number] = i < j ? [i, j] : [j, i];
        if (!clash || pair[1] < clash[1] || (pair[1] === clash[1] && pair[0] < clash[0])) clash = pair;
      }
    }
  }
  if (clash) {
    const [f, g] = clash;
    fail(`nodes[${g}]`, `node "${nodes[g].id}" is at the same point as node "${nodes[f].id}" (${coord(f).join(', ')}); merge them, move one, or join them with a two-node spring`);
  }

  const model: Model = { format: MODEL_FORMAT, space, mass: massKind, materials, sections, nodes, elements, supports, springs, masses };
  if (typeof top.title === 'string') model.title = top.title;

  // --- something must be free to move -----------------------------------------------------------
  const numbering = numberDofs(model);
  if (numbering.dofs.length === 0) {
    fail('supports', `nothing is free to move: every DOF of every node is fixed or unused (${nodes.length} nodes, ${elements.length} elements); release some DOFs in "supports" or add elements`);
  }
  return model;
}
