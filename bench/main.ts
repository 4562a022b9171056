/**
 * eigenframe benchmark: `npm run bench [-- --quick] [-- --case NAME ...]`.
 *
 * Each (case, engine) runs in its own child process (this same script with `--child`), so the
 * peak memory reported is that case's own. Baselines run in the same invocation on the same K
 * and M: SciPy's eigsh (when python3 has SciPy) on every case, and, on the plane frames of
 * 300–1,500 DOF, our dense solver and ml-matrix's dense route. Prints one report to stdout
 * (progress goes to stderr) and writes bench/out/results.json.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { CASES, selectCases } from './cases';
import type { BenchCase } from './cases';
import { MODE_COUNT, prepareCase, runCase } from './child';
import type { CaseRecord } from './child';
import type { EngineName } from './engine';
import { growthExponent } from './fit';
import { fmtCount, fmtMiB, fmtRatio, fmtSci, fmtSeconds, maxRelativeDifference, renderTable } from './table';
import { formatBatchBench, runBatchBench } from './batch';

type Outcome = (CaseRecord & { note?: string }) | { case: string; engine: EngineName; error: string };

/** What bench/scipy_eigsh.py prints. */
interface ScipyRecord {
  seconds: number;
  cpu_seconds: number;
  read_seconds: number;
  maxrss_mib: number;
  solve_peak_mib: number | null;
  rss_before_solve_mib: number | null;
  n: number;
  nnz_lower: number;
  eigenvalues: number[];
}

interface Flags {
  quick: boolean;
  cases: string[];
  /** Per-child time limit, minutes. */
  timeoutMinutes: number;
  /** Alternating runs of ours and SciPy on the target cases (median reported). */
  rounds: number;
}

/** Default of `--rounds`: one run on this shared machine can be off by a third either way. */
const DEFAULT_ROUNDS = 3;

const USAGE = `usage: npm run bench -- [--quick] [--case NAME]... [--timeout-min N] [--rounds N] | --batch
cases: ${CASES.map((c) => c.name).join(', ')} (or a family: building, footbridge, dense)`;

function parseFlags(argv: readonly string[]): Flags {
  const flags: Flags = { quick: false, cases: [], timeoutMinutes: 10, rounds: DEFAULT_ROUNDS };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--quick') flags.quick = true;
    else if (a === '--case' && i + 1 < argv.length) flags.cases.push(argv[++i]);
    else if (a === '--timeout-min' && i + 1 < argv.length) flags.timeoutMinutes = Number(argv[++i]);
    else if (a === '--rounds' && i + 1 < argv.length && /^[1-9][0-9]*$/.test(argv[i + 1])) flags.rounds = Number(argv[++i]);
    else {
      process.stderr.write(`bench: unknown or incomplete flag "${a}"\n${USAGE}\n`);
      process.exit(2);
    }
  }
  const known = new Set([...CASES.map((c) => c.name), 'building', 'footbridge', 'dense']);
  for (const n of flags.cases) {
    if (!known.has(n)) {
      process.stderr.write(`bench: no case "${n}"\n${USAGE}\n`);
      process.exit(2);
    }
  }
  return flags;
}

// ---- child side ----

function childMain(argv: readonly string[]): void {
  const [name, engine, outFile, dir, mtx] = argv;
  const c = CASES.find((x) => x.name === name);
  if (!c) throw new Error(`no case ${name}`);
  if (engine === 'prepare') {
    prepareCase(c, dir, mtx === 'mtx');
    return;
  }
  const record = runCase(c, engine as EngineName, dir);
  // Write then rename, so the parent never reads a half-written record.
  writeFileSync(`${outFile}.part`, JSON.stringify(record));
  renameSync(`${outFile}.part`, outFile);
}

// ---- parent side ----

/** Seconds a child may take to exit after writing its record before it is killed. */
const EXIT_GRACE_MS = 20_000;

/**
 * Builds and assembles a case in a child process of its own and leaves K and M in `dir` (binary,
 * and Matrix Market when `mtx`); returns an error text, or undefined when it worked.
 */
function prepareInChild(c: BenchCase, dir: string, mtx: boolean, timeoutMs: number): string | undefined {
  mkdirSync(dir, { recursive: true });
  const args = [...process.execArgv, process.argv[1], '--child', c.name, 'prepare', '', dir, mtx ? 'mtx' : ''];
  const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'inherit', 'inherit'], timeout: timeoutMs });
  if (r.status === 0 && existsSync(join(dir, 'prep.json'))) return undefined;
  return `preparing the matrices failed (${r.signal ? `killed by ${r.signal}` : `exit status ${r.status}`})`;
}

/**
 * Runs one measurement in a child process. The record file is what counts: a child that wrote it
 * but does not exit within EXIT_GRACE_MS is killed (and the note says so); one that runs past
 * the time limit is killed without a record.
 */
function runChild(c: BenchCase, engine: EngineName, work: string, dir: string, timeoutMs: number): Promise<Outcome> {
  const out = join(work, `${c.name}.${engine}.json`);
  rmSync(out, { force: true }); // a previous round's record must not count as this one's
  const args = [...process.execArgv, '--expose-gc', process.argv[1], '--child', c.name, engine, out, dir];
  return new Promise((done) => {
    const child = spawn(process.execPath, args, { stdio: ['ignore', 'inherit', 'inherit'] });
    const start = Date.now();
    let wroteAt = 0;
    let note = '';
    const poll = setInterval(() => {
      if (wroteAt === 0 && existsSync(out)) wroteAt = Date.now();
      if (wroteAt > 0 && Date.now() - wroteAt > EXIT_GRACE_MS) {
        note = `child did not exit ${EXIT_GRACE_MS / 1000} s after writing its record; killed`;
        child.kill('SIGKILL');
      } else if (wroteAt === 0 && Date.now() - start > timeoutMs) {
        note = `no result within ${timeoutMs / 60_000} min; killed`;
        child.kill('SIGKILL');
      }
    }, 250);
    child.on('exit', (code, signal) => {
      clearInterval(poll);
      if (note) process.stderr.write(`[bench] ${c.name} (${engine}): ${note}\n`);
      if (existsSync(out)) {
        const record = JSON.parse(readFileSync(out, 'utf8')) as CaseRecord;
        done(note ? { ...record, note } : record);
      } else {
        done({ case: c.name, engine, error: `child failed (${note || (signal ? `killed by ${signal}` : `exit status ${code}`)})` });
      }
    });
  });
}

function findScipyScript(): string | undefined {
  const candidates = [resolve(dirname(process.argv[1]), '..', 'bench', 'scipy_eigsh.py'), resolve(process.cwd(), 'bench', 'scipy_eigsh.py')];
  return candidates.find((p) => existsSync(p));
}

function scipyAvailable(): boolean {
  const r = spawnSync('python3', ['-c', 'import scipy'], { stdio: 'ignore' });
  return r.status === 0;
}

function runScipy(script: string, mtxDir: string, timeoutMs: number): ScipyRecord | { error: string } {
  // One thread, as ours: SuperLU is sequential, and BLAS threads would only blur the comparison.
  const env = { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  const r = spawnSync('python3', [script, join(mtxDir, 'K.mtx'), join(mtxDir, 'M.mtx'), String(MODE_COUNT)], { env, encoding: 'utf8', timeout: timeoutMs, maxBuffer: 1 << 24 });
  if (r.status !== 0) return { error: `python3 failed (${r.error?.message ?? r.signal ?? `status ${r.status}`}): ${(r.stderr ?? '').trim().split('\n').slice(-1)[0] ?? ''}` };
  const last = r.stdout.trim().split('\n').slice(-1)[0];
  return JSON.parse(last) as ScipyRecord;
}


/** The item with the median key (the lower middle of an even count). */
function medianOf<T>(items: readonly T[], key: (x: T) => number): T {
  const sorted = [...items].sort((a, b) => key(a) - key(b));
  return sorted[(sorted.length - 1) >> 1];
}

/** Median of numbers (the lower middle of an even count, as medianOf). */
function median(v: readonly number[]): number {
  return medianOf(v, (x) => x);
}

function ok(r: Outcome | undefined): r is CaseRecord {
  return r !== undefined && 'dof' in r && r.error === undefined;
}

function checkText(r: CaseRecord): string {
  if (r.engine === 'mlmatrix') return '';
  const bad: string[] = [];
  if (!(r.check.maxResidual <= 1e-8)) bad.push(`res ${fmtSci(r.check.maxResidual)}`);
  if (!(r.check.orthogonalityError <= 1e-10)) bad.push(`orth ${fmtSci(r.check.orthogonalityError)}`);
  if (r.check.sturmPassed === false) bad.push('sturm FAIL');
  if (r.check.sturmPassed === null) bad.push('no sturm');
  return bad.length === 0 ? 'ok' : bad.join(' ');
}

async function parentMain(argv: readonly string[]): Promise<void> {
  const flags = parseFlags(argv);
  const selected = selectCases(flags.cases, flags.quick);
  const timeoutMs = flags.timeoutMinutes * 60_000;
  const load0 = loadavg()[0];
  const work = mkdtempSync(join(tmpdir(), 'eigenframe-bench-'));
  const script = findScipyScript();
  const haveScipy = script !== undefined && scipyAvailable();
  const scipyNote = haveScipy ? '' : script === undefined ? 'bench/scipy_eigsh.py not found' : 'python3 cannot import scipy';

  const sparse = new Map<string, Outcome>();
  const dense = new Map<string, Outcome>();
  const ml = new Map<string, Outcome>();
  const scipy = new Map<string, ScipyRecord | { error: string }>();
  const roundLog = new Map<string, { ours: CaseRecord[]; scipy: ScipyRecord[] }>();
  const progress = (s: string): void => void process.stderr.write(`[bench ${new Date().toISOString().slice(11, 19)}] ${s}\n`);

  try {
    for (const c of selected) {
      const dir = join(work, c.name);
      progress(`${c.name}: model and assembly`);
      const failed = prepareInChild(c, dir, haveScipy, timeoutMs);
      if (failed !== undefined) {
        progress(`${c.name}: ${failed}`);
        sparse.set(c.name, { case: c.name, engine: 'sparse', error: failed });
        continue;
      }
      // Target cases: ours and SciPy alternately, `rounds` times each, so that both see the
      // same spells of load; the run with the median time stands for each in the tables.
      const rounds = c.target ? flags.rounds : 1;
      const ours: Outcome[] = [];
      const theirs: Array<ScipyRecord | { error: string }> = [];
      for (let k = 0; k < rounds; k++) {
        const of = rounds > 1 ? ` (round ${k + 1} of ${rounds})` : '';
        progress(`${c.name}: sparse${of}`);
        const r = await runChild(c, 'sparse', work, dir, timeoutMs);
        ours.push(r);
        if (!ok(r)) {
          progress(`${c.name}: ${r.error}`);
          break;
        }
        if (haveScipy && existsSync(join(dir, 'K.mtx'))) {
          progress(`${c.name}: scipy${of}`);
          theirs.push(runScipy(script!, dir, timeoutMs));
        }
      }
      const r = medianOf(ours, (x) => (ok(x) ? x.seconds.solve : Infinity));
      sparse.set(c.name, r);
      if (theirs.length > 0) scipy.set(c.name, medianOf(theirs, (x) => ('error' in x ? Infinity : x.seconds)));
      if (rounds > 1) roundLog.set(c.name, { ours: ours.filter(ok), scipy: theirs.filter((x): x is ScipyRecord => !('error' in x)) });
      if (c.family === 'dense') {
        progress(`${c.name}: our dense solver`);
        dense.set(c.name, await runChild(c, 'dense', work, dir, timeoutMs));
        progress(`${c.name}: ml-matrix dense route`);
        ml.set(c.name, await runChild(c, 'mlmatrix', work, dir, timeoutMs));
      }
      rmSync(dir, { recursive: true, force: true });
    }
  } finally {
    rmSync(work, { recursive: true, force: true });
  }

  // ---- report ----
  const lines: string[] = [];
  lines.push(`eigenframe benchmark — lowest ${MODE_COUNT} modes; node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}; ${new Date().toISOString()}`);
  lines.push(`load average (1 min) at start ${load0.toFixed(2)}, at end ${loadavg()[0].toFixed(2)}: wall times grow with other load on the machine, CPU times much less.`);
  lines.push('');
  const sparseCases = selected.filter((c) => c.family !== 'dense');
  const header = ['case', 'DOF', 'assembly s', 'analyse s', 'factor s', 'iter s', 'verify s', 'total s', 'solve cpu s', 'nnz(L)', 'peak MiB', 'check', 'SciPy s', 'time ours/SciPy', '2nd call s', '2nd call/SciPy', 'cpu ours/SciPy', 'SciPy MiB', 'mem ours/SciPy', 'solver Δmem ours/SciPy', 'max rel Δλ'];
  const rows: string[][] = [];
  const failures: string[] = [];
  for (const c of selected) {
    const r = sparse.get(c.name);
    if (!ok(r)) {
      rows.push([c.name, ...header.slice(1).map(() => '–')]);
      failures.push(`${c.name}: ${r?.error ?? 'not run'}`);
      continue;
    }
    const s = scipy.get(c.name);
    const sOk = s !== undefined && !('error' in s);
    const sPeak = sOk ? (s.solve_peak_mib ?? s.maxrss_mib) : NaN;
    const oPeak = Number.isFinite(r.solvePeakMiB) && sOk && s.solve_peak_mib !== null ? r.solvePeakMiB : r.peakMiB;
    rows.push([
      c.name,
      fmtCount(r.dof),
      fmtSeconds(r.seconds.assembly),
      fmtSeconds(r.seconds.analyse),
      fmtSeconds(r.seconds.factorization),
      fmtSeconds(r.seconds.iterations),
      fmtSeconds(r.seconds.verify),
      fmtSeconds(r.seconds.total),
      fmtSeconds(r.solveCpuSeconds),
      fmtCount(r.nnzL),
      fmtMiB(r.peakMiB),
      checkText(r),
      sOk ? fmtSeconds(s.seconds) : 'n/a',
      sOk ? fmtRatio(r.seconds.solve / s.seconds) : 'n/a',
      fmtSeconds(r.secondSolveSeconds),
      sOk && Number.isFinite(r.secondSolveSeconds) ? fmtRatio(r.secondSolveSeconds / s.seconds) : sOk ? '–' : 'n/a',
      sOk ? fmtRatio(r.solveCpuSeconds / s.cpu_seconds) : 'n/a',
      sOk ? fmtMiB(sPeak) : 'n/a',
      sOk ? fmtRatio(oPeak / sPeak) : 'n/a',
      sOk && s.solve_peak_mib !== null && s.rss_before_solve_mib !== null
        ? fmtRatio((r.solvePeakMiB - r.rssBeforeSolveMiB) / (s.solve_peak_mib - s.rss_before_solve_mib))
        : 'n/a',
      sOk ? fmtSci(maxRelativeDifference(r.eigenvalues, s.eigenvalues)) : 'n/a',
    ]);
  }
  lines.push(renderTable(header, rows));
  for (const f of failures) lines.push(`FAILED ${f}`);
  lines.push('');
  lines.push('Times in seconds, wall clock. assembly = validateModel + assemble; total = assembly + solve call (analyse + factor + iter + verify: residuals, orthogonality, Sturm count).');
  lines.push('peak MiB: whole solving child (getrusage maxRSS); the model is built and assembled in a child of its own, which writes K and M to files that the solving child reads, as SciPy reads them.');
  lines.push("check: every mode's relative residual ≤ 1e-8, M-orthonormality ≤ 1e-10, Sturm count passed.");
  if (haveScipy) {
    lines.push('SciPy: eigsh(K, 20, M, sigma=0) (ARPACK + SuperLU), one thread, on the same K and M read from Matrix Market;');
    lines.push('  SciPy s = eigsh call only; time ours/SciPy = our solve call / SciPy s (assembly excluded: SciPy gets K and M ready);');
    lines.push('  2nd call = the same solve called again in the same child, V8 having compiled the code the first call ran');
    lines.push('  (the first call of a process pays that compilation; SciPy\'s code is compiled ahead of time);');
    lines.push('  cpu ours/SciPy: the same with process CPU time (ours counts the Node GC helper threads too);');
    lines.push('  SciPy MiB and mem ours/SciPy compare peak resident memory during the solve alone, K and M loaded from files, on both sides');
    lines.push('  (high-water mark reset before the solve); solver Δmem = the same peaks minus the resident memory just before the solve');
    lines.push('  (the memory the solver itself added); max rel Δλ = max over the 20 modes of |λ_ours − λ_SciPy| / λ_SciPy.');
    const failed = [...scipy.entries()].filter(([, v]) => 'error' in v);
    for (const [n, v] of failed) lines.push(`  SciPy failed on ${n}: ${(v as { error: string }).error}`);
  } else {
    lines.push(`SciPy columns n/a: ${scipyNote}.`);
  }

  // Rounds of the target cases.
  if (roundLog.size > 0) {
    lines.push('');
    lines.push(`Target cases, ${flags.rounds} rounds (ours in a fresh child, then SciPy, alternately); the table above shows each side's median run:`);
    const rh = ['case', 'ours s (1st call)', 'ours s (2nd call)', 'SciPy s', 'median ours/SciPy', '2nd call', 'min ours/min SciPy', 'peak MiB ours', 'SciPy MiB'];
    const rrows: string[][] = [];
    for (const [name, log] of roundLog) {
      const o1 = log.ours.map((x) => x.seconds.solve);
      const o2 = log.ours.map((x) => x.secondSolveSeconds);
      const sp = log.scipy.map((x) => x.seconds);
      const list = (v: number[]): string => v.map(fmtSeconds).join(', ');
      const both = o1.length > 0 && sp.length > 0;
      rrows.push([
        name,
        list(o1),
        list(o2),
        list(sp),
        both ? fmtRatio(median(o1) / median(sp)) : 'n/a',
        both ? fmtRatio(median(o2) / median(sp)) : 'n/a',
        both ? fmtRatio(Math.min(...o1) / Math.min(...sp)) : 'n/a',
        log.ours.map((x) => fmtMiB(x.solvePeakMiB)).join(', '),
        log.scipy.map((x) => fmtMiB(x.solve_peak_mib ?? x.maxrss_mib)).join(', '),
      ]);
    }
    lines.push(renderTable(rh, rrows));
  }

  // Growth exponent per family.
  lines.push('');
  const fits: Record<string, { total: number; solve: number; dofs: number[] }> = {};
  for (const family of ['building', 'footbridge'] as const) {
    const recs = sparseCases.filter((c) => c.family === family).map((c) => sparse.get(c.name)).filter(ok);
    if (recs.length < 2) continue;
    const dofs = recs.map((r) => r.dof);
    const total = growthExponent(dofs, recs.map((r) => r.seconds.total));
    const solveExp = growthExponent(dofs, recs.map((r) => r.seconds.solve));
    fits[family] = { total, solve: solveExp, dofs };
    lines.push(`growth exponent (least squares, log total time vs log DOF) ${family}: ${total.toFixed(2)} over ${recs.length} sizes (${fmtCount(dofs[0])}–${fmtCount(dofs[dofs.length - 1])} DOF); solve only: ${solveExp.toFixed(2)}`);
  }

  // Dense baselines.
  const denseCases = selected.filter((c) => c.family === 'dense');
  if (denseCases.length > 0) {
    lines.push('');
    lines.push('Dense baselines (plane frames sized to the DOF count), solve call in seconds (wall) from the same K and M;');
    lines.push("ours dense = solve(K, M, { method: 'dense' }); ml-matrix = Cholesky of M, EigenvalueDecomposition of L⁻¹KL⁻ᵀ, modes x = L⁻ᵀy;");
    lines.push('each "warm" column is the median of 5 identical solve calls after 5 warm-up calls in the same child (JIT compiled), and the ratio of ml-matrix to it:');
    const dh = ['case', 'DOF', 'ours sparse s', 'warm', 'ours dense s', 'warm', 'ml-matrix s', 'ml-matrix/ours sparse', 'warm', 'ml-matrix/ours dense', 'warm', 'cpu: ml-matrix/ours sparse', 'SciPy s', 'max rel Δλ ml-matrix'];
    const drows: string[][] = [];
    for (const c of denseCases) {
      const s = sparse.get(c.name);
      const d = dense.get(c.name);
      const m = ml.get(c.name);
      const sp = scipy.get(c.name);
      const dof = ok(s) ? s.dof : ok(m) ? m.dof : NaN;
      drows.push([
        c.name,
        fmtCount(dof),
        ok(s) ? fmtSeconds(s.seconds.solve) : 'error',
        ok(s) ? fmtSeconds(s.warmSolveSeconds) : '–',
        ok(d) ? fmtSeconds(d.seconds.solve) : 'error',
        ok(d) ? fmtSeconds(d.warmSolveSeconds) : '–',
        ok(m) ? fmtSeconds(m.seconds.solve) : 'error',
        ok(s) && ok(m) ? fmtRatio(m.seconds.solve / s.seconds.solve) : '–',
        ok(s) && ok(m) ? fmtRatio(m.seconds.solve / s.warmSolveSeconds) : '–',
        ok(d) && ok(m) ? fmtRatio(m.seconds.solve / d.seconds.solve) : '–',
        ok(d) && ok(m) ? fmtRatio(m.seconds.solve / d.warmSolveSeconds) : '–',
        ok(s) && ok(m) ? fmtRatio(m.solveCpuSeconds / s.solveCpuSeconds) : '–',
        sp && !('error' in sp) ? fmtSeconds(sp.seconds) : 'n/a',
        ok(s) && ok(m) ? fmtSci(maxRelativeDifference(s.eigenvalues, m.eigenvalues)) : '–',
      ]);
    }
    lines.push(renderTable(dh, drows));
    const errs = denseCases.flatMap((c) => [dense.get(c.name), ml.get(c.name), sparse.get(c.name)]).filter((r) => r && !ok(r)) as Outcome[];
    for (const e of errs) lines.push(`  ${e.case} (${e.engine}): ${e.error}`);
  }

  for (const m of [sparse, dense, ml]) {
    for (const r of m.values()) if ('note' in r && r.note) lines.push(`NOTE ${r.case} (${r.engine}): ${r.note}`);
  }
  const report = lines.join('\n');
  process.stdout.write(report + '\n');

  const outDir = resolve(findScipyScript() ? dirname(findScipyScript()!) : join(process.cwd(), 'bench'), 'out');
  mkdirSync(outDir, { recursive: true });
  const json = {
    date: new Date().toISOString(),
    node: process.version,
    cpu: cpus()[0]?.model,
    flags,
    modeCount: MODE_COUNT,
    scipy: haveScipy ? 'available' : scipyNote,
    cases: selected.map((c) => ({
      name: c.name,
      family: c.family,
      sparse: sparse.get(c.name),
      dense: dense.get(c.name),
      mlmatrix: ml.get(c.name),
      scipy: scipy.get(c.name),
      ...(roundLog.has(c.name) ? { rounds: roundLog.get(c.name) } : {}),
    })),
    growthExponents: fits,
    report,
  };
  writeFileSync(join(outDir, 'results.json'), JSON.stringify(json, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2));
  process.stderr.write(`[bench] wrote ${join(outDir, 'results.json')}\n`);

  // The parameter study across worker threads (speed-up on 1 and on all cores); skipped when
  // only some cases were asked for.
  if (flags.cases.length === 0) {
    progress('parameter study: 200 variants across worker threads');
    process.stdout.write(`\n${formatBatchBench(await runBatchBench())}\n`);
  }
}

const argv = process.argv.slice(2);
if (argv[0] === '--child') childMain(argv.slice(1));
else if (argv[0] === '--batch') {
  // The parameter study alone.
  runBatchBench()
    .then((r) => process.stdout.write(`${formatBatchBench(r)}\n`))
    .catch((e: unknown) => {
      process.stderr.write(`bench: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    });
} else {
  parentMain(argv).catch((e: unknown) => {
    process.stderr.write(`bench: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  });
}
