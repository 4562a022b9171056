// Mast modes: an (invented) 24 m square steel mast with equipment at the top. A square tube
// bends equally about both axes, so every bending frequency comes twice (a repeated pair); the
// solver must return both copies, and the Sturm count proves that it did. Each frequency is set
// beside its closed form.
//
//   npm run build && node docs/examples/mast-modes.mjs
//
// Closed forms (Euler–Bernoulli cantilever and fixed–free rods; Timoshenko, Young & Weaver,
// Vibration Problems in Engineering, ch. 5, from memory), with μ = head mass / mast mass:
// - bending, tip mass without rotary inertia: 1 + cos β cosh β + μβ(cos β sinh β − sin β cosh β) = 0,
//   f = β²/(2πL²) √(EI/(ρA));
// - torsion (the head mass has no rotary inertia): f = (2n − 1)/(4L) √(GJ/(ρ Ip));
// - axial, rod with an end mass: μ β sin β = cos β, f = β/(2πL) √(E/ρ).
// Bending uses cubic elements (error falling as h⁴), axial and torsion linear ones (as h²).
// Finally the vertical load at the top that buckles the mast, beside Euler's fixed–free column
// P = π²EI/(2L)² (Timoshenko & Gere, Theory of Elastic Stability, ch. 2; from memory).

import { beamFrequency, bucklingAnalysis, findRoots, modalAnalysis, rodFrequencies, tipMassRoots, validateModel } from 'eigenframe';
import { STEEL, boxSection, squareMast } from './structures.mjs';

const HEIGHT = 24; // m
const WIDTH = 0.25; // m, SHS 250 × 10
const WALL = 0.01; // m
const HEAD_MASS = 200; // kg: antennas and their brackets (invented)
const ELEMENTS = 24;
const COUNT = 14;

const model = validateModel(squareMast({ height: HEIGHT, elements: ELEMENTS, width: WIDTH, wall: WALL, headMass: HEAD_MASS }));
// 144 DOFs would go to the dense solver by default; shift-invert Lanczos is asked for here to show
// that the sparse path returns both copies of every pair, which the Sturm count then proves (had
// one been missed, the solver would have run again from a start vector M-orthogonal to the modes
// found; `stats.rounds` counts such reruns).
const result = modalAnalysis(model, { count: COUNT, method: 'lanczos' });

// Closed-form values of each kind of mode.
const s = boxSection(WIDTH, WIDTH, WALL);
const { E, G, density } = STEEL;
const mu = HEAD_MASS / (density * s.A * HEIGHT);
const bending = tipMassRoots(mu, COUNT).map((beta) => beamFrequency(beta, E, s.Iy, density, s.A, HEIGHT));
const torsion = rodFrequencies('fixed-free', Math.sqrt((G * s.J) / (density * (s.Iy + s.Iz))), HEIGHT, COUNT);
const axial = findRoots((b) => mu * b * Math.sin(b) - Math.cos(b), 0.01, COUNT).map((b) => (b / (2 * Math.PI * HEIGHT)) * Math.sqrt(E / density));

/** The kind of a mode: the direction with the largest effective mass ratio. */
function kindOf(mode) {
  const r = mode.effectiveMassRatio;
  const kinds = [
    ['bending', (r.ux ?? 0) + (r.uy ?? 0)],
    ['axial', r.uz ?? 0],
    ['torsion', r.rz ?? 0],
  ];
  kinds.sort((a, b) => b[1] - a[1]);
  return kinds[0][0];
}

console.log(`${model.title}, head mass ${HEAD_MASS} kg, ${ELEMENTS} space beam elements`);
console.log(`${result.assembled.dofs.length} free DOFs; solver ${result.eigen.method}\n`);
console.log('mode  frequency Hz   ux mass   uy mass   uz mass   rz mass  kind      closed form Hz  rel. diff');
const seen = { bending: 0, axial: 0, torsion: 0 };
for (const m of result.modes) {
  const kind = kindOf(m);
  const k = seen[kind]++;
  // A pair shares one closed-form value: the n-th bending frequency appears as modes 2n−1, 2n.
  const exact = kind === 'bending' ? bending[Math.floor(k / 2)] : kind === 'axial' ? axial[k] : torsion[k];
  const pct = (x) => `${(100 * (x ?? 0)).toFixed(1)}%`.padStart(8);
  const r = m.effectiveMassRatio;
  console.log(
    `${String(m.mode).padStart(4)}  ${m.frequency.toFixed(4).padStart(12)}  ${pct(r.ux)}  ${pct(r.uy)}  ${pct(r.uz)}  ${pct(r.rz)}  ` +
      `${kind.padEnd(8)}  ${exact.toFixed(4).padStart(14)}  ${((m.frequency - exact) / exact).toExponential(1).padStart(9)}`,
  );
}

const [a, b] = result.modes;
const sturm = result.eigen.sturm;
console.log(`\nFirst bending pair: ${a.frequency.toFixed(6)} Hz and ${b.frequency.toFixed(6)} Hz, relative split ${(Math.abs(b.frequency - a.frequency) / a.frequency).toExponential(1)}.`);
console.log(
  '  Within a pair any two M-orthonormal shapes in the plane are modes, so the split of the effective mass\n' +
    '  between ux and uy is arbitrary; their sum (the pair) is what the structure has.',
);
console.log(
  `Verification: largest residual ${Math.max(...result.eigen.residuals).toExponential(1)}, M-orthonormality error ` +
    `${result.eigen.orthogonalityError.toExponential(1)}, Sturm count ${sturm?.countBelow} modes below ` +
    `${(Math.sqrt(sturm?.shift ?? 0) / (2 * Math.PI)).toFixed(3)} Hz, ${sturm?.returnedBelow} returned: ${sturm?.passed ? 'none missed' : 'MISSED MODES'}` +
    ` (reruns: ${result.eigen.stats.rounds}).`,
);

// Linear buckling under a reference load of 1 kN down at the top (self-weight not included):
// the load factors are the critical loads in kN. A square tube buckles alike both ways, so the
// first factor comes twice too.
const top = model.nodes[model.nodes.length - 1].id;
const buckling = bucklingAnalysis(model, [{ node: top, dof: 'uz', value: -1000 }], { count: 2 });
const euler = (Math.PI ** 2 * E * s.Iy) / (4 * HEIGHT * HEIGHT);
const [p1, p2] = buckling.loadFactors;
console.log(
  `\nBuckling under a load at the top: ${p1.toFixed(2)} kN and ${p2.toFixed(2)} kN (a pair); ` +
    `Euler fixed-free ${(euler / 1000).toFixed(2)} kN, rel. diff ${((p1 * 1000 - euler) / euler).toExponential(1)}; Sturm count ${buckling.sturm?.passed ? 'passed' : 'not made'}.`,
);
