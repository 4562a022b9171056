/**
 * Linear (bifurcation) buckling of a frame, beam or truss model under a reference load case.
 *
 * 1. Linear static solve K u = f for the reference nodal loads f (N, N·m).
 * 2. Axial force of every element from its end displacements, N = EA/L · (u_b − u_a)·e
 *    (e the unit vector from end a to end b; tension positive). This is exact for the bar,
 *    Euler-Bernoulli and Timoshenko elements, whose axial behaviour is decoupled and linear.
 * 3. Geometric stiffness K_G(N) (model/geometric.ts) and the load factors μ of
 *    (K + μ K_G) φ = 0, i.e. K φ = μ B φ with B = −K_G. The structure buckles under μ·f.
 *
 * How the eigenproblem is posed. `solve` wants its second matrix positive semidefinite, and
 * B = −K_G is indefinite as soon as one member is in tension; K (supported, no mechanism) is
 * positive definite. So the pencil is turned round: B φ = ν K φ with ν = 1/μ, and the lowest
 * positive load factors are the largest positive ν. The dense route (small models) takes every ν
 * from the Cholesky reduction with K as the "mass" matrix (denseEigen(B, K)). The sparse route
 * runs the shift-invert Lanczos of eigen/lanczos.ts on the operator B K⁻¹ acting on y = K φ,
 * which is self-adjoint in the K⁻¹-inner product: Lanczos's "mass" operator is y ↦ K⁻¹y (one
 * solve with the LDLᵀ factor of K) and its "inverse" operator is x ↦ B x (one sparse product).
 * Each Lanczos step therefore costs one solve, as in ordinary shift-invert, and the K⁻¹-images
 * Lanczos keeps beside its basis are the buckled shapes φ = K⁻¹y themselves, K-normalised.
 * This is the σ = 0 case of the buckling spectral transformation of Grimes, Lewis & Simon 1994
 * (SIAM J. Matrix Anal. Appl. 15(1), §5), written in the dual variable y = Kφ so that K, not the
 * indefinite B, supplies the inner product. Lanczos finds the largest |ν| first, i.e. the load
 * factors of either sign nearest zero; negative ones (buckling under the reversed load) are
 * dropped and, if too few positive ones came out, more are asked for.
 *
 * Verification (DESIGN.md): each pair's relative residual ‖Kφ − μBφ‖ / (‖K‖₁‖φ‖) and a Sturm
 * count: for σ > 0, K − σB = K^{½}(I − σ K^{−½}BK^{−½})K^{½} has one negative pivot per ν > 1/σ,
 * i.e. per load factor μ in (0, σ) (Sylvester's law of inertia), so the count at σ just above the
 * highest returned μ proves that no lower positive load factor was missed.
 *
 * Units: loads N (N·m on rotations), displacements m (rad), axial forces N, load factors
 * dimensionless.
 */
import { denseEigen } from '../eigen/dense/index';
import { lanczos } from '../eigen/lanczos';
import { inverseOperator, matrixOperator, type BlockOperator } from '../eigen/operators';
import { ShiftedPencil } from '../eigen/pencil';
import { STURM_GAP } from '../eigen/sturm';
import type { SturmCheck } from '../eigen/types';
import { matrixNorm1, residuals as pairResiduals } from '../eigen/verify';
import { ArgumentError, FactorizationError, ModelError, VerificationError } from '../errors';
import type { LdltFactor, OrderingName } from '../linalg/ldlt/types';
import type { SymmetricCsc } from '../linalg/sparse/symmetric';
import { assemble } from '../model/assemble';
import { assembleGeometric } from '../model/geometric';
import { assertNoMechanism } from '../model/mechanisms';
import { nodalLoadVector, type LoadCase } from '../model/loads';
import type { AssembledModel, Model } from '../model/types';

/** Options of {@link bucklingAnalysis}. */
export interface BucklingOptions {
  /** Lowest positive load factors wanted. @defaultValue 4 */
  count?: number;
  /**
   * `auto`: dense up to {@link BUCKLING_DENSE_LIMIT} free DOFs, else `lanczos`. `dense`: every
   * factor from the dense Cholesky reduction. `lanczos`: the sparse route. @defaultValue 'auto'
   */
  method?: 'auto' | 'dense' | 'lanczos';
  /** Lanczos acceptance ‖OP y − θy‖ ≤ tolerance·|θ|. @defaultValue 1e-12 */
  tolerance?: number;
  /** Seed of the Lanczos start vector. @defaultValue 1 */
  seed?: number;
  /** Fill-reducing ordering of the sparse factorization. @defaultValue 'auto' */
  ordering?: OrderingName | Int32Array;
  /**
   * Check residuals (≤ 1e-8) and the Sturm count, throwing VerificationError when one fails.
   * @defaultValue true
   */
  verify?: boolean;
}

/** Defaults of {@link BucklingOptions}. */
export const BUCKLING_DEFAULTS = { count: 4, method: 'auto', tolerance: 1e-12, seed: 1, ordering: 'auto', verify: true } as const;

/** Free DOFs up to which `method: 'auto'` takes the dense route. */
export const BUCKLING_DENSE_LIMIT = 150;

/** Axial forces below this fraction of the largest |N| count as zero in K_G (round-off). */
export const AXIAL_NOISE = 1e-9;

/** Largest accepted relative residual of a buckling pair (DESIGN.md accuracy target). */
export const BUCKLING_RESIDUAL_LIMIT = 1e-8;

/** Outcome of {@link bucklingAnalysis}. */
export interface BucklingResult {
  /** The assembled model (free DOFs, K, DOF map). */
  readonly assembled: AssembledModel;
  /** Reference load vector over the free DOFs, length n, N (N·m). */
  readonly load: Float64Array;
  /** Static displacement under the reference load, length n, m (rad). */
  readonly displacement: Float64Array;
  /** Axial force per element (model order) under the reference load, N, tension positive. */
  readonly axialForce: Float64Array;
  /** Geometric stiffness K_G of those forces (|N| ≤ AXIAL_NOISE·max|N| taken as 0), lower-stored, n × n. */
  readonly geometricStiffness: SymmetricCsc;
  /** Critical load factors μ, ascending, all > 0: the structure buckles under μ × the load case. */
  readonly loadFactors: Float64Array;
  /**
   * Buckled shapes, column-major n × m (shape j at [j·n, (j+1)·n)), scaled so that the largest
   * |entry| over the translational DOFs is 1 (over all DOFs when there is no translation) and
   * that entry is positive. Dimensionless.
   */
  readonly shapes: Float64Array;
  /** Per shape: ‖Kφ − μBφ‖₂ / (‖K‖₁‖φ‖₂), B = −K_G. */
  readonly residuals: Float64Array;
  /** Sturm count at σ just above the highest returned μ: positive load factors below σ. */
  readonly sturm?: SturmCheck;
  /** Route taken. */
  readonly method: 'dense' | 'lanczos';
  /** Numbers of the run: `rounds`, `lanczosSteps`, `factorizations`, milliseconds `staticMs`, `eigenMs`, `verifyMs`, `totalMs`. */
  readonly stats: Readonly<Record<string, number>>;
}

/**
 * Axial force of every element from the free-DOF displacements u: N = EA/L · (u_b − u_a)·e.
 * @param asm - the assembled model
 * @param u - displacements over the free DOFs, length n, m (rad)
 * @returns length model.elements.length, N, tension positive
 * @throws ArgumentError (path `u`) for a wrong length
 */
export function axialForces(asm: AssembledModel, u: Float64Array): Float64Array {
  const model = asm.model;
  if (u.length !== asm.stiffness.n) throw new ArgumentError(`has length ${u.length}; give one displacement per free DOF (${asm.stiffness.n})`, 'u');
  const index = new Map<string, number>();
  model.nodes.forEach((nd, i) => index.set(nd.id, i));
  const dofMap = asm.dofMap!;
  const xyz = asm.coordinates;
  const out = new Float64Array(model.elements.length);
  const at = (node: number, slot: number): number => {
    const g = dofMap[6 * node + slot];
    return g < 0 ? 0 : u[g];
  };
  model.elements.forEach((e, k) => {
    const a = index.get(e.nodes[0])!;
    const b = index.get(e.nodes[1])!;
    const dx = xyz[3 * b] - xyz[3 * a], dy = xyz[3 * b + 1] - xyz[3 * a + 1], dz = xyz[3 * b + 2] - xyz[3 * a + 2];
    const L = Math.hypot(dx, dy, dz);
    const stretch = ((at(b, 0) - at(a, 0)) * dx + (at(b, 1) - at(a, 1)) * dy + (at(b, 2) - at(a, 2)) * dz) / L;
    out[k] = (model.materials[e.material].E * model.sections[e.section].A * stretch) / L;
  });
  return out;
}

/**
 * Critical load factors and buckled shapes of a model under a reference load case.
 * @param input - a validated model or one already assembled
 * @param loads - the reference load case (N, N·m)
 * @param options - see {@link BucklingOptions}; defaults in {@link BUCKLING_DEFAULTS}
 * @returns the lowest positive load factors with shapes, the static state they come from, and
 *   verification figures
 * @throws ModelError naming a mechanism (a node's own, or one the static solve meets);
 *   ArgumentError for bad loads or options, (path `count`)
 *   when the structure has fewer positive load factors than asked for (e.g. no member is in
 *   compression); VerificationError when a result fails
 *   its residual or Sturm check
 */
export function bucklingAnalysis(input: Model | AssembledModel, loads: LoadCase, options: BucklingOptions = {}): BucklingResult {
  const t0 = performance.now();
  const given = Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) as BucklingOptions;
  const o = { ...BUCKLING_DEFAULTS, ...given };
  if (!Number.isInteger(o.count) || o.count < 1) throw new ArgumentError(`count is ${o.count}; pass a positive integer`, 'count');
  if (!['auto', 'dense', 'lanczos'].includes(o.method)) throw new ArgumentError(`method is ${JSON.stringify(o.method)}; use auto, dense or lanczos`, 'method');
  if (!(o.tolerance > 0 && o.tolerance < 1e-8)) throw new ArgumentError(`tolerance is ${o.tolerance}; pass a number in (0, 1e-8)`, 'tolerance');
  if (!Number.isInteger(o.seed)) throw new ArgumentError(`seed is ${o.seed}; pass an integer`, 'seed');

  const asm = 'stiffness' in input ? input : assemble(input);
  assertNoMechanism(asm);
  const K = asm.stiffness;
  const n = K.n;
  const f = nodalLoadVector(asm, loads);
  if (f.every((v) => v === 0)) throw new ArgumentError('every load of the case is zero; give a non-zero reference load', 'loads');

  // ---- static state: one analysis of the union pattern of K and K_G serves everything ----
  const ts = performance.now();
  const probe = assembleGeometric(asm, new Float64Array(asm.model.elements.length).fill(-1));
  const pencilProbe = new ShiftedPencil(K, probe, { ordering: o.ordering });
  let kFactor: LdltFactor;
  try {
    kFactor = pencilProbe.factorAt(0, 1, 1).factor;
  } catch (e) {
    if (!(e instanceof FactorizationError)) throw e;
    // A singular K here is a mechanism spanning several nodes (single-node ones were caught above).
    const row = Number(/row (\d+)/.exec(e.path)?.[1] ?? -1);
    const d = asm.dofs[row];
    throw new ModelError(
      `the stiffness is singular${d ? ` at node "${d.node}" dof ${d.dof}` : ''}: the structure is a mechanism and has no static equilibrium under the load case; add supports or bracing`,
      d ? `nodes[${d.nodeIndex}]` : 'supports',
    );
  }
  const displacement = new Float64Array(n);
  kFactor.solve(f, displacement);
  const axialForce = axialForces(asm, displacement);
  // Forces below AXIAL_NOISE × the largest |N| are round-off of members that carry none (e.g.
  // a girder between two equally loaded columns); they enter K_G as exactly zero, so that a load
  // case without real compression is reported as such rather than as a huge spurious factor.
  let maxN = 0;
  for (const N of axialForce) maxN = Math.max(maxN, Math.abs(N));
  const effective = axialForce.map((N) => (Math.abs(N) <= AXIAL_NOISE * maxN ? 0 : N));
  const KG = assembleGeometric(asm, effective);
  // B = −K_G stored on the probe's pattern (members with N = 0 store nothing in K_G), so that
  // the union pattern of K and B, and with it the analysis, stays that of the probe.
  const B = negatedOnPattern(KG, probe);
  const staticMs = performance.now() - ts;
  if (!effective.some((N) => N < 0)) {
    throw new ArgumentError('no member is in compression under this load case, so it has no positive buckling load factor; load the structure so that some member is compressed', 'loads');
  }

  // ---- eigen phase (with Sturm-driven reruns on the Lanczos route) ----
  const te = performance.now();
  const method = o.method === 'auto' ? (n <= BUCKLING_DENSE_LIMIT ? 'dense' : 'lanczos') : o.method;
  const pencil = new ShiftedPencil(K, B, { symbolic: pencilProbe.symbolic });
  const sturmOf = o.verify ? (all: Float64Array, m: number) => sturmAt(pencil, all, m) : undefined;
  const found = method === 'dense' ? denseRoute(K, B, o.count, sturmOf) : lanczosRoute(kFactor, K, B, o.count, o.tolerance, o.seed, sturmOf);
  const { factors, shapes, rounds, steps, sturm } = found;
  const eigenMs = performance.now() - te;

  // ---- verification ----
  const tv = performance.now();
  const m = factors.length;
  const res = pairResiduals(K, B, factors, shapes, matrixNorm1(K));
  const factorizations = 1 + pencil.factorizations;
  if (o.verify) {
    for (let j = 0; j < m; j++) {
      if (!(res[j] <= BUCKLING_RESIDUAL_LIMIT)) {
        throw new VerificationError(`relative residual ${res[j].toExponential(2)} of load factor ${factors[j]} exceeds ${BUCKLING_RESIDUAL_LIMIT}; try method "dense" or a smaller tolerance`, `bucklingModes[${j}]`);
      }
    }
    if (sturm && !sturm.passed) {
      const computed = sturm.returnedBelow + (sturm.extraBelow ?? 0);
      throw new VerificationError(
        `the Sturm count finds ${sturm.countBelow} positive load factor(s) below ${sturm.shift} but ${computed} were computed; try method "dense" or another seed`,
        `bucklingModes[${Math.min(computed, m - 1)}]`,
      );
    }
  }
  normaliseShapes(asm, shapes, m);
  const verifyMs = performance.now() - tv;
  return {
    assembled: asm,
    load: f,
    displacement,
    axialForce,
    geometricStiffness: KG,
    loadFactors: factors,
    shapes,
    residuals: res,
    ...(sturm ? { sturm } : {}),
    method,
    stats: { rounds, lanczosSteps: steps, factorizations, staticMs, eigenMs, verifyMs, totalMs: performance.now() - t0 },
  };
}

/** −A stored on `pattern` (which must contain A's pattern; both sorted by row within a column). */
function negatedOnPattern(a: SymmetricCsc, pattern: SymmetricCsc): SymmetricCsc {
  const values = new Float64Array(pattern.values.length);
  for (let j = 0; j < a.n; j++) {
    let q = pattern.colPtr[j];
    const qEnd = pattern.colPtr[j + 1];
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      while (q < qEnd && pattern.rowIdx[q] < i) q++;
      if (q === qEnd || pattern.rowIdx[q] !== i) {
        throw new ArgumentError(`entry (${i}, ${j}) of the geometric stiffness lies outside the pattern of a unit compression in every member; this is a defect of eigenframe, please report it`, 'geometricStiffness');
      }
      values[q] = -a.values[p];
    }
  }
  return { n: a.n, colPtr: pattern.colPtr, rowIdx: pattern.rowIdx, values };
}

function tooFew(count: number, found: number): ArgumentError {
  return new ArgumentError(
    `count is ${count} but the structure has only ${found} positive load factor(s) under this load case; ask for at most ${found} (or change the load case)`,
    'count',
  );
}

/** What a route found. */
interface Found {
  factors: Float64Array;
  shapes: Float64Array;
  rounds: number;
  steps: number;
  sturm?: SturmCheck;
}

/**
 * Sturm count of the load factors: negative pivots of K − σB at σ just above the m-th lowest of
 * `all` (every positive factor computed, ascending) = positive factors below σ (file header).
 */
function sturmAt(pencil: ShiftedPencil, all: Float64Array, m: number): SturmCheck {
  const hi = all[m - 1];
  const upper = pencil.factorAt(hi + STURM_GAP * hi, 1);
  let below = 0;
  for (let j = 0; j < all.length; j++) if (all[j] < upper.shift) below++;
  const returnedBelow = Math.min(below, m);
  return {
    shift: upper.shift,
    countBelow: upper.factor.negativePivots,
    returnedBelow,
    ...(below > returnedBelow ? { extraBelow: below - returnedBelow } : {}),
    passed: upper.factor.negativePivots === below,
  };
}

type SturmOf = ((all: Float64Array, m: number) => SturmCheck) | undefined;

/** Every ν of B φ = ν K φ (K as the positive definite "mass"); the `count` largest positive ones. */
function denseRoute(K: SymmetricCsc, B: SymmetricCsc, count: number, sturmOf: SturmOf): Found {
  const n = K.n;
  const all = denseEigen(B, K, { residualTolerance: Infinity, orthogonalityTolerance: Infinity });
  const nu = all.eigenvalues; // ascending: the largest ν are last
  const scale = Math.max(...Array.from(nu, Math.abs), 0);
  const positive: number[] = [];
  for (let j = nu.length - 1; j >= 0 && positive.length < count; j--) {
    if (nu[j] > 1e-12 * scale) positive.push(j);
  }
  if (positive.length < count) {
    let total = 0;
    for (let j = 0; j < nu.length; j++) if (nu[j] > 1e-12 * scale) total++;
    throw tooFew(count, total);
  }
  const factors = new Float64Array(count);
  const shapes = new Float64Array(n * count);
  positive.forEach((j, c) => {
    factors[c] = 1 / nu[j];
    shapes.set(all.vectors.subarray(j * n, (j + 1) * n), c * n);
  });
  // every positive factor is known here: the count must agree with all of them
  const every: number[] = [];
  for (let j = nu.length - 1; j >= 0; j--) if (nu[j] > 1e-12 * scale) every.push(1 / nu[j]);
  return { factors, shapes, rounds: 0, steps: 0, ...(sturmOf ? { sturm: sturmOf(Float64Array.from(every), count) } : {}) };
}

/** Reruns of the Lanczos route after a Sturm count found a missed load factor. */
export const BUCKLING_MAX_ROUNDS = 8;

/**
 * Lanczos on B K⁻¹ in the K⁻¹-inner product (see the file header): "mass" y ↦ K⁻¹y,
 * "inverse" x ↦ Bx; reported eigenvalues are 1/θ = 1/ν = μ. Every pair found is locked (kept
 * K⁻¹-orthogonal to the next runs), as `solve` does for missed copies of repeated eigenvalues
 * (Grimes, Lewis & Simon 1994, §3.3): runs continue while too few positive factors came out, or
 * while the Sturm count finds more factors below the highest returned one than were computed
 * (a repeated factor of a symmetric structure, e.g. sway in x and in y).
 */
function lanczosRoute(kFactor: LdltFactor, K: SymmetricCsc, B: SymmetricCsc, count: number, tolerance: number, seed: number, sturmOf: SturmOf): Found {
  const n = K.n;
  const flexibility: BlockOperator = inverseOperator(kFactor);
  const geometric = matrixOperator(B);
  const lockedY: Float64Array[] = [];
  const pos: { mu: number; phi: Float64Array }[] = [];
  let want = count;
  let rounds = 0;
  let steps = 0;
  let sturm: SturmCheck | undefined;
  for (;;) {
    const L = lockedY.length;
    if (L >= n - 1) throw tooFew(count, pos.length);
    const locked = new Float64Array(n * L);
    lockedY.forEach((y, c) => locked.set(y, c * n));
    rounds++;
    const r = lanczos(geometric, flexibility, { count: Math.max(1, Math.min(want, n - 1 - L)), shift: 0, tolerance, seed: seed + rounds - 1, ...(L > 0 ? { locked, lockedCount: L } : {}) });
    steps += r.steps;
    const p = r.eigenvalues.length;
    for (let j = 0; j < p; j++) {
      lockedY.push(r.vectors.slice(j * n, (j + 1) * n));
      // φ = K⁻¹y is Lanczos's "mass" image of the Ritz vector y; μ is refined by the Rayleigh
      // quotient φᵀKφ / φᵀBφ (more accurate than 1/θ when θ is small).
      const phi = r.massVectors.slice(j * n, (j + 1) * n);
      const mu = r.eigenvalues[j];
      if (mu > 0 && Number.isFinite(mu)) pos.push({ mu: rayleigh(K, B, phi), phi });
    }
    pos.sort((a, b) => a.mu - b.mu);
    if (pos.length < count) {
      if (r.exhausted) throw tooFew(count, pos.length);
      if (!r.converged) {
        throw new VerificationError(`the Lanczos iteration did not converge for ${want} buckling pair(s); try method "dense" or a larger tolerance`, `bucklingModes[${pos.length}]`);
      }
      want = Math.max(2 * want, count - pos.length);
      continue;
    }
    if (!sturmOf) break;
    const all = Float64Array.from(pos, (q) => q.mu);
    sturm = sturmOf(all, count);
    if (sturm.passed || rounds >= BUCKLING_MAX_ROUNDS || r.exhausted) break;
    const computed = sturm.returnedBelow + (sturm.extraBelow ?? 0);
    const missing = sturm.countBelow - computed;
    if (missing <= 0) break; // more computed than counted: verification reports it
    want = missing;
  }
  const factors = Float64Array.from(pos.slice(0, count), (q) => q.mu);
  const shapes = new Float64Array(n * count);
  pos.slice(0, count).forEach((q, c) => shapes.set(q.phi, c * n));
  return { factors, shapes, rounds, steps, ...(sturm ? { sturm } : {}) };
}

function rayleigh(K: SymmetricCsc, B: SymmetricCsc, x: Float64Array): number {
  const kx = new Float64Array(x.length);
  const bx = new Float64Array(x.length);
  matrixOperator(K).apply(x, kx);
  matrixOperator(B).apply(x, bx);
  let a = 0, b = 0;
  for (let i = 0; i < x.length; i++) {
    a += x[i] * kx[i];
    b += x[i] * bx[i];
  }
  return a / b;
}

/** Scales each shape so that its largest translational |entry| is 1 and positive. */
function normaliseShapes(asm: AssembledModel, shapes: Float64Array, m: number): void {
  const n = asm.stiffness.n;
  const translational = asm.dofs.map((d) => d.dof === 'ux' || d.dof === 'uy' || d.dof === 'uz');
  const anyTranslation = translational.some(Boolean);
  for (let j = 0; j < m; j++) {
    const o = j * n;
    let best = 0;
    let at = -1;
    for (let i = 0; i < n; i++) {
      if (anyTranslation && !translational[i]) continue;
      const a = Math.abs(shapes[o + i]);
      if (a > best * (1 + 1e-9)) {
        best = a;
        at = i;
      }
    }
    if (at < 0 || best === 0) continue;
    const s = (shapes[o + at] > 0 ? 1 : -1) / best;
    for (let i = 0; i < n; i++) shapes[o + i] *= s;
  }
}
