/**
 * Number and name formatting for change descriptions. Display only: the stored names stay as
 * the model spells them; common Greek names are shown as letters ("mu" → "μ").
 */

const GREEK: Record<string, string> = {
  alpha: 'α', beta: 'β', gamma: 'γ', delta: 'δ', epsilon: 'ε', zeta: 'ζ', eta: 'η', theta: 'θ',
  iota: 'ι', kappa: 'κ', lambda: 'λ', mu: 'μ', nu: 'ν', xi: 'ξ', rho: 'ρ', sigma: 'σ', tau: 'τ',
  phi: 'φ', chi: 'χ', psi: 'ψ', omega: 'ω',
  Gamma: 'Γ', Delta: 'Δ', Theta: 'Θ', Lambda: 'Λ', Xi: 'Ξ', Sigma: 'Σ', Phi: 'Φ', Psi: 'Ψ', Omega: 'Ω',
};

/** "mu" → "μ", "mu_1" → "μ_1", anything else unchanged. */
export function displayName(name: string): string {
  const m = /^([A-Za-z]+)(_?\d*)$/.exec(name);
  if (m && GREEK[m[1]]) return GREEK[m[1]] + m[2];
  return name;
}

const MINUS = '−';

/** Below this share of the quantity's scale a computed value is shown as zero (round-off). */
export const ZERO_SHARE = 1e-9;

/**
 * A computed value for a sentence: 4 decimals in the everyday range (|x| in [1e-3, 1e5)), 4
 * significant digits in exponent form outside it, a true minus sign. A value below
 * ZERO_SHARE·scale (round-off around a zero) is "0.0000".
 */
export function formatValue(x: number, scale = 0): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0 || Math.abs(x) < ZERO_SHARE * scale) return '0.0000';
  const ax = Math.abs(x);
  // Fixed decimals in the everyday range, and for small values of a quantity whose scale is everyday.
  const fixed = ax < 1e5 && (ax >= 1e-3 || scale >= 1e-2);
  const s = fixed ? ax.toFixed(4) : ax.toExponential(3).replace('e-', `e${MINUS}`).replace('e+', 'e');
  return (x < 0 ? MINUS : '') + s;
}

/** A signed difference: "+0.0029", "−0.0029". */
export function formatDelta(d: number, scale = 0): string {
  const s = formatValue(d, scale);
  return s === '0.0000' ? '±0.0000' : (d > 0 ? '+' : '') + s;
}

/** A number as the person typed it (inputs): shortest form, true minus sign. */
export function formatTyped(x: number): string {
  return String(x).replace(/^-/, MINUS);
}

/** "μ = 0.2500" */
export function formatAssignment(name: string, value: number, scale = 0): string {
  return `${displayName(name)} = ${formatValue(value, scale)}`;
}

/** "(h, r) = (0.0000, 1.0000)" or "x = 0.5000" for one name; `scales` per name. */
export function formatPoint(values: Record<string, number>, names: readonly string[] = Object.keys(values), scales: readonly number[] = []): string {
  if (names.length === 1) return formatAssignment(names[0], values[names[0]], scales[0]);
  return `(${names.map(displayName).join(', ')}) = (${names.map((n, i) => formatValue(values[n], scales[i])).join(', ')})`;
}

/** "2 equilibria", "1 equilibrium". */
export function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}
