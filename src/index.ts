/**
 * eigenframe: natural frequencies and mode shapes of frame, beam and truss models, and the
 * engineering answers modes give. Everything here runs in Node.js and in browsers; file access
 * lives in the CLI only.
 */
export * from './errors';
export * from './linalg/index';
export * from './elements/index';
export * from './model/index';
export * from './eigen/index';
export * from './modal/index';
export * from './io/index';
export * from './reference/index';
export { VERSION } from './version';
