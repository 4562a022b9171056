// Footbridge screening: an (invented) 20 m steel footbridge is screened against the bands in
// which walkers excite a structure, and its box girder is made deeper until no mode sits in or
// near a band — for the deck mass as estimated and for 20 % less and more.
//
//   npm run build && node docs/examples/footbridge-screening.mjs
//
// The bands are eigenframe's presets (walking pace 1.6–2.4 Hz vertical and longitudinal, its
// second harmonic 3.2–4.8 Hz, lateral sway 0.5–1.2 Hz); their sources are listed with each
// preset and were recalled, not read from the documents (`fromMemory: true`). A clear screen is
// a first check, not a comfort verdict: a response check and the governing guidance decide.

import { bandPreset, modalAnalysis, screenResonance, stiffnessScaleFor, validateModel } from 'eigenframe';
import { STEEL, boxSection, footbridgeDeck } from './structures.mjs';

const SPAN = 20; // m
const ELEMENTS = 20;
const DECK_MASS = 450; // kg/m: timber deck, cross girders, parapets (invented)
const DECK_WIDTH = 2.5; // m
const GIRDER_WIDTH = 0.6; // m
const WALL = 0.016; // m
const FIRST_DEPTH = 0.4; // m, the first design
const DEPTHS = Array.from({ length: 21 }, (_, i) => Math.round((FIRST_DEPTH + 0.05 * i) * 100) / 100); // 0.40 … 1.40 m
const MASS_BRACKET = [0.8, 1.2]; // the deck mass is an estimate: screen it ±20 % as well

const bands = ['walking-vertical', 'walking-vertical-2', 'walking-lateral', 'walking-longitudinal'].map(bandPreset);

/** Modal analysis and screening of one design. */
function screen(depth, deckMassFactor = 1) {
  const girder = boxSection(GIRDER_WIDTH, depth, WALL);
  // validateModel checks a model built in code as parseModel checks a file (typed errors with paths).
  const model = validateModel(footbridgeDeck({ span: SPAN, elements: ELEMENTS, girder, deckMass: DECK_MASS * deckMassFactor, deckWidth: DECK_WIDTH }));
  const analysis = modalAnalysis(model, { count: 8 });
  const screening = screenResonance(analysis, bands);
  if (!screening.coverage.complete) {
    // 8 modes did not reach past the top band edge plus the clearance: ask for more.
    throw new Error(`modes reach only ${screening.coverage.coveredFrequency.toFixed(2)} Hz; raise count`);
  }
  return { girder, analysis, screening };
}

/** First mode whose dominant motion is `direction`, or undefined. */
const first = (screening, direction) => screening.modes.find((m) => m.direction === direction);

/**
 * Closed form of the first vertical frequency of a simply supported uniform beam,
 * f1 = (π / 2L²) √(EI / m), m the mass per metre (Euler–Bernoulli; e.g. Timoshenko, Young &
 * Weaver, Vibration Problems in Engineering, ch. 5; from memory). A sanity check of the model.
 */
const closedForm = (girder) => (Math.PI / (2 * SPAN * SPAN)) * Math.sqrt((STEEL.E * girder.Iy) / (STEEL.density * girder.A + DECK_MASS));

console.log(`Footbridge screening: ${SPAN} m span, ${ELEMENTS} elements, box girder ${GIRDER_WIDTH * 1000} mm wide, ${WALL * 1000} mm wall, deck ${DECK_MASS} kg/m, ${DECK_WIDTH} m wide`);
console.log(`Bands: ${bands.map((b) => `${b.name} ${b.fLow}-${b.fHigh} Hz`).join(', ')}; clearance 10 %\n`);

// ---- 1. The first design, and what it would take to clear the band ------------------------------
const base = screen(FIRST_DEPTH);
console.log(`1. First design, girder depth ${FIRST_DEPTH.toFixed(2)} m: ${base.screening.verdict}`);
for (const m of base.screening.modes) {
  for (const c of m.checks) {
    console.log(
      `   mode ${m.mode} (${m.direction}) ${m.frequency.toFixed(4)} Hz is ${c.status} ${c.band}; nearer clear frequency ${c.target.toFixed(2)} Hz, ` +
        `stiffness factor (target/f)² = ${c.stiffnessFactor.toFixed(4)}`,
    );
  }
}
// What-if: the factor on the girder's stiffness (mass unchanged) that moves the first vertical
// mode to each target, found by re-solving (Newton on λ(α), one pattern analysis shared). The
// girder is the whole structure here, so it equals the Rayleigh factor above; in a structure
// with several member groups the two differ, and the what-if is the one to trust.
const vertical = first(base.screening, 'vertical');
const c = base.screening.clearance;
const [pace, second] = [bandPreset('walking-vertical'), bandPreset('walking-vertical-2')];
const windowLow = pace.fHigh * (1 + c); // above the pace band …
const windowHigh = second.fLow * (1 - c); // … and below its second harmonic
const allClear = second.fHigh * (1 + c); // above both vertical bands
for (const target of [windowLow, allClear]) {
  const r = stiffnessScaleFor(base.analysis, { section: 'girder' }, { mode: vertical.mode, frequency: target });
  console.log(`   what-if: girder stiffness x${r.stiffnessScale.toFixed(4)} puts mode ${vertical.mode} at ${r.frequency.toFixed(4)} Hz (${r.iterations} re-solves)`);
}
console.log(
  `   Between ${windowLow.toFixed(2)} and ${windowHigh.toFixed(2)} Hz a vertical mode clears both vertical bands, but only by a narrow window;` +
    ` above ${allClear.toFixed(2)} Hz it clears them all. A deeper girder is also heavier, so Iy must grow by more than these factors.\n`,
);

// ---- 2. Deeper girders, screened for the deck mass as estimated and ±20 % ------------------------
console.log('2. Deeper girders');
console.log('depth  girder  vertical f1  closed form  lateral f1  torsion f1  verdict     deck -20 %  deck +20 %');
console.log('    m    kg/m           Hz           Hz          Hz          Hz');
let chosen;
for (const depth of DEPTHS) {
  const { girder, analysis, screening } = screen(depth);
  const bracket = MASS_BRACKET.map((k) => screen(depth, k).screening.verdict);
  const v = first(screening, 'vertical');
  const l = first(screening, 'lateral');
  const t = first(screening, 'torsional');
  console.log(
    [
      depth.toFixed(2).padStart(5),
      (STEEL.density * girder.A).toFixed(0).padStart(7),
      (v?.frequency.toFixed(4) ?? '-').padStart(12),
      closedForm(girder).toFixed(4).padStart(12),
      (l?.frequency.toFixed(3) ?? '-').padStart(11),
      (t?.frequency.toFixed(3) ?? '-').padStart(11),
      ` ${screening.verdict.padEnd(10)}`,
      bracket[0].padEnd(10),
      bracket[1],
    ].join(' '),
  );
  if (!chosen && screening.verdict === 'clear' && bracket.every((b) => b === 'clear')) chosen = { depth, analysis, screening };
}

if (!chosen) {
  console.error(`No girder depth up to ${DEPTHS[DEPTHS.length - 1]} m clears the bands for every deck mass; widen the search or change the concept.`);
  process.exit(1);
}

// ---- 3. The chosen design ---------------------------------------------------------------------
const { depth, analysis, screening } = chosen;
const g0 = base.girder;
const g1 = boxSection(GIRDER_WIDTH, depth, WALL);
const perMetre = (g) => STEEL.density * g.A + DECK_MASS;
console.log(`\n3. Chosen girder depth: ${depth.toFixed(2)} m (clear for the deck mass -20 %, as estimated and +20 %).`);
console.log(
  `   Over the first design: Iy x${(g1.Iy / g0.Iy).toFixed(2)}, mass per metre x${(perMetre(g1) / perMetre(g0)).toFixed(2)}, ` +
    `stiffness per mass x${(g1.Iy / perMetre(g1) / (g0.Iy / perMetre(g0))).toFixed(2)}. Its modes:`,
);
console.log('mode  frequency Hz  direction      vertical  lateral  longit.  torsion  verdict');
for (const m of screening.modes) {
  const s = m.shares;
  const pct = (x) => `${(100 * x).toFixed(1)}%`.padStart(8);
  console.log(
    `${String(m.mode).padStart(4)}  ${m.frequency.toFixed(4).padStart(12)}  ${m.direction.padEnd(13)}${pct(s.vertical)} ${pct(s.lateral)} ${pct(s.longitudinal)} ${pct(s.torsional)}  ${m.verdict}`,
  );
}
const sturm = analysis.eigen.sturm;
console.log(
  `\nCoverage: modes up to ${screening.coverage.coveredFrequency.toFixed(2)} Hz, needed ${screening.coverage.requiredFrequency.toFixed(2)} Hz` +
    ` (Sturm count ${sturm?.passed ? 'passed' : 'not made'}: ${sturm?.countBelow} modes below the check shift).`,
);
console.log('Screening supports, and never replaces, design to the local codes by a licensed engineer.');
