import katex from 'katex';
import { useMemo, type ReactNode } from 'react';
import { cn } from './cn.ts';

/** Render LaTeX to HTML; a formula KaTeX cannot read gives its error instead of throwing. */
export function renderLatex(latex: string, displayMode: boolean): { html: string; error: string | null } {
  try {
    return {
      html: katex.renderToString(latex, { displayMode, throwOnError: true, strict: 'ignore', output: 'html' }),
      error: null,
    };
  } catch (e) {
    const message = e instanceof Error ? e.message.replace(/^KaTeX parse error: /, '') : 'This formula cannot be read';
    return { html: '', error: message };
  }
}

/**
 * A formula set with KaTeX (HTML from KaTeX's own renderer, which escapes its input). A formula
 * KaTeX cannot read shows `fallback` when given (readable text), else its LaTeX in red with the
 * error as a tooltip.
 */
export function KatexFormula({
  latex,
  display = false,
  className,
  fallback,
}: {
  latex: string;
  display?: boolean;
  className?: string;
  fallback?: ReactNode;
}) {
  const { html, error } = useMemo(() => renderLatex(latex, display), [latex, display]);
  if (error) {
    if (fallback !== undefined) return <span className={className}>{fallback}</span>;
    const Tag = display ? 'pre' : 'span';
    return (
      <Tag className={cn('font-mono text-sm text-unstable', className)} title={error}>
        {latex || '∅'}
      </Tag>
    );
  }
  const Tag = display ? 'div' : 'span';
  return <Tag className={className} dangerouslySetInnerHTML={{ __html: html }} />;
}
