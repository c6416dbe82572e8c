import katex from 'katex';
import { useMemo } from 'react';

/**
 * Fixed formulas of the Methods page, set by KaTeX. The sources are our own constants, so a
 * formula KaTeX cannot read is a bug: it renders KaTeX's red error text rather than throwing.
 */
function useTexHtml(source: string, displayMode: boolean): string {
  return useMemo(
    () => katex.renderToString(source, { displayMode, throwOnError: false, output: 'html' }),
    [source, displayMode],
  );
}

/** Inline maths inside a sentence. */
export function Tex({ children }: { children: string }) {
  return <span dangerouslySetInnerHTML={{ __html: useTexHtml(children, false) }} />;
}

/** Display maths on its own line, centred, scrolling sideways on narrow screens. */
export function TexBlock({ children, label }: { children: string; label?: string }) {
  return (
    <div
      className="my-4 overflow-x-auto py-1"
      role={label ? 'group' : undefined}
      aria-label={label}
      dangerouslySetInnerHTML={{ __html: useTexHtml(children, true) }}
    />
  );
}
