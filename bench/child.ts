/**
 * One measurement, in two child processes so that the solve's peak memory is its own, as
 * SciPy's is: a preparing child builds the model, assembles K and M, and writes them to files
 * (raw binary for our engines, Matrix Market for SciPy); a solving child reads K and M back —
 * nothing of the model is in its memory, as nothing is in SciPy's — solves with one engine, and
 * writes a JSON record.
 */
import { readFileSync, writeFileSync } from 'node:fs';
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

/** Warm-up calls, then timed calls whose median is the "warm" time of the dense-baseline cases. */
export const WARM_CALLS = 5;

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
   * Plane-frame (dense-baseline) cases only: median wall seconds of WARM_CALLS identical solve
   * calls in the same process after WARM_CALLS warm-up calls, the JIT having compiled the code
   * paths (NaN elsewhere).
   */
  warmSolveSeconds: number;
  /**
   * Building and footbridge cases, sparse engine: wall seconds of a second, identical solve call
   * in the same process, after the first (timed in `seconds.solve`) has had V8 compile the code
   * it runs (NaN elsewhere). SciPy's compiled code has no such first-call cost.
   */
  secondSolveSeconds: number;
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

/** What the preparing child leaves beside the matrices. */
export interface Preparation {
  modelSeconds: number;
  assemblySeconds: number;
  nodes: number;
  elements: number;
}

/**
 * Writes a symmetric CSC matrix as raw little-endian arrays: Int32 n, Int32 nnz, Int32 colPtr
 * (n + 1), Int32 rowIdx (nnz), zero padding to 8 bytes, Float64 values (nnz).
 */
function writeCsc(path: string, a: SymmetricCsc): void {
  const nz = a.colPtr[a.n];
  const ints = 2 + a.n + 1 + nz;
  const pad = (ints * 4) % 8;
  const buf = Buffer.alloc(ints * 4 + pad + nz * 8);
  const head = new Int32Array(buf.buffer, buf.byteOffset, ints);
  head[0] = a.n;
  head[1] = nz;
  head.set(a.colPtr, 2);
  head.set(a.rowIdx.subarray(0, nz), 3 + a.n);
  Buffer.from(a.values.buffer, a.values.byteOffset, nz * 8).copy(buf, ints * 4 + pad);
  writeFileSync(path, buf);
}

/** Reads what writeCsc wrote; the arrays view the file's buffer (no copy). */
function readCsc(path: string): SymmetricCsc {
  const file = readFileSync(path);
  // The views below need an 8-byte-aligned start; a file read into a shared pool slice may not
  // have one, so copy it into an ArrayBuffer of its own (offset 0).
  const buf = file.byteOffset % 8 === 0 ? file : Buffer.from(new Uint8Array(file).buffer);
  const n = buf.readInt32LE(0);
  const nz = buf.readInt32LE(4);
  const ints = 2 + n + 1 + nz;
  const pad = (ints * 4) % 8;
  return {
    n,
    colPtr: new Int32Array(buf.buffer, buf.byteOffset + 8, n + 1),
    rowIdx: new Int32Array(buf.buffer, buf.byteOffset + 8 + (n + 1) * 4, nz),
    values: new Float64Array(buf.buffer, buf.byteOffset + ints * 4 + pad, nz),
  };
}

/**
 * The preparing child: model generation and assembly (timed), then K and M written to `dir`
 * (K.bin, M.bin, prep.json) and, with `mtx`, as Matrix Market for SciPy (K.mtx, M.mtx).
 */
export function prepareCase(c: BenchCase, dir: string, mtx: boolean): Preparation {
  let t = performance.now();
  const model = c.model();
  const modelSeconds = (performance.now() - t) / 1000;
  t = performance.now();
  // assembleModel validates the model first (as a file read would), then assembles.
  const asm = assembleModel(model);
  const assemblySeconds = (performance.now() - t) / 1000;
  const prep: Preparation = { modelSeconds, assemblySeconds, nodes: model.nodes.length, elements: model.elements.length };
  writeCsc(join(dir, 'K.bin'), asm.stiffness);
  writeCsc(join(dir, 'M.bin'), asm.mass);
  if (mtx) {
    writeFileSync(join(dir, 'K.mtx'), writeMatrixMarket(asm.stiffness, `stiffness of ${c.name}, N/m`));
    writeFileSync(join(dir, 'M.mtx'), writeMatrixMarket(asm.mass, `mass of ${c.name}, kg`));
  }
  writeFileSync(join(dir, 'prep.json'), JSON.stringify(prep));
  return prep;
}

/**
 * The solving child: reads K and M that {@link prepareCase} wrote to `dir` and solves with one
 * engine. Only K, M and the solver are in this process, as only K and M are in SciPy's.
 */
export function runCase(c: BenchCase, engine: EngineName, dir: string): CaseRecord {
  const sec = (ms: number): number => ms / 1000;
  const prep = JSON.parse(readFileSync(join(dir, 'prep.json'), 'utf8')) as Preparation;
  const { nodes, elements } = prep;
  const K = readCsc(join(dir, 'K.bin'));
  const M = readCsc(join(dir, 'M.bin'));
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
    seconds: { model: prep.modelSeconds, assembly: prep.assemblySeconds, analyse: NaN, factorization: NaN, iterations: NaN, verify: NaN, solve: NaN, total: NaN },
    solveCpuSeconds: NaN,
    warmSolveSeconds: NaN,
    secondSolveSeconds: NaN,
    nnzL: NaN,
    rssBeforeSolveMiB: NaN,
    peakMiB: NaN,
    solvePeakMiB: NaN,
    eigenvalues: [],
    check: { maxResidual: NaN, orthogonalityError: NaN, sturmPassed: null },
    method: engine,
    stats: {},
  };

  // The solve-phase peak counts K, M and the solver, as SciPy's does: collect what reading left
  // behind first when the child runs with --expose-gc (the parent passes it).
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
  // Memory is read before any further call, so the peaks are the first solve's.
  record.solvePeakMiB = canReset ? highWaterMiB() : NaN;
  record.peakMiB = processPeakMiB();
  if (c.family !== 'dense' && engine === 'sparse' && record.error === undefined) {
    t = performance.now();
    solveModes(K, M, MODE_COUNT, engine);
    record.secondSolveSeconds = sec(performance.now() - t);
  }
  if (c.family === 'dense' && engine !== 'mlmatrix' && record.error === undefined) {
    // Warm: after WARM_CALLS identical calls that let the JIT compile the code paths (V8 tiers
    // up over several calls), the median of WARM_CALLS more. The ml-matrix route runs for a
    // minute, so its one call is warm for nearly all of it.
    for (let k = 0; k < WARM_CALLS; k++) solveModes(K, M, MODE_COUNT, engine);
    const times: number[] = [];
    for (let k = 0; k < WARM_CALLS; k++) {
      t = performance.now();
      solveModes(K, M, MODE_COUNT, engine);
      times.push(sec(performance.now() - t));
    }
    times.sort((a, b) => a - b);
    record.warmSolveSeconds = times[WARM_CALLS >> 1];
  }
  record.seconds.total = record.seconds.assembly + record.seconds.solve;

  return record;
}
