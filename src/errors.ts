/**
 * The typed errors of eigenframe. Every error carries a `path` naming the offending item
 * (a JSON path such as `elements[3].section`, a file and line such as `K.mtx:17`, a row or a
 * DOF, or a mode such as `modes[7]`) and a message that says what is wrong, the value, and
 * what would fix it.
 *
 * This file imports nothing, so every layer may use it.
 */

/** Base class of every error eigenframe throws on purpose. */
export class EigenframeError extends Error {
  /** Where the problem is: a JSON path, `file:line`, `row 42`, `modes[7]`, an option name. */
  readonly path: string;
  /** The message without the path prefix. */
  readonly detail: string;
  constructor(message: string, path: string) {
    super(`${path}: ${message}`);
    this.name = new.target.name;
    this.path = path;
    this.detail = message;
  }
}

/** The structural model is invalid (JSON syntax, unknown reference, bad property, mechanism). */
export class ModelError extends EigenframeError {}

/** A Matrix Market file is malformed; `path` is `file:line`. */
export class MatrixMarketError extends EigenframeError {}

/** A factorization failed (singular or indefinite where that is not allowed); `path` names the row. */
export class FactorizationError extends EigenframeError {}

/** A solver result failed its own checks (residual, M-orthonormality, Sturm count). */
export class VerificationError extends EigenframeError {}

/** A function or command was called with invalid arguments or options; `path` names the option. */
export class ArgumentError extends EigenframeError {}

/** A long run was stopped through its AbortSignal. */
export class AbortedError extends EigenframeError {}
