import katex from 'katex';
import { useMemo } from 'react';
import { cn } from '@/components/ui/cn.ts';

/** Render LaTeX to HTML; a formula KaTeX cannot read shows its error instead of throwing. */
export function renderLatex(latex: string, displayMode: boolean): { html: string; error: string | null } {
  try {
    return {
      html: katex.renderToString(latex, {
        displayMode,
        throwOnError: true,
        strict: 'ignore',
        output: 'html',
      }),
      error: null,
    };
  } catch (e) {
    const message =
      e instanceof Error ? e.message.replace(/^KaTeX parse error: /, '') : 'This formula cannot be read';
    return { html: '', error: message };
  }
}

/** A formula set with KaTeX (HTML from KaTeX's own renderer, which escapes its input). */
export function KatexFormula({
  latex,
  display = false,
  className,
}: {
  latex: string;
  display?: boolean;
  className?: string;
}) {
  const { html, error } = useMemo(() => renderLatex(latex, display), [latex, display]);
  if (error) {
    return (
      <span className={cn('font-mono text-sm text-unstable', className)} title={error}>
        {latex || '∅'}
      </span>
    );
  }
  return <span className={className} dangerouslySetInnerHTML={{ __html: html }} />;
}
