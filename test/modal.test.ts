import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { fromDenseArray, symmetricMultiply } from '../src/linalg/sparse/symmetric';
import { massNormalise, MASS_NORMALISE_DEFAULTS, orientModes } from '../src/modal/normalise';
import { naturalFrequencies, eigenvalueToFrequency, frequencyToEigenvalue } from '../src/modal/frequencies';
import { centreOfMass, influenceVector, influenceVectors } from '../src/modal/influence';
import { directionParticipation, participation, modalMasses } from '../src/modal/participation';
import { summariseModes } from '../src/modal/summary';
import { denseModes, handModel, randomSpd, sym } from './modal-dense';
import type { DofName } from '../src/model/types';
import { thrown } from './argument-path';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

// Two-storey shear frame of Chopra's worked examples (Dynamics of Structures, ch. 10; the
// parameters m₁ = 2m, m₂ = m, k₁ = 2k, k₂ = k are from memory). Closed forms derived here from
// det(K − ω²M) = 0: ω₁² = k/2m with φ₁ = [½, 1]; ω₂² = 2k/m with φ₂ = [−1, 1];
// L₁ = 2m, M₁ = 1.5m, Γ₁ = 4/3, m_eff,1 = 8m/3; L₂ = −m, M₂ = 3m, Γ₂ = −1/3, m_eff,2 = m/3.
const m = 4.5e4; // kg, invented for the demo frame; the closed forms hold for any m, k
const k = 5.4e7; // N/m
const h = 3.5; // m, storey height
const K2 = sym([
  [3 * k, -k],
  [-k, k],
]);
const M2 = sym([
  [2 * m, 0],
  [0, m],
]);
const shear2 = handModel('plane', [['floor1', 0, h, 0], ['floor2', 0, 2 * h, 0]], [[0, 'ux'], [1, 'ux']], K2, M2);

describe('frequencies', () => {
  it('λ → ω, f, T; a rigid mode has f = 0 and T = Infinity', () => {
    // f = √λ / 2π (definition): λ = (2π·5)² gives 5 Hz and T = 0.2 s.
    const f = naturalFrequencies([-1e-9, (2 * Math.PI * 5) ** 2]);
    expect(f.frequency[0]).toBe(0);
    expect(f.angular[0]).toBe(0);
    expect(f.period[0]).toBe(Infinity);
    expect(rel(f.frequency[1], 5)).toBeLessThan(1e-15);
    expect(rel(f.angular[1], 2 * Math.PI * 5)).toBeLessThan(1e-15);
    expect(rel(f.period[1], 0.2)).toBeLessThan(1e-15);
    expect(rel(eigenvalueToFrequency(frequencyToEigenvalue(3.7)), 3.7)).toBeLessThan(1e-15);
  });
  it('shear frame: ω₁² = k/2m, ω₂² = 2k/m (closed form above)', () => {
    const modes = denseModes(K2, M2);
    const f = naturalFrequencies(modes.eigenvalues);
    expect(rel(f.angular[0], Math.sqrt(k / (2 * m)))).toBeLessThan(1e-12);
    expect(rel(f.angular[1], Math.sqrt((2 * k) / m))).toBeLessThan(1e-12);
  });
  it('NaN or infinite eigenvalue, negative frequency: ArgumentError with path', () => {
    expect(thrown(() => naturalFrequencies([1, NaN])).path).toBe('eigenvalues[1]');
    expect(thrown(() => naturalFrequencies([Infinity])).path).toBe('eigenvalues[0]');
    expect(thrown(() => frequencyToEigenvalue(-1)).path).toBe('frequency');
  });
});

describe('massNormalise', () => {
  it('unit modal mass, largest component positive, tie → lowest index; input unchanged', () => {
    // Chopra's shapes as given (closed form above), deliberately scaled and flipped.
    const raw = Float64Array.from([-0.5 * 7, -1 * 7, 1 * 0.01, -1 * 0.01]);
    const copy = Float64Array.from(raw);
    const phi = massNormalise(M2, raw);
    expect(Array.from(raw)).toEqual(Array.from(copy));
    // φ₁ = [½, 1]/√(1.5m); φ₂ = [1, −1]/√(3m) (a tie: DOF 0 decides).
    expect(rel(phi[0], 0.5 / Math.sqrt(1.5 * m))).toBeLessThan(1e-14);
    expect(rel(phi[1], 1 / Math.sqrt(1.5 * m))).toBeLessThan(1e-14);
    expect(rel(phi[2], 1 / Math.sqrt(3 * m))).toBeLessThan(1e-14);
    expect(rel(phi[3], -1 / Math.sqrt(3 * m))).toBeLessThan(1e-14);
    expect(MASS_NORMALISE_DEFAULTS).toEqual({ orient: true });
    const unoriented = massNormalise(M2, raw, { orient: false });
    expect(unoriented[0]).toBeLessThan(0);
  });
  it('dense modes of a random pair stay M-orthonormal after normalising (ml-matrix reference)', () => {
    const n = 8;
    const K = sym(randomSpd(n, 3));
    const M = sym(randomSpd(n, 4));
    const modes = denseModes(K, M);
    const scaled = modes.vectors.map((v, i) => v * (1 + Math.floor(i / n)));
    const phi = massNormalise(M, scaled);
    const w = new Float64Array(n);
    for (let a = 0; a < n; a++) {
      symmetricMultiply(M, phi.subarray(a * n, (a + 1) * n), w);
      for (let b = 0; b < n; b++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += phi[b * n + i] * w[i];
        expect(Math.abs(s - (a === b ? 1 : 0))).toBeLessThan(1e-12);
      }
    }
  });
  it('zero shape or wrong length: ArgumentError', () => {
    expect(thrown(() => massNormalise(M2, Float64Array.from([1, 0, 0, 0]))).path).toBe('modes[1]');
    expect(thrown(() => massNormalise(M2, new Float64Array(3))).path).toBe('vectors');
  });
  it('orientModes flips a mode whose peak is negative', () => {
    const v = Float64Array.from([0.2, -0.9, 0.5, 0.1]);
    orientModes(v, 4);
    expect(Array.from(v)).toEqual([-0.2, 0.9, -0.5, -0.1]);
  });
});

describe('participation: shear frames', () => {
  it('two-storey frame: effective masses 8m/3 and m/3, sum = total mass 3m (closed form above)', () => {
    const modes = denseModes(K2, M2);
    const p = participation(shear2, modes, { directions: ['ux'] });
    const ux = p.byDirection.ux!;
    expect(rel(ux.totalMass, 3 * m)).toBeLessThan(1e-15);
    expect(rel(ux.effectiveMasses[0], (8 * m) / 3)).toBeLessThan(1e-12);
    expect(rel(ux.effectiveMasses[1], m / 3)).toBeLessThan(1e-12);
    expect(rel(ux.ratios[0], 8 / 9)).toBeLessThan(1e-12);
    expect(rel(ux.cumulativeRatios[1], 1)).toBeLessThan(1e-12);
    // Mass-normalised: Γⱼ² = m_eff,j.
    expect(rel(ux.participationFactors[0] ** 2, ux.effectiveMasses[0])).toBeLessThan(1e-12);
  });
  it('two-storey frame, shapes as Chopra scales them: Γ₁ = 4/3, Γ₂ = −1/3 (closed form above)', () => {
    const shapes = { n: 2, eigenvalues: Float64Array.from([k / (2 * m), (2 * k) / m]), vectors: Float64Array.from([0.5, 1, -1, 1]) };
    const d = directionParticipation(M2, shapes, influenceVector(shear2, 'ux'), 'ux');
    expect(rel(d.participationFactors[0], 4 / 3)).toBeLessThan(1e-15);
    expect(rel(d.participationFactors[1], -1 / 3)).toBeLessThan(1e-15);
    expect(Array.from(modalMasses(M2, shapes)).map((v) => v / m)).toEqual([1.5, 3]);
  });
  it('uniform five-storey frame: ratios match the closed-form modes of a fixed–free spring chain', () => {
    // Closed form (uniform fixed–free chain of N equal masses and springs, derived from the
    // difference equation): λⱼ = (4k/m) sin²((2j−1)π / (2(2N+1))),
    // φⱼ(i) = sin(i(2j−1)π / (2N+1)), i = 1..N; ratio = (Σᵢ φⱼ(i))² / (N Σᵢ φⱼ(i)²).
    const N = 5;
    const rows = Array.from({ length: N }, (_, i) => Array.from({ length: N }, (_, c) => (c === i ? (i === N - 1 ? k : 2 * k) : Math.abs(c - i) === 1 ? -k : 0)));
    const K = sym(rows);
    const M = sym(Array.from({ length: N }, (_, i) => Array.from({ length: N }, (_, c) => (c === i ? m : 0))));
    const model = handModel('plane', Array.from({ length: N }, (_, i) => [`f${i + 1}`, 0, (i + 1) * h, 0] as [string, number, number, number]), Array.from({ length: N }, (_, i) => [i, 'ux'] as [number, DofName]), K, M);
    const modes = denseModes(K, M);
    const ux = participation(model, modes, { directions: ['ux'] }).byDirection.ux!;
    for (let j = 1; j <= N; j++) {
      const lambda = ((4 * k) / m) * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
      expect(rel(modes.eigenvalues[j - 1], lambda)).toBeLessThan(1e-12);
      let s = 0;
      let s2 = 0;
      for (let i = 1; i <= N; i++) {
        const v = Math.sin((i * (2 * j - 1) * Math.PI) / (2 * N + 1));
        s += v;
        s2 += v * v;
      }
      expect(Math.abs(ux.ratios[j - 1] - (s * s) / (N * s2))).toBeLessThan(1e-12);
    }
    expect(Math.abs(ux.cumulativeRatios[N - 1] - 1)).toBeLessThan(1e-12);
  });
});

describe('influence vectors and centre of mass', () => {
  // Three lumped masses with rotary inertia, free in the plane (invented data; the checks are
  // definitions): centre of mass Σ mᵢ xᵢ / Σ mᵢ; polar moment about it Σ mᵢ rᵢ² + Σ Jᵢ.
  const nodes: Array<[string, number, number, number]> = [['a', 0, 0, 0], ['b', 4, 1, 0], ['c', 1, 3, 0]];
  const mass = [100, 250, 50];
  const J = [3, 7, 2];
  const dofs: Array<[number, DofName]> = [];
  const diag: number[] = [];
  nodes.forEach((_, n) => {
    dofs.push([n, 'ux'], [n, 'uy'], [n, 'rz']);
    diag.push(mass[n], mass[n], J[n]);
  });
  const M = fromDenseArray(9, diag.flatMap((v, i) => diag.map((_, c) => (c === i ? v : 0))));
  const K = sym(randomSpd(9, 11));
  const model = handModel('plane', nodes, dofs, K, M);
  const total = mass.reduce((a, b) => a + b, 0);
  const xc = mass.reduce((s, mi, n) => s + mi * nodes[n][1], 0) / total;
  const yc = mass.reduce((s, mi, n) => s + mi * nodes[n][2], 0) / total;

  it('centre of mass of lumped masses', () => {
    const c = centreOfMass(model);
    expect(rel(c[0], xc)).toBeLessThan(1e-14);
    expect(rel(c[1], yc)).toBeLessThan(1e-14);
    expect(c[2]).toBe(0);
  });
  it('rotation about z: polar moment about the centre of mass; Σ m_eff = rᵀMr in every direction', () => {
    const polar = mass.reduce((s, mi, n) => s + mi * ((nodes[n][1] - xc) ** 2 + (nodes[n][2] - yc) ** 2), 0) + J.reduce((a, b) => a + b, 0);
    const modes = denseModes(K, M);
    const p = participation(model, modes);
    expect(p.directions).toEqual(['ux', 'uy', 'rz']);
    expect(rel(p.byDirection.rz!.totalMass, polar)).toBeLessThan(1e-13);
    expect(rel(p.byDirection.ux!.totalMass, total)).toBeLessThan(1e-15);
    // Identity: Σⱼ Γⱼ² = rᵀ M Φ Φᵀ M r = rᵀ M r, since Φ Φᵀ = M⁻¹ for M-orthonormal Φ.
    for (const d of p.directions) {
      const dp = p.byDirection[d]!;
      expect(rel(dp.effectiveMasses.reduce((a, b) => a + b, 0), dp.totalMass)).toBeLessThan(1e-12);
    }
  });
  it('a given reference point is used: rz about the origin adds total·|c|² (parallel axes)', () => {
    const modes = denseModes(K, M);
    const about0 = participation(model, modes, { referencePoint: [0, 0, 0], directions: ['rz'] });
    const aboutC = participation(model, modes, { directions: ['rz'] });
    expect(about0.referencePoint).toEqual([0, 0, 0]);
    expect(rel(about0.byDirection.rz!.totalMass, aboutC.byDirection.rz!.totalMass + total * (xc * xc + yc * yc))).toBeLessThan(1e-13);
  });
  it('small-rotation kinematics: rz about p gives ux = −(y − p_y), uy = x − p_x, rz = 1', () => {
    const r = influenceVector(model, 'rz', [1, 2, 0]);
    // node b at (4, 1): ux = −(1 − 2) = 1, uy = 4 − 1 = 3
    expect(Array.from(r.subarray(3, 6))).toEqual([1, 3, 1]);
  });
  it('direction absent from a plane model, bad reference point: ArgumentError', () => {
    expect(thrown(() => influenceVector(model, 'uz')).path).toBe('direction');
    expect(thrown(() => influenceVectors(model, { referencePoint: [0, NaN, 0] })).path).toBe('referencePoint');
  });

  it('consistent-mass beam, inclined: total mass ρAL per translation, centre at mid-length, rz = ρAL³/12', () => {
    // Plane-frame element consistent mass (Przemieniecki, Theory of Matrix Structural
    // Analysis, 1968; coefficients 140/70 axial and 156, 22L, 54, 13L, 4L², 3L² bending, over
    // ρAL/420; from memory), rotated to 30°. Rigid-body fields are reproduced exactly by its
    // shape functions, so rᵀMr = ∫ρA (s − L/2)² ds = ρAL³/12 about the centre (closed form).
    const rho = 7850;
    const A = 6e-3;
    const L = 2.4;
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    const q = (rho * A * L) / 420;
    const Ml = [
      [140, 0, 0, 70, 0, 0],
      [0, 156, 22 * L, 0, 54, -13 * L],
      [0, 22 * L, 4 * L * L, 0, 13 * L, -3 * L * L],
      [70, 0, 0, 140, 0, 0],
      [0, 54, 13 * L, 0, 156, -22 * L],
      [0, -13 * L, -3 * L * L, 0, -22 * L, 4 * L * L],
    ].map((row) => row.map((v) => v * q));
    const T = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
    for (const o of [0, 3]) {
      T[o][o] = c;
      T[o][o + 1] = s;
      T[o + 1][o] = -s;
      T[o + 1][o + 1] = c;
      T[o + 2][o + 2] = 1;
    }
    // Mg = Tᵀ Ml T
    const Mg = Array.from({ length: 6 }, (_, i) => Array.from({ length: 6 }, (_, j) => {
      let v = 0;
      for (let a = 0; a < 6; a++) for (let b = 0; b < 6; b++) v += T[a][i] * Ml[a][b] * T[b][j];
      return v;
    }));
    const x0 = 1;
    const y0 = 2;
    const beam = handModel('plane', [['p', x0, y0, 0], ['q', x0 + L * c, y0 + L * s, 0]], [[0, 'ux'], [0, 'uy'], [0, 'rz'], [1, 'ux'], [1, 'uy'], [1, 'rz']], sym(randomSpd(6, 5)), sym(Mg));
    const com = centreOfMass(beam);
    expect(rel(com[0], x0 + (L * c) / 2)).toBeLessThan(1e-13);
    expect(rel(com[1], y0 + (L * s) / 2)).toBeLessThan(1e-13);
    const p = participation(beam, denseModes(beam.stiffness, beam.mass));
    expect(rel(p.byDirection.ux!.totalMass, rho * A * L)).toBeLessThan(1e-13);
    expect(rel(p.byDirection.uy!.totalMass, rho * A * L)).toBeLessThan(1e-13);
    expect(rel(p.byDirection.rz!.totalMass, (rho * A * L ** 3) / 12)).toBeLessThan(1e-12);
  });
});

describe('participation: space model identity', () => {
  it('Σⱼ m_eff,j = rᵀ M r for all six directions (Chopra §13.2 identity; ΦΦᵀ = M⁻¹)', () => {
    // Four nodes in space, six DOFs each, node 0 fully supported: 18 free DOFs. K and M are
    // random SPD matrices (invented; the identity holds for any SPD pair).
    const nodes: Array<[string, number, number, number]> = [['n0', 0, 0, 0], ['n1', 3, 0, 1], ['n2', 3, 4, 2], ['n3', 0, 4, 5]];
    const names: DofName[] = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'];
    const dofs: Array<[number, DofName]> = [];
    for (let nd = 1; nd < 4; nd++) for (const d of names) dofs.push([nd, d]);
    const K = sym(randomSpd(18, 21));
    const M = sym(randomSpd(18, 22, 0.5));
    const model = handModel('space', nodes, dofs, K, M);
    const modes = denseModes(K, M);
    const p = participation(model, modes);
    expect(p.directions).toEqual(names);
    for (const d of names) {
      const dp = p.byDirection[d]!;
      expect(dp.totalMass).toBeGreaterThan(0);
      expect(rel(dp.effectiveMasses.reduce((a, b) => a + b, 0), dp.totalMass)).toBeLessThan(1e-11);
      expect(Math.abs(dp.cumulativeRatios[17] - 1)).toBeLessThan(1e-11);
      for (let j = 1; j < 18; j++) expect(dp.cumulativeRatios[j]).toBeGreaterThanOrEqual(dp.cumulativeRatios[j - 1]);
    }
  });
  it('lumped masses in space: centre of mass and the moments of inertia about x and y', () => {
    // Definitions: I_x = Σ m((y − y_c)² + (z − z_c)²) + Σ J, I_y = Σ m((x − x_c)² + (z − z_c)²) + Σ J
    // (point masses with rotary inertia J on each rotational DOF); invented masses.
    const nodes: Array<[string, number, number, number]> = [['a', 0, 0, 0], ['b', 2, 1, 3], ['c', -1, 4, 1]];
    const ms = [10, 30, 20];
    const J = [1, 2, 3];
    const names: DofName[] = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'];
    const dofs: Array<[number, DofName]> = [];
    const diag: number[] = [];
    nodes.forEach((_, nd) => names.forEach((d) => { dofs.push([nd, d]); diag.push(d[0] === 'u' ? ms[nd] : J[nd]); }));
    const M = fromDenseArray(18, diag.flatMap((v, i) => diag.map((_, c) => (c === i ? v : 0))));
    const model = handModel('space', nodes, dofs, sym(randomSpd(18, 9)), M);
    const tot = 60;
    const c = [0, 1, 2].map((a) => ms.reduce((s, mi, nd) => s + mi * (nodes[nd][a + 1] as number), 0) / tot);
    const com = centreOfMass(model);
    for (let a = 0; a < 3; a++) expect(rel(com[a], c[a])).toBeLessThan(1e-14);
    const sq = (nd: number, a: number) => ((nodes[nd][a + 1] as number) - c[a]) ** 2;
    const Ix = ms.reduce((s, mi, nd) => s + mi * (sq(nd, 1) + sq(nd, 2)), 0) + 6;
    const Iy = ms.reduce((s, mi, nd) => s + mi * (sq(nd, 0) + sq(nd, 2)), 0) + 6;
    const p = participation(model, denseModes(model.stiffness, M));
    expect(rel(p.byDirection.rx!.totalMass, Ix)).toBeLessThan(1e-13);
    expect(rel(p.byDirection.ry!.totalMass, Iy)).toBeLessThan(1e-13);
    // u = θ × (x − p): about x, node b (2, 1, 3) with p = 0 moves uy = −3, uz = 1; about y, ux = 3, uz = −2.
    const rx = influenceVector(model, 'rx');
    const ry = influenceVector(model, 'ry');
    expect(Array.from(rx.subarray(6, 12))).toEqual([0, -3, 1, 1, 0, 0]);
    expect(Array.from(ry.subarray(6, 12))).toEqual([3, 0, -2, 0, 1, 0]);
  });
  it('modes of the wrong size: ArgumentError on "modes"', () => {
    const modes = denseModes(K2, M2);
    const model3 = handModel('plane', [['a', 0, 0, 0]], [[0, 'ux'], [0, 'uy'], [0, 'rz']], sym(randomSpd(3, 1)), sym(randomSpd(3, 2)));
    expect(thrown(() => participation(model3, modes)).path).toBe('modes');
  });
});

describe('summariseModes (the ModalAnalysis of the reports)', () => {
  const asEigen = (K: typeof K2, M: typeof M2) => {
    const d = denseModes(K, M);
    const flipped = Float64Array.from(d.vectors, (v) => -v); // any sign the solver may return
    return { ...d, vectors: flipped, residuals: new Float64Array(d.n), orthogonalityError: 0, method: 'cholesky' as const, stats: {} };
  };
  it('two-storey frame: frequency, period, 8/9 of the mass in mode 1 (closed form above); shapes oriented', () => {
    const eigen = asEigen(K2, M2);
    const before = Float64Array.from(eigen.vectors);
    const a = summariseModes(shear2, eigen, { directions: ['ux'] });
    expect(Array.from(eigen.vectors)).toEqual(Array.from(before));
    const f1 = Math.sqrt(k / (2 * m)) / (2 * Math.PI);
    expect(rel(a.modes[0].frequency, f1)).toBeLessThan(1e-12);
    expect(rel(a.modes[0].period, 1 / f1)).toBeLessThan(1e-12);
    expect(rel(a.modes[0].effectiveMassRatio.ux!, 8 / 9)).toBeLessThan(1e-12);
    expect(rel(a.modes[1].cumulativeRatio.ux!, 1)).toBeLessThan(1e-12);
    expect(rel(a.totalMass.ux!, 3 * m)).toBeLessThan(1e-15);
    expect(a.modes.map((x) => x.mode)).toEqual([1, 2]);
    expect(a.eigen.vectors[1]).toBeGreaterThan(0); // mode 1 peaks at the roof
    expect(a.title).toBe('');
  });
  it('free–free pair of masses: the rigid mode has f = 0, T = Infinity and all the ux mass', () => {
    // Closed form: K = k[[1, −1], [−1, 1]], M = m·I: λ₁ = 0 (φ₁ = [1, 1]/√(2m), Γ₁² = 2m),
    // λ₂ = 2k/m.
    const Kf = sym([
      [k, -k],
      [-k, k],
    ]);
    const Mf = sym([
      [m, 0],
      [0, m],
    ]);
    const free = handModel('plane', [['a', 0, 0, 0], ['b', 5, 0, 0]], [[0, 'ux'], [1, 'ux']], Kf, Mf);
    const a = summariseModes(free, asEigen(Kf, Mf), { directions: ['ux'] });
    expect(a.modes[0].frequency).toBeLessThan(1e-6);
    expect(Math.abs(a.modes[0].eigenvalue)).toBeLessThan(1e-6 * (k / m));
    expect(rel(a.modes[0].effectiveMassRatio.ux!, 1)).toBeLessThan(1e-12);
    expect(rel(a.modes[1].eigenvalue, (2 * k) / m)).toBeLessThan(1e-12);
    const exact = summariseModes(free, { ...asEigen(Kf, Mf), eigenvalues: Float64Array.from([-1e-12, (2 * k) / m]) }, { directions: ['ux'] });
    expect(exact.modes[0].frequency).toBe(0);
    expect(exact.modes[0].period).toBe(Infinity);
  });
});
