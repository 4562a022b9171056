/**
 * The catalogue of closed-form reference cases. Every exact value is computed from its theory
 * (theory.ts); parameters are round values of a steel member chosen for the demonstration, not
 * taken from any project. The stated `mesh` and `tolerance` were established by running each
 * case through eigenframe's assembly and solver (test/reference-solve.test.ts checks them).
 */
import type { DofName, MaterialSpec, SectionSpec } from '../model/types';
import { checkMesh, lineModel } from './build';
import { beamFrequency, beamRoots, bucklingFactors, checkCount, lowest, rodFrequencies, timoshenkoSimplySupported, tipMassRoots, type BeamSupports, type ColumnSupports } from './theory';
import type { ReferenceCase, ReferenceParameter } from './types';

// ---- Shared data -------------------------------------------------------------------------

const E = 2.1e11; // Pa
const G = 8.1e10; // Pa
const RHO = 7850; // kg/m³
const STEEL: MaterialSpec = { E, G, density: RHO };

function p(name: string, value: number, unit: string, description: string): ReferenceParameter {
  return { name, value, unit, description };
}

const materialParameters = (): ReferenceParameter[] => [
  p('E', E, 'Pa', "Young's modulus"),
  p('density', RHO, 'kg/m³', 'density'),
];

/** Prepends n zeros (rigid-body modes) to a list and keeps `count` values. */
function withRigid(rigid: number, elastic: (m: number) => number[], count: number): number[] {
  checkCount(count);
  const zeros = new Array<number>(Math.min(rigid, count)).fill(0);
  return [...zeros, ...elastic(Math.max(0, count - rigid))];
}

// ---- Axial bars (plane, kind "bar") --------------------------------------------------------

const BAR = { L: 10, A: 0.01 };

function barCase(ends: 'fixed-free' | 'free-free', mesh: number, tolerance: number, count: number): ReferenceCase {
  const c = Math.sqrt(E / RHO);
  const fixedFree = ends === 'fixed-free';
  const id = `bar-axial-${ends}`;
  return {
    id,
    description: fixedFree
      ? 'Axial vibration of a bar fixed at one end, free at the other'
      : 'Axial vibration of a free-free bar (first mode: rigid translation, 0 Hz)',
    source: fixedFree
      ? 'Wave equation of a uniform rod (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory): f_n = (2n − 1) c / (4L), c = √(E/ρ)'
      : 'Wave equation of a uniform rod (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory): f_n = (n − 1) c / (2L), c = √(E/ρ), n = 1 the rigid mode',
    quantity: 'frequency',
    parameters: [...materialParameters(), p('A', BAR.A, 'm²', 'area'), p('L', BAR.L, 'm', 'length')],
    meshUnit: 'bar elements along the length',
    mesh,
    tolerance,
    count,
    build(n: number) {
      checkMesh(n);
      return lineModel({
        title: `${id}, ${n} elements`,
        space: 'plane',
        kind: 'bar',
        material: STEEL,
        section: { A: BAR.A },
        length: BAR.L,
        elements: n,
        axis: 'x',
        // Transverse motion held (bar nodes have no rotation): the spectrum is axial only.
        supports: (i) => (fixedFree && i === 0 ? ['ux', 'uy'] : ['uy']),
      });
    },
    exact: (m: number) => rodFrequencies(ends, c, BAR.L, m),
  };
}

// ---- Euler–Bernoulli beams in the plane -----------------------------------------------------

const BEAM = { L: 5, A: 0.01, I: 2e-5 };

const BEAM_TEXT: Record<BeamSupports, { id: string; description: string; equation: string }> = {
  'clamped-free': { id: 'beam-cantilever', description: 'Bending of a cantilever (clamped at x = 0, free at x = L)', equation: '1 + cos β cosh β = 0' },
  'pinned-pinned': { id: 'beam-simply-supported', description: 'Bending of a simply supported beam', equation: 'sin β = 0, β = nπ' },
  'clamped-clamped': { id: 'beam-clamped-clamped', description: 'Bending of a beam clamped at both ends', equation: '1 − cos β cosh β = 0' },
  'clamped-pinned': { id: 'beam-clamped-pinned', description: 'Bending of a beam clamped at x = 0 and pinned at x = L', equation: 'tan β = tanh β' },
  'free-free': { id: 'beam-free-free', description: 'Bending of a free-free beam (two rigid-body modes at 0 Hz, then the elastic modes)', equation: '1 − cos β cosh β = 0 (elastic modes) plus two rigid-body modes' },
};

function beamSupports(supports: BeamSupports): (i: number, last: number) => DofName[] {
  const [a, b] = supports.split('-');
  const end = (kind: string): DofName[] => (kind === 'clamped' ? ['ux', 'uy', 'rz'] : kind === 'pinned' ? ['ux', 'uy'] : ['ux']);
  // Axial motion held at every node: the spectrum is bending only.
  return (i, last) => (i === 0 ? end(a) : i === last ? end(b) : ['ux']);
}

const EB_SOURCE = (equation: string) =>
  `Euler–Bernoulli beam theory (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory): f = β²/(2πL²) √(EI/(ρA)), β the roots of ${equation}, solved here by bracketing and bisection`;

function beamCase(supports: BeamSupports, mesh: number, tolerance: number, count: number): ReferenceCase {
  const t = BEAM_TEXT[supports];
  const f = (beta: number) => beamFrequency(beta, E, BEAM.I, RHO, BEAM.A, BEAM.L);
  return {
    id: t.id,
    description: t.description,
    source: EB_SOURCE(t.equation),
    quantity: 'frequency',
    parameters: [...materialParameters(), p('A', BEAM.A, 'm²', 'area'), p('I', BEAM.I, 'm⁴', 'second moment of area (Iz)'), p('L', BEAM.L, 'm', 'span')],
    meshUnit: 'beam elements along the span',
    mesh,
    tolerance,
    count,
    build(n: number) {
      return lineModel({
        title: `${t.id}, ${n} elements`,
        space: 'plane',
        kind: 'beam',
        material: STEEL,
        section: { A: BEAM.A, Iz: BEAM.I },
        length: BEAM.L,
        elements: n,
        axis: 'x',
        supports: beamSupports(supports),
      });
    },
    exact: (m: number) => withRigid(supports === 'free-free' ? 2 : 0, (k) => beamRoots(supports, k).map(f), m),
  };
}

// ---- Cantilever with a tip mass ------------------------------------------------------------

const TIP_MASS = 200; // kg; the beam itself is ρAL = 392.5 kg

function tipMassCase(mesh: number, tolerance: number, count: number): ReferenceCase {
  const beamMass = RHO * BEAM.A * BEAM.L;
  const mu = TIP_MASS / beamMass;
  const f = (beta: number) => beamFrequency(beta, E, BEAM.I, RHO, BEAM.A, BEAM.L);
  return {
    id: 'beam-cantilever-tip-mass',
    description: 'Bending of a cantilever carrying a point mass (no rotary inertia) at its free end',
    source:
      'Euler–Bernoulli beam theory with the tip condition EI w\'\'\' = −m_tip ω² w (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory; equation derived in src/reference/theory.ts): 1 + cos β cosh β + μβ(cos β sinh β − sin β cosh β) = 0, μ = m_tip/(ρAL), solved by bracketing and bisection',
    quantity: 'frequency',
    parameters: [
      ...materialParameters(),
      p('A', BEAM.A, 'm²', 'area'),
      p('I', BEAM.I, 'm⁴', 'second moment of area (Iz)'),
      p('L', BEAM.L, 'm', 'span'),
      p('mTip', TIP_MASS, 'kg', 'point mass at the free end'),
      p('mu', mu, '-', 'tip mass / beam mass'),
    ],
    meshUnit: 'beam elements along the span',
    mesh,
    tolerance,
    count,
    build(n: number) {
      checkMesh(n);
      return lineModel({
        title: `beam-cantilever-tip-mass, ${n} elements`,
        space: 'plane',
        kind: 'beam',
        material: STEEL,
        section: { A: BEAM.A, Iz: BEAM.I },
        length: BEAM.L,
        elements: n,
        axis: 'x',
        supports: beamSupports('clamped-free'),
        masses: [{ node: `n${n}`, mass: TIP_MASS }],
      });
    },
    exact: (m: number) => tipMassRoots(mu, m).map(f),
  };
}

// ---- Thick Timoshenko beam, simply supported ------------------------------------------------

// Rectangle 0.2 m wide, 0.5 m deep, span 2.5 m: L/h = 5.
const THICK = { L: 2.5, b: 0.2, h: 0.5, kappa: 5 / 6 };

function timoshenkoCase(mesh: number, tolerance: number, count: number): ReferenceCase {
  const A = THICK.b * THICK.h;
  const I = (THICK.b * THICK.h ** 3) / 12;
  const beam = { E, G, density: RHO, A, I, kappa: THICK.kappa, L: THICK.L };
  return {
    id: 'timoshenko-simply-supported',
    description: 'Bending of a thick (L/h = 5) simply supported beam with shear deformation and rotary inertia',
    source:
      'Timoshenko beam theory (Timoshenko 1921; Han, Benaroya & Wei, J. Sound Vib. 225 (1999), from memory): for k = nπ/L, ρAρI ω⁴ − (κGAρI k² + ρA EI k² + ρA κGA) ω² + κGA EI k⁴ = 0, both roots, plus the pure-shear mode ω² = κGA/(ρI); all merged and sorted',
    quantity: 'frequency',
    parameters: [
      ...materialParameters(),
      p('G', G, 'Pa', 'shear modulus'),
      p('A', A, 'm²', 'area (0.2 m × 0.5 m rectangle)'),
      p('I', I, 'm⁴', 'second moment of area (Iz)'),
      p('kappa', THICK.kappa, '-', 'shear correction factor (5/6, common practice for a rectangle)'),
      p('L', THICK.L, 'm', 'span'),
    ],
    meshUnit: 'Timoshenko elements along the span',
    mesh,
    tolerance,
    count,
    build(n: number) {
      return lineModel({
        title: `timoshenko-simply-supported, ${n} elements`,
        space: 'plane',
        kind: 'timoshenko',
        material: STEEL,
        section: { A, Iz: I, kappa: THICK.kappa },
        length: THICK.L,
        elements: n,
        axis: 'x',
        supports: beamSupports('pinned-pinned'),
      });
    },
    exact: (m: number) => timoshenkoSimplySupported(beam, m),
  };
}

// ---- Torsional shaft (space) ----------------------------------------------------------------

// Solid circular shaft, diameter 0.1 m, length 2 m: J = Ip = πd⁴/32, Iy = Iz = πd⁴/64.
const SHAFT = { L: 2, d: 0.1 };

function shaftCase(mesh: number, tolerance: number, count: number): ReferenceCase {
  const J = (Math.PI * SHAFT.d ** 4) / 32;
  const A = (Math.PI * SHAFT.d ** 2) / 4;
  const c = Math.sqrt((G * J) / (RHO * J));
  return {
    id: 'shaft-torsion-fixed-free',
    description: 'Torsional vibration of a solid circular shaft fixed at one end, free at the other',
    source:
      'Wave equation of a shaft in torsion (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory): f_n = (2n − 1) c / (4L), c = √(GJ/(ρ Ip)) = √(G/ρ) for a circle (J = Ip)',
    quantity: 'frequency',
    parameters: [
      ...materialParameters(),
      p('G', G, 'Pa', 'shear modulus'),
      p('d', SHAFT.d, 'm', 'diameter'),
      p('J', J, 'm⁴', 'torsion constant πd⁴/32'),
      p('Ip', J, 'm⁴', 'polar moment for torsional inertia (= J for a circle)'),
      p('L', SHAFT.L, 'm', 'length'),
    ],
    meshUnit: 'space beam elements along the length',
    mesh,
    tolerance,
    count,
    build(n: number) {
      return lineModel({
        title: `shaft-torsion-fixed-free, ${n} elements`,
        space: 'space',
        kind: 'beam',
        material: STEEL,
        section: { A, Iy: J / 2, Iz: J / 2, J, Ip: J },
        length: SHAFT.L,
        elements: n,
        axis: 'x',
        // Only the twist rx is free (and held at the root): the spectrum is torsional only.
        supports: (i) => (i === 0 ? ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] : ['ux', 'uy', 'uz', 'ry', 'rz']),
      });
    },
    exact: (m: number) => rodFrequencies('fixed-free', c, SHAFT.L, m),
  };
}

// ---- Two-span continuous beam ---------------------------------------------------------------

function twoSpanCase(mesh: number, tolerance: number, count: number): ReferenceCase {
  const f = (beta: number) => beamFrequency(beta, E, BEAM.I, RHO, BEAM.A, BEAM.L);
  return {
    id: 'beam-two-span',
    description: 'Bending of a continuous beam over two equal spans on three pinned supports (clustered pairs of frequencies)',
    source:
      'Euler–Bernoulli beam theory; by symmetry each mode of two equal spans is antisymmetric (zero moment at the middle support: each span pinned-pinned, β = nπ) or symmetric (zero slope there: each span clamped-pinned, tan β = tanh β); both sets merged (Blevins, Formulas for Natural Frequency and Mode Shape (1979), continuous beams, from memory)',
    quantity: 'frequency',
    parameters: [...materialParameters(), p('A', BEAM.A, 'm²', 'area'), p('I', BEAM.I, 'm⁴', 'second moment of area (Iz)'), p('L', BEAM.L, 'm', 'each span')],
    meshUnit: 'beam elements per span',
    mesh,
    tolerance,
    count,
    build(n: number) {
      checkMesh(n);
      return lineModel({
        title: `beam-two-span, ${n} elements per span`,
        space: 'plane',
        kind: 'beam',
        material: STEEL,
        section: { A: BEAM.A, Iz: BEAM.I },
        length: 2 * BEAM.L,
        elements: 2 * n,
        axis: 'x',
        supports: (i, last) => (i === 0 || i === n || i === last ? ['ux', 'uy'] : ['ux']),
      });
    },
    exact: (m: number) => {
      checkCount(m);
      return lowest([beamRoots('pinned-pinned', m).map(f), beamRoots('clamped-pinned', m).map(f)], m);
    },
  };
}

// ---- Space-frame mast -----------------------------------------------------------------------

// Square hollow section 0.4 m × 0.4 m × 12 mm (centre-line 0.388 m), mast 20 m tall.
const MAST = { L: 20, b: 0.4, t: 0.012 };

function mastCase(mesh: number, tolerance: number, count: number): ReferenceCase {
  const bi = MAST.b - 2 * MAST.t;
  const A = MAST.b ** 2 - bi ** 2;
  const I = (MAST.b ** 4 - bi ** 4) / 12;
  const bm = MAST.b - MAST.t; // centre-line width
  // Bredt's thin-walled torsion constant 4A_m² t / s = bm³ t (Timoshenko & Goodier, Theory of
  // Elasticity, torsion of thin tubes, from memory); it only has to be the J the exact values use.
  const J = bm ** 3 * MAST.t;
  const Ip = 2 * I;
  const section: SectionSpec = { A, Iy: I, Iz: I, J, Ip };
  return {
    id: 'mast-space-cantilever',
    description: 'Vertical cantilever mast in space, square hollow section: repeated bending pairs, torsion and axial modes',
    source:
      'Euler–Bernoulli cantilever (1 + cos β cosh β = 0) in two equal planes, each frequency twice; torsion f = (2n − 1)/(4L) √(GJ/(ρ Ip)); axial f = (2n − 1)/(4L) √(E/ρ) (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed. (1974), ch. 5, from memory); all merged and sorted',
    quantity: 'frequency',
    parameters: [
      ...materialParameters(),
      p('G', G, 'Pa', 'shear modulus'),
      p('A', A, 'm²', 'area (0.4 m square tube, 12 mm wall)'),
      p('I', I, 'm⁴', 'second moment of area, Iy = Iz'),
      p('J', J, 'm⁴', 'torsion constant (Bredt, thin wall)'),
      p('Ip', Ip, 'm⁴', 'polar moment for torsional inertia, Iy + Iz'),
      p('L', MAST.L, 'm', 'height'),
    ],
    meshUnit: 'space beam elements along the height',
    mesh,
    tolerance,
    count,
    build(n: number) {
      return lineModel({
        title: `mast-space-cantilever, ${n} elements`,
        space: 'space',
        kind: 'beam',
        material: STEEL,
        section,
        length: MAST.L,
        elements: n,
        axis: 'z',
        orientation: [1, 0, 0],
        supports: (i) => (i === 0 ? ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] : []),
      });
    },
    exact: (m: number) => {
      checkCount(m);
      const bending = beamRoots('clamped-free', m).map((beta) => beamFrequency(beta, E, I, RHO, A, MAST.L));
      const torsion = rodFrequencies('fixed-free', Math.sqrt((G * J) / (RHO * Ip)), MAST.L, m);
      const axial = rodFrequencies('fixed-free', Math.sqrt(E / RHO), MAST.L, m);
      return lowest([bending, bending, torsion, axial], m);
    },
  };
}

// ---- Euler buckling -------------------------------------------------------------------------

const COLUMN = { L: 4, A: 0.01, I: 2e-5 };

const COLUMN_TEXT: Record<ColumnSupports, { K: string; equation: string; description: string }> = {
  'fixed-free': { K: '= 2', equation: 'cos kL = 0', description: 'Euler buckling of a column fixed at the base, free at the top' },
  'pinned-pinned': { K: '= 1', equation: 'sin kL = 0', description: 'Euler buckling of a column pinned at both ends' },
  'fixed-pinned': { K: '≈ 0.699', equation: 'tan kL = kL', description: 'Euler buckling of a column fixed at the base, pinned at the top' },
  'fixed-fixed': { K: '= 0.5', equation: '2(1 − cos kL) − kL sin kL = 0', description: 'Euler buckling of a column fixed at both ends (top free to move axially)' },
};

function bucklingCase(supports: ColumnSupports, mesh: number, tolerance: number, count: number): ReferenceCase {
  const t = COLUMN_TEXT[supports];
  const PE = (Math.PI ** 2 * E * COLUMN.I) / COLUMN.L ** 2;
  const [base, top] = supports.split('-');
  return {
    id: `buckling-${supports}`,
    description: `${t.description}; load factors of P_E = π²EI/L²`,
    source: `Euler column, EI w'''' + P w'' = 0 (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed. (1961), ch. 2, from memory): P_cr = (kL/π)² P_E with kL the roots of ${t.equation}; first mode P_E/K², K ${t.K}`,
    quantity: 'buckling',
    parameters: [
      p('E', E, 'Pa', "Young's modulus"),
      p('A', COLUMN.A, 'm²', 'area'),
      p('I', COLUMN.I, 'm⁴', 'second moment of area (Iz)'),
      p('L', COLUMN.L, 'm', 'height'),
      p('PE', PE, 'N', 'reference load π²EI/L², applied downward at the top'),
    ],
    meshUnit: 'beam elements along the height',
    mesh,
    tolerance,
    count,
    loads(n: number) {
      checkMesh(n);
      return [{ node: `n${n}`, dof: 'uy', force: -PE }];
    },
    build(n: number) {
      checkMesh(n);
      // Vertical column along y, base at the origin; the top stays free to move along y so
      // that the load compresses the column.
      const end = (kind: string, atTop: boolean): DofName[] =>
        kind === 'fixed' ? (atTop ? ['ux', 'rz'] : ['ux', 'uy', 'rz']) : kind === 'pinned' ? (atTop ? ['ux'] : ['ux', 'uy']) : [];
      return lineModel({
        title: `buckling-${supports}, ${n} elements`,
        space: 'plane',
        kind: 'beam',
        material: STEEL,
        section: { A: COLUMN.A, Iz: COLUMN.I },
        length: COLUMN.L,
        elements: n,
        axis: 'y',
        supports: (i, last) => (i === 0 ? end(base, false) : i === last ? end(top, true) : []),
      });
    },
    exact: (m: number) => bucklingFactors(supports, m),
  };
}

// ---- The catalogue --------------------------------------------------------------------------

/**
 * Builds every case. Mesh, tolerance and count were established by running each case through
 * assemble + the dense solver (buckling: with the consistent geometric stiffness
 * P/(30L)·[36 3L −36 3L; …], Przemieniecki 1968, stability chapter, from memory) and taking the smallest mesh whose
 * largest relative error is ≤ 0.9 × tolerance, rounded up. Linear bar and torsion elements and
 * the Timoshenko element (constant shear strain) converge as h², the Hermite beams as h⁴.
 */
export function buildCatalogue(): ReferenceCase[] {
  return [
    barCase('fixed-free', 100, 1e-3, 5), // smallest passing mesh 97
    barCase('free-free', 90, 1e-3, 5), // 86
    beamCase('clamped-free', 30, 1e-4, 6), // 29
    beamCase('pinned-pinned', 35, 1e-4, 6), // 32
    beamCase('clamped-clamped', 35, 1e-4, 6), // 34
    beamCase('clamped-pinned', 35, 1e-4, 6), // 33
    beamCase('free-free', 25, 1e-4, 6), // 24
    tipMassCase(30, 1e-4, 6), // 28
    timoshenkoCase(65, 1e-3, 4), // 63
    shaftCase(100, 1e-3, 5), // 97
    twoSpanCase(20, 1e-4, 6), // 17 per span
    mastCase(35, 1e-4, 10), // 34
    bucklingCase('fixed-free', 24, 1e-4, 4), // 22
    bucklingCase('pinned-pinned', 26, 1e-4, 4), // 25
    bucklingCase('fixed-pinned', 30, 1e-4, 4), // 28
    bucklingCase('fixed-fixed', 32, 1e-4, 4), // 31
  ];
}
