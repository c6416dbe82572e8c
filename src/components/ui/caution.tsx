import type { ReactNode } from 'react';

/** The product's caution, said plainly wherever results are shown. */
export const CAUTION_TEXT =
  'Results in Bifolio are predictions of the models you write. Validate them against measurement before relying on them; they do not replace local codes, standards or licensed engineering judgement.';

/** `children`: links shown after the caution (the signed-in shell adds Methods). */
export function CautionFooter({ children }: { children?: ReactNode } = {}) {
  return (
    <footer className="border-t border-rule bg-paper">
      <div className="mx-auto max-w-6xl px-4 py-5 text-xs leading-relaxed text-ink-muted sm:px-6">
        <p>
          <span className="font-semibold text-ink">Bifolio</span> — a shared research log for tipping points
          in nonlinear models. {CAUTION_TEXT}
        </p>
        {children}
      </div>
    </footer>
  );
}
