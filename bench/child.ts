/**
 * One measurement, run in its own child process so that its peak memory is its own: build the
 * model, assemble K and M, then solve with one engine, and write a JSON record.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { writeMatrixMarket } from '../src/io/matrix-market';
import { nnz } from '../src/linalg/sparse/symmetric';
import type { SymmetricCsc } from '../src/linalg/sparse/symmetric';
import type { BenchCase } from './cases';
import { assembleModel, phaseSeconds, solveModes } from './engine';
import type { EngineName } from './engine';
import { highWaterMiB, processPeakMiB, resetPeak } from './memory';
import { mlMatrixDense } from './mlmatrix-dense';

/** Number of modes every case asks for (the DESIGN.md comparison). */
export const MODE_COUNT = 20;

/** What one child reports. Times in s, memory in MiB, eigenvalues in rad²/s². */
export interface CaseRecord {
  case: string;
  family: string;
  engine: EngineName;
  dof: number;
  nodes: number;
  elements: number;
  /** Stored lower-triangle nonzeros of K and M. */
  nnzK: number;
  nnzM: number;
  seconds: {
    model: number;
    assembly: number;
    analyse: number;
    factorization: number;
    iterations: number;
    /** Residual, orthogonality and Sturm checks inside the solve call. */
    verify: number;
    /** Wall time of the solve call (analyse + factorization + iterations + checks). */
    solve: number;
    /** assembly + solve. */
    total: number;
  };
  /**
   * Plane-frame (dense-baseline) cases only: wall seconds of a second, identical solve call in
   * the same process, after the JIT has compiled the code paths (NaN elsewhere).
   */
  warmSolveSeconds: number;
  /** CPU seconds of the solve call (user + system, all threads of the process incl. GC helpers). */
  solveCpuSeconds: number;
  nnzL: number;
  /** Resident memory just before the solve call (after the collection), MiB. */
  rssBeforeSolveMiB: number;
  /** Peak RSS of the whole child (getrusage maxRSS). */
  peakMiB: number;
  /**
   * Peak RSS during the solve alone (K and M loaded, the model and assembly garbage collected
   * first), NaN when it cannot be measured.
   */
  solvePeakMiB: number;
  eigenvalues: number[];
  check: { maxResidual: number; orthogonalityError: number; sturmPassed: boolean | null };
  method: string;
  stats: Record<string, number>;
  /** Set when the engine failed. */
  error?: string;
}

/**
 * Runs one (case, engine) measurement. When `mtxDir` is given, also writes K.mtx and M.mtx there
 * after the measurement (for the SciPy reference).
 */
/** Model generation and assembly; only K, M and counts leave, so the model can be collected. */
function prepare(c: BenchCase): { K: SymmetricCsc; M: SymmetricCsc; nodes: number; elements: number; modelMs: number; assemblyMs: number } {
  let t = performance.now();
  const model = c.model();
  const modelMs = performance.now() - t;
  t = performance.now();
  // assembleModel validates the model first (as a file read would), then assembles.
  const asm = assembleModel(model);
  const assemblyMs = performance.now() - t;
  return { K: asm.stiffness, M: asm.mass, nodes: model.nodes.length, elements: model.elements.length, modelMs, assemblyMs };
}

export function runCase(c: BenchCase, engine: EngineName, mtxDir: string | undefined): CaseRecord {
  const sec = (ms: number): number => ms / 1000;
  const { K, M, nodes, elements, modelMs, assemblyMs } = prepare(c);
  let t = 0;

  const record: CaseRecord = {
    case: c.name,
    family: c.family,
    engine,
    dof: K.n,
    nodes,
    elements,
    nnzK: nnz(K),
    nnzM: nnz(M),
    seconds: { model: sec(modelMs), assembly: sec(assemblyMs), analyse: NaN, factorization: NaN, iterations: NaN, verify: NaN, solve: NaN, total: NaN },
    solveCpuSeconds: NaN,
    warmSolveSeconds: NaN,
    nnzL: NaN,
    rssBeforeSolveMiB: NaN,
    peakMiB: NaN,
    solvePeakMiB: NaN,
    eigenvalues: [],
    check: { maxResidual: NaN, orthogonalityError: NaN, sturmPassed: null },
    method: engine,
    stats: {},
  };

  // The solve-phase peak counts K, M and the solver, as SciPy's does: collect the model and the
  // assembly's garbage first when the child runs with --expose-gc (the parent passes it).
  const gc = (globalThis as { gc?: () => void }).gc;
  if (gc) gc();
  record.rssBeforeSolveMiB = process.memoryUsage().rss / 2 ** 20;
  const canReset = resetPeak();
  const cpu0 = process.cpuUsage();
  try {
    t = performance.now();
    if (engine === 'mlmatrix') {
      const r = mlMatrixDense(K, M, MODE_COUNT);
      record.seconds.solve = r.seconds.total;
      record.eigenvalues = r.eigenvalues;
      record.method = 'ml-matrix Cholesky + EigenvalueDecomposition';
      record.stats = { denseCopyMs: r.seconds.dense * 1000, decompositionMs: r.seconds.decomposition * 1000 };
    } else {
      const r = solveModes(K, M, MODE_COUNT, engine);
      record.seconds.solve = sec(performance.now() - t);
      const ph = phaseSeconds(r.stats);
      record.seconds.analyse = ph.analyse;
      record.seconds.factorization = ph.factorization;
      record.seconds.iterations = ph.iterations;
      record.seconds.verify = ph.verify;
      record.nnzL = ph.nnzL;
      record.eigenvalues = Array.from(r.eigenvalues);
      let maxResidual = 0;
      for (const v of r.residuals) maxResidual = Math.max(maxResidual, v);
      record.check = { maxResidual, orthogonalityError: r.orthogonalityError, sturmPassed: r.sturm ? r.sturm.passed : null };
      record.method = r.method;
      record.stats = { ...r.stats };
    }
  } catch (e) {
    record.error = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
  }
  const cpu = process.cpuUsage(cpu0);
  record.solveCpuSeconds = (cpu.user + cpu.system) / 1e6;
  if (c.family === 'dense' && engine !== 'mlmatrix' && record.error === undefined) {
    t = performance.now();
    solveModes(K, M, MODE_COUNT, engine);
    record.warmSolveSeconds = sec(performance.now() - t);
  }
  record.seconds.total = record.seconds.assembly + record.seconds.solve;
  record.solvePeakMiB = canReset ? highWaterMiB() : NaN;
  record.peakMiB = processPeakMiB();

  if (mtxDir !== undefined && record.error === undefined) {
    mkdirSync(mtxDir, { recursive: true });
    writeFileSync(join(mtxDir, 'K.mtx'), writeMatrixMarket(K, `stiffness of ${c.name}, N/m`));
    writeFileSync(join(mtxDir, 'M.mtx'), writeMatrixMarket(M, `mass of ${c.name}, kg`));
  }
  return record;
}
