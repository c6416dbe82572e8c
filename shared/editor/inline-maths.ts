/**
 * Maths inside readable text. The document's plain-text forms (`documentToPlainText`, the
 * revision diff's blocks, the search text) write inline maths as `$…$` and displayed maths as
 * `$$…$$`; these helpers find those formulas again so a screen can typeset them, and turn a
 * formula that was cut in half (a search snippet's edge) into readable words instead of LaTeX.
 *
 * The inline form follows the editor's own input rule: the opening `$` does not follow a letter,
 * digit, backslash or another `$`, and the formula does not end in a space, so "5$ or $6 each"
 * stays text.
 */

export type MathsSegment = { kind: 'text'; text: string } | { kind: 'maths'; latex: string; display: boolean };

/** One formula: `$$…$$` (displayed) or `$…$` (inline), as a regular expression source. */
export const MATHS_SOURCE = String.raw`\$\$(?:[^$]|\\\$)+?\$\$|(?<![\p{L}\p{N}_\\$])\$(?:[^$\n\\]|\\.)*?[^$\s\\]\$(?!\$)`;

/** Splits text into plain runs and whole formulas. */
export function splitMaths(text: string): MathsSegment[] {
  const out: MathsSegment[] = [];
  let last = 0;
  for (const m of text.matchAll(new RegExp(MATHS_SOURCE, 'gu'))) {
    if (m.index > last) out.push({ kind: 'text', text: text.slice(last, m.index) });
    const display = m[0].startsWith('$$');
    out.push({ kind: 'maths', latex: display ? m[0].slice(2, -2) : m[0].slice(1, -1), display });
    last = m.index + m[0].length;
  }
  if (last < text.length) out.push({ kind: 'text', text: text.slice(last) });
  return out;
}

const SYMBOLS: Record<string, string> = {
  alpha: 'α', beta: 'β', gamma: 'γ', delta: 'δ', epsilon: 'ε', varepsilon: 'ε', zeta: 'ζ', eta: 'η', theta: 'θ',
  vartheta: 'ϑ', iota: 'ι', kappa: 'κ', lambda: 'λ', mu: 'μ', nu: 'ν', xi: 'ξ', pi: 'π', rho: 'ρ', sigma: 'σ',
  tau: 'τ', upsilon: 'υ', phi: 'φ', varphi: 'φ', chi: 'χ', psi: 'ψ', omega: 'ω', Gamma: 'Γ', Delta: 'Δ',
  Theta: 'Θ', Lambda: 'Λ', Xi: 'Ξ', Pi: 'Π', Sigma: 'Σ', Phi: 'Φ', Psi: 'Ψ', Omega: 'Ω', partial: '∂',
  infty: '∞', cdot: '·', times: '×', pm: '±', le: '≤', leq: '≤', ge: '≥', geq: '≥', ne: '≠', neq: '≠',
  approx: '≈', to: '→', rightarrow: '→', sum: 'Σ', int: '∫', nabla: '∇', dot: '', ddot: '', hat: '', bar: '',
  mathrm: '', mathbf: '', text: '', operatorname: '', left: '', right: '', quad: ' ', qquad: ' ', sqrt: '√', frac: '', dfrac: '', tfrac: '',
  exp: 'exp', ln: 'ln', log: 'log', sin: 'sin', cos: 'cos', tan: 'tan', min: 'min', max: 'max',
};

/**
 * A formula (or a piece of one) as readable text: Greek letters and common symbols as characters,
 * fractions as a/b, other commands by their name, grouping braces and dollars dropped.
 */
export function latexToText(latex: string): string {
  return latex
    .replace(/\\frac\s*\{([^{}]*)\}\s*\{([^{}]*)\}/g, '($1)/($2)')
    .replace(/\\([A-Za-z]+)/g, (_, name: string) => SYMBOLS[name] ?? name)
    // The halves of a fraction cut off from its \frac.
    .replace(/\}\s*\{/g, '/')
    .replace(/\\[,;:! ]/g, ' ')
    .replace(/\\([{}$%&_#])/g, '$1')
    .replace(/[{}$\\]/g, '')
    .replace(/\s+/g, ' ');
}

/**
 * Splits a fragment of text that may start or end inside a formula (a cut-out search snippet):
 * whole formulas stay maths, a formula's tail at the start or head at the end becomes readable
 * text through `latexToText`. A lone `$` counts as an opening when nothing after it closes it.
 */
export function splitMathsFragment(fragment: string): MathsSegment[] {
  let text = fragment;
  let head = '';
  let tail = '';
  const dollars = (s: string) => (s.match(/(?<!\\)\$/g) ?? []).length;
  // An odd count of dollars means one formula is cut: at the start when the text before the
  // first dollar reads as LaTeX, at the end otherwise.
  if (dollars(text) % 2 === 1) {
    const first = text.search(/(?<!\\)\$/);
    const before = text.slice(0, first);
    if (/[\\{}^_]/.test(before) || (/^\S*$/.test(before) && before !== '')) {
      head = latexToText(before);
      text = text.slice(first + 1);
    } else {
      const lastIndex = text.lastIndexOf('$');
      tail = latexToText(text.slice(lastIndex + 1));
      text = text.slice(0, lastIndex);
    }
  }
  const out = splitMaths(text);
  if (head) out.unshift({ kind: 'text', text: head });
  if (tail) out.push({ kind: 'text', text: tail });
  return out;
}

/** Text with each formula written as readable words (for labels, titles and tooltips). */
export function mathsAsText(text: string): string {
  return splitMaths(text)
    .map((s) => (s.kind === 'text' ? s.text : latexToText(s.latex)))
    .join('');
}
