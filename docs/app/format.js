/**
 * Number formatting of the page (shared by app.js and the browser test).
 * @param {number | null | undefined} x - the value
 * @param {number} digits - significant figures @defaultValue 5
 * @returns {string} plain notation between 1e-3 and 1e6, exponent notation outside, '—' when not finite
 */
export function formatNumber(x, digits = 5) {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return Number(x.toPrecision(digits)).toString();
  return x.toExponential(digits - 1);
}
