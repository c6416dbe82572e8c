import katex from 'katex';
import { useMemo } from 'react';

/** Display-mode LaTeX (KaTeX renders and escapes); unreadable LaTeX shows as code. */
export function KatexBlock({ latex, className }: { latex: string; className?: string }) {
  const html = useMemo(() => {
    try {
      return katex.renderToString(latex, { displayMode: true, throwOnError: true, strict: 'ignore' });
    } catch {
      return null;
    }
  }, [latex]);
  if (html === null) return <pre className="font-mono text-xs text-unstable">{latex}</pre>;
  return <div className={className} dangerouslySetInnerHTML={{ __html: html }} />;
}
