/**
 * Shared pieces of the SVG drawings: text escaping, number formatting, the view projection and
 * the palette. Plain strings, no DOM and no Node imports, so the drawings work anywhere.
 */
import { ArgumentError } from '../errors';
import { significant } from './number-format';

/** Escapes text for XML character data and attribute values (the five predefined entities). */
export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => (c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '"' ? '&quot;' : '&apos;'));
}

/** A coordinate in px, rounded to 0.01 px (−0 written as 0). */
export function px(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

/** A number to `digits` significant figures for labels (no exponent for ordinary magnitudes). */
export function label(v: number, digits = 4): string {
  return Number.isFinite(v) ? significant(v, digits) : v > 0 ? '∞' : '–';
}

/** Colours of the translational directions, and the neutral greys, in every drawing. */
export const PALETTE = {
  ux: '#1f6fb2',
  uy: '#c8502a',
  uz: '#2e8b57',
  rx: '#6a4c93',
  ry: '#8a6d1f',
  rz: '#555555',
  undeformed: '#b8b8b8',
  ink: '#222222',
  grid: '#e3e3e3',
} as const;

/** Font stack of the drawings' text. */
export const FONT = 'system-ui, -apple-system, Segoe UI, Helvetica, Arial, sans-serif';

/** Orthographic view: model point p (m) → screen (right·p, up·p) before fitting. */
export interface ViewAxes {
  /** Unit vector of the screen's rightward direction, in model axes. */
  readonly right: readonly [number, number, number];
  /** Unit vector of the screen's upward direction, in model axes. */
  readonly up: readonly [number, number, number];
}

/** Azimuth and elevation of a space view, degrees. */
export interface ViewAngles {
  /** Rotation of the viewer about the vertical Z axis, degrees, from +X towards +Y. @defaultValue −50 */
  readonly azimuth?: number;
  /** Height of the viewer above the X–Y plane, degrees, in [−90, 90]. @defaultValue 30 */
  readonly elevation?: number;
}

/** Defaults of {@link ViewAngles}: x runs right-down, y right-up, Z up. */
export const VIEW_DEFAULTS = { azimuth: -50, elevation: 30 } as const;

/** The plane view: x right, y up. */
export const PLANE_VIEW: ViewAxes = { right: [1, 0, 0], up: [0, 1, 0] };

/**
 * Axonometric (orthographic) view of a space model with Z vertical. The viewer looks from the
 * direction d = (cos ε cos ψ, cos ε sin ψ, sin ε) towards the model; screen right is
 * (−sin ψ, cos ψ, 0) and screen up is (−sin ε cos ψ, −sin ε sin ψ, cos ε), both ⟂ d.
 * @param angles - azimuth ψ and elevation ε in degrees; defaults in {@link VIEW_DEFAULTS}
 * @throws ArgumentError (path `view.azimuth`, `view.elevation`) for non-finite or out-of-range angles
 */
export function spaceView(angles: ViewAngles = {}): ViewAxes {
  const az = angles.azimuth ?? VIEW_DEFAULTS.azimuth;
  const el = angles.elevation ?? VIEW_DEFAULTS.elevation;
  if (!Number.isFinite(az)) throw new ArgumentError(`azimuth is ${az}; give a finite angle in degrees`, 'view.azimuth');
  if (!(Number.isFinite(el) && el >= -90 && el <= 90)) throw new ArgumentError(`elevation is ${el}; give an angle from −90 to 90 degrees`, 'view.elevation');
  const p = (az * Math.PI) / 180;
  const e = (el * Math.PI) / 180;
  return {
    right: [-Math.sin(p), Math.cos(p), 0],
    up: [-Math.sin(e) * Math.cos(p), -Math.sin(e) * Math.sin(p), Math.cos(e)],
  };
}
