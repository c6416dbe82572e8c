/**
 * LaTeX for model expressions, so a model cell reads like the equations of a paper. The
 * expression parser is loaded on first use (it is large) and only when a model is on screen.
 */
const GREEK = new Set(
  'alpha beta gamma delta epsilon zeta eta theta iota kappa lambda mu nu xi pi rho sigma tau upsilon phi chi psi omega Gamma Delta Theta Lambda Xi Pi Sigma Upsilon Phi Psi Omega'.split(
    ' ',
  ),
);

/** A name as LaTeX: greek letters by name, "T_a" → T_{a}, "x1" → x_{1}, "Da" → \mathrm{Da}. */
export function symbolTex(name: string): string {
  const [head, ...subs] = name.split('_');
  const digits = /^(.*?)(\d+)$/.exec(head);
  const base = digits && digits[1] ? digits[1] : head;
  const sub = [digits && digits[1] ? digits[2] : '', ...subs].filter(Boolean).join(',');
  const baseTex = GREEK.has(base) ? `\\${base}` : base.length === 1 ? base : `\\mathrm{${base}}`;
  return sub
    ? `${baseTex}_{${sub
        .split(',')
        .map((s) => (GREEK.has(s) ? `\\${s}` : s.length > 1 ? `\\mathrm{${s}}` : s))
        .join(',')}}`
    : baseTex;
}

type MathjsNode = { type: string; name?: string; toTex: (o: object) => string };
let parser: Promise<(s: string) => MathjsNode> | null = null;

function loadParser() {
  parser ??= import('mathjs').then((m) => m.parse as unknown as (s: string) => MathjsNode);
  return parser;
}

/** LaTeX of one expression, or null when it does not parse (the form shows the parser's message). */
export async function expressionTex(expression: string): Promise<string | null> {
  if (!expression.trim()) return null;
  const parse = await loadParser();
  try {
    return parse(expression).toTex({
      parenthesis: 'auto',
      implicit: 'hide',
      handler: (node: MathjsNode) =>
        node.type === 'SymbolNode' && node.name ? symbolTex(node.name) : undefined,
    });
  } catch {
    return null;
  }
}
