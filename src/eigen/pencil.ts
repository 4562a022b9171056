/**
 * The shifted pencil K − σM on one sparsity pattern (the union of K's and M's), analysed once
 * and factorized at any number of shifts (analyse → factorize, as Eigen's SimplicialLDLT).
 * A shift that lands on an eigenvalue makes a pivot vanish; the factorization then throws
 * FactorizationError and the shift is nudged and the pencil refactorized (Grimes, Lewis & Simon
 * 1994, §4: shifts are moved, not rejected).
 */
import { ArgumentError, FactorizationError } from '../errors';
import { analyse } from '../linalg/ldlt/analyse';
import { factorizeReusing } from '../linalg/ldlt/factorize';
import type { LdltFactor, OrderingName, SymbolicFactor } from '../linalg/ldlt/types';
import { combineOnUnion, diagonal, unionPattern, type SymmetricCsc, type UnionPattern } from '../linalg/sparse/symmetric';

/** First nudge of a shift that hits an eigenvalue, relative to max(|σ|, typical λ). Grows ×10 per retry. */
export const SHIFT_NUDGE = 1e-7;
/** Shifts tried (the first and its nudges) before a FactorizationError is passed on. */
export const SHIFT_ATTEMPTS = 6;

/** A factorization of K − σM and the shift it was made at. */
export interface ShiftedFactor {
  /** LDLᵀ factor of K − σM. */
  readonly factor: LdltFactor;
  /** Shift σ actually used, rad²/s² (the requested one, or a nudged one). */
  readonly shift: number;
}

/**
 * Largest factor the solvers allocate by default: 8 GiB. The symbolic analysis knows the factor's
 * size exactly, so a model too large for the machine is refused with that estimate before any
 * numeric work; pass `maxFactorBytes` to allow more where the memory exists.
 */
export const FACTOR_MEMORY_LIMIT = 8 * 2 ** 30;

/** Bytes the numeric factor of `sym` will hold: L's entries, D, and the solve workspace. */
export function factorBytes(sym: SymbolicFactor): number {
  return 8 * (sym.nnzL + 3 * sym.n);
}

function checkFactorMemory(sym: SymbolicFactor, limit: number): void {
  if (!(limit > 0)) throw new ArgumentError(`maxFactorBytes is ${limit}; pass a positive number of bytes`, 'maxFactorBytes');
  const need = factorBytes(sym);
  if (need > limit) {
    const gib = (b: number) => `${(b / 2 ** 30).toFixed(2)} GiB`;
    throw new FactorizationError(
      `the factor of this ${sym.n}-DOF problem needs about ${gib(need)} (nnz(L) = ${sym.nnzL.toExponential(3)} with the ${sym.ordering} ordering), above the limit of ${gib(limit)}; reduce the model, or raise maxFactorBytes where the machine has the memory`,
      'memory',
    );
  }
}

export class ShiftedPencil {
  readonly n: number;
  readonly K: SymmetricCsc;
  readonly M: SymmetricCsc;
  readonly union: UnionPattern;
  readonly symbolic: SymbolicFactor;
  /**
   * Typical eigenvalue scale, trace(K) / trace(M) in rad²/s² (1 when M's trace is zero); used to
   * size shift nudges and the negative shift of free-free structures.
   */
  readonly typicalEigenvalue: number;
  /** Numeric factorizations done so far. */
  factorizations = 0;
  /** Milliseconds spent in analyse and in factorize. */
  msAnalyse = 0;
  msFactorize = 0;
  private readonly values: Float64Array;
  /** Value storage given back by a factor no longer used (see `recycle`), for the next factorization. */
  private spare: Float64Array | undefined;

  /**
   * @param K - stiffness, n × n symmetric lower CSC
   * @param M - mass, n × n symmetric positive semidefinite lower CSC
   * @param options.symbolic - an analysis of the union pattern of K and M to reuse
   * @param options.ordering - ordering for a new analysis (ignored with `symbolic`)
   * @param options.maxFactorBytes - refuse (FactorizationError, path `memory`) before any numeric
   *   factorization when the factor would need more bytes @defaultValue FACTOR_MEMORY_LIMIT
   * @throws ArgumentError (path `M`) when the sizes differ, (path `symbolic`) when the given analysis
   *   does not fit the union pattern
   */
  constructor(K: SymmetricCsc, M: SymmetricCsc, options: { symbolic?: SymbolicFactor; ordering?: OrderingName | Int32Array; maxFactorBytes?: number } = {}) {
    if (K.n !== M.n) throw new ArgumentError(`M is ${M.n} × ${M.n} but K is ${K.n} × ${K.n}; pass matrices of one size`, 'M');
    this.n = K.n;
    this.K = K;
    this.M = M;
    this.union = unionPattern(K, M);
    const nz = this.union.pattern.colPtr[this.n];
    if (options.symbolic) {
      if (options.symbolic.n !== this.n || options.symbolic.patternNnz !== nz) {
        throw new ArgumentError(
          `the analysis is for n = ${options.symbolic.n} with ${options.symbolic.patternNnz} stored entries, but the union pattern of K and M has n = ${this.n} and ${nz}; analyse the union pattern of these K and M (or omit symbolic)`,
          'symbolic',
        );
      }
      this.symbolic = options.symbolic;
    } else {
      const t0 = performance.now();
      this.symbolic = analyse(this.union.pattern, options.ordering === undefined ? {} : { ordering: options.ordering });
      this.msAnalyse = performance.now() - t0;
    }
    checkFactorMemory(this.symbolic, options.maxFactorBytes ?? FACTOR_MEMORY_LIMIT);
    this.values = new Float64Array(nz);
    const dk = diagonal(K);
    const dm = diagonal(M);
    let tk = 0;
    let tm = 0;
    for (let i = 0; i < this.n; i++) {
      tk += Math.abs(dk[i]);
      tm += Math.abs(dm[i]);
    }
    this.typicalEigenvalue = tm > 0 && tk > 0 ? tk / tm : 1;
  }

  /**
   * Takes back the storage of a factor made by this pencil that will not be used again: the next
   * `factorAt` writes into it instead of fresh memory (fewer page faults, one factor's worth less
   * at the peak). The factor cannot solve afterwards.
   */
  recycle(factor: LdltFactor): void {
    const f = factor as LdltFactor & { releaseStorage?: () => Float64Array };
    if (typeof f.releaseStorage === 'function') this.spare = f.releaseStorage();
  }

  /**
   * Factorizes K − σM, nudging σ by SHIFT_NUDGE · max(|σ|, typical λ) (×10 per retry) in
   * `direction` when a pivot vanishes.
   * @param direction - +1 to nudge upward, −1 downward
   * @param attempts - shifts to try (1 = no nudge) @defaultValue SHIFT_ATTEMPTS
   * @param options.pivotTolerance - the factorization's pivot tolerance (factorize.ts)
   *   @defaultValue FACTORIZE_DEFAULTS.pivotTolerance
   * @param options.nudge - first nudge in rad²/s² @defaultValue SHIFT_NUDGE · max(|σ|, typical λ)
   * @throws FactorizationError after SHIFT_ATTEMPTS shifts (the pencil itself is singular: a
   *   mechanism without mass, or a DOF with neither stiffness nor mass)
   */
  factorAt(sigma: number, direction: 1 | -1 = 1, attempts: number = SHIFT_ATTEMPTS, options: { pivotTolerance?: number; nudge?: number } = {}): ShiftedFactor {
    let s = sigma;
    let step = options.nudge ?? SHIFT_NUDGE * Math.max(Math.abs(sigma), this.typicalEigenvalue);
    const factorOptions = options.pivotTolerance === undefined ? {} : { pivotTolerance: options.pivotTolerance };
    let last: FactorizationError | undefined;
    let tried = s;
    for (let attempt = 0; attempt < attempts; attempt++) {
      tried = s;
      combineOnUnion(this.union, 1, this.K, -s, this.M, this.values);
      const t0 = performance.now();
      try {
        this.factorizations++;
        const factor = factorizeReusing(this.symbolic, this.values, factorOptions, 'matrix', this.spare);
        this.spare = undefined;
        return { factor, shift: s };
      } catch (e) {
        if (!(e instanceof FactorizationError)) throw e;
        last = e;
      } finally {
        this.msFactorize += performance.now() - t0;
      }
      s = sigma + direction * step;
      step *= 10;
    }
    throw new FactorizationError(
      `K − σM stays singular for σ from ${sigma} to ${tried} (${last?.detail ?? ''}); K and M share a null vector — a DOF or mechanism with neither stiffness nor mass: add supports, stiffness or mass there`,
      last?.path ?? 'row 0',
    );
  }
}
