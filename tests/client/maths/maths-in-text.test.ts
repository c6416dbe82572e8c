import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { DocNode, DocumentJson } from '@shared/editor/document.ts';
import { diffDocuments } from '@shared/diff/text-diff.ts';
import { latexToText, mathsAsText, splitMaths, splitMathsFragment } from '@shared/editor/inline-maths.ts';
import { TextDiffView } from '@/features/reviews/components/text-diff-view.tsx';
import { SnippetText } from '@/features/search/components/search-page.tsx';

const text = (t: string): DocNode => ({ type: 'text', text: t });
const math = (latex: string): DocNode => ({ type: 'inlineMath', attrs: { latex } });
const p = (...content: DocNode[]): DocNode => ({ type: 'paragraph', content });
const doc = (...content: DocNode[]): DocumentJson => ({ type: 'doc', content });

/** Visible text of rendered HTML: KaTeX's html output carries no LaTeX source, so none may show. */
const visible = (html: string) => html.replace(/<[^>]+>/g, '');

describe('splitMaths', () => {
  it('finds inline and displayed formulas and leaves prices as text', () => {
    expect(splitMaths('rate $k e^{x}$ and $$\\frac{a}{b}$$ at 5$ or $6 each')).toEqual([
      { kind: 'text', text: 'rate ' },
      { kind: 'maths', latex: 'k e^{x}', display: false },
      { kind: 'text', text: ' and ' },
      { kind: 'maths', latex: '\\frac{a}{b}', display: true },
      { kind: 'text', text: ' at 5$ or $6 each' },
    ]);
  });
});

describe('latexToText', () => {
  it('reads a formula as words and symbols', () => {
    expect(latexToText('\\frac{\\theta}{1 + \\mu^2}')).toBe('(θ)/(1 + μ^2)');
    expect(latexToText('\\dot{x} = \\alpha x')).toBe('x = α x');
    expect(mathsAsText('fold at $\\mu_c$.')).toBe('fold at μ_c.');
  });
});

describe('splitMathsFragment', () => {
  it('turns a formula cut at the start or the end of a snippet into readable text', () => {
    const start = splitMathsFragment('{k}{1+x}$ sets the rate of $\\theta$');
    expect(start).toEqual([
      { kind: 'text', text: 'k/1+x' },
      { kind: 'text', text: ' sets the rate of ' },
      { kind: 'maths', latex: '\\theta', display: false },
    ]);
    const end = splitMathsFragment('the heat balance $\\dot{T} = \\frac{1}{\\tau');
    expect(end).toEqual([
      { kind: 'text', text: 'the heat balance ' },
      { kind: 'text', text: 'T = 1/τ' },
    ]);
    for (const s of [...start, ...end]) if (s.kind === 'text') expect(s.text).not.toMatch(/[\\{}$]/);
  });
});

describe('revision diff with maths', () => {
  const before = doc(p(text('The rate is '), math('k e^{-E/RT}'), text(' in the tank.')), { type: 'displayMath', attrs: { latex: '\\dot{x} = \\mu - x^2' } });
  const after = doc(p(text('The rate is '), math('k e^{-E/(RT)}'), text(' in the tank.')), { type: 'displayMath', attrs: { latex: '\\dot{x} = \\mu + x^2' } });

  it('shows a changed inline formula as the old formula removed and the new one added, whole', () => {
    const [paragraph] = diffDocuments(before, after);
    expect(paragraph.status).toBe('changed');
    expect(paragraph.parts.filter((x) => x.kind !== 'same')).toEqual([
      { kind: 'removed', text: '$k e^{-E/RT}$' },
      { kind: 'added', text: '$k e^{-E/(RT)}$' },
    ]);
  });

  it('shows a changed displayed equation as the old one removed and the new one added', () => {
    const [, equation] = diffDocuments(before, after);
    expect(equation.parts).toEqual([
      { kind: 'removed', text: '\\dot{x} = \\mu - x^2' },
      { kind: 'added', text: '\\dot{x} = \\mu + x^2' },
    ]);
  });

  it('typesets formulas inside the marks and shows no LaTeX source', () => {
    const html = renderToStaticMarkup(createElement(TextDiffView, { blocks: diffDocuments(before, after) }));
    expect(html).toMatch(/<del[^>]*>.*?class="katex"/);
    expect(html).toMatch(/<ins[^>]*>.*?class="katex"/);
    expect(html).toContain('data-change="removed"');
    expect(html).toContain('data-change="added"');
    expect(visible(html)).not.toMatch(/\\(dot|mu|frac)|e\^\{/);
  });
});

describe('search snippet', () => {
  it('typesets formula parts, keeps the hit mark around them and degrades unreadable LaTeX to words', () => {
    const html = renderToStaticMarkup(
      createElement(SnippetText, {
        parts: [
          { text: 'the ', hit: false },
          { text: '\\frac{k}{\\theta}', hit: true, maths: true },
          { text: ' and ', hit: false },
          { text: '\\frac{1}{\\alpha', hit: false, maths: true },
        ],
      }),
    );
    expect(html).toMatch(/<mark><span><span class="katex">/);
    expect(visible(html)).not.toContain('\\frac');
    expect(visible(html)).toContain('α');
  });
});
