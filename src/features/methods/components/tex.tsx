import { KatexFormula } from '@/components/ui/katex-formula.tsx';

/** Inline maths inside a sentence (the Methods page's own formulas). */
export function Tex({ children }: { children: string }) {
  return <KatexFormula latex={children} />;
}

/** Display maths on its own line, centred, scrolling sideways on narrow screens. */
export function TexBlock({ children, label }: { children: string; label?: string }) {
  return (
    <div className="my-4 overflow-x-auto py-1" role={label ? 'group' : undefined} aria-label={label}>
      <KatexFormula latex={children} display />
    </div>
  );
}
