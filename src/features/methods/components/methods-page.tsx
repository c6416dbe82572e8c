import { METHODS_SECTIONS } from './methods-sections.tsx';

/**
 * The Methods page body: a contents list with anchors beside (or above, on narrow screens)
 * the sections, set in the serif text face with display maths.
 */
export function MethodsPage() {
  return (
    <div className="grid gap-10 lg:grid-cols-[14rem_minmax(0,1fr)]">
      <nav aria-labelledby="methods-contents" className="lg:sticky lg:top-6 lg:self-start">
        <h2
          id="methods-contents"
          className="mb-2 text-xs font-semibold tracking-widest text-ink-muted uppercase"
        >
          Contents
        </h2>
        <ol className="space-y-1 text-sm">
          {METHODS_SECTIONS.map((section, i) => (
            <li key={section.id} className="flex gap-2">
              <span aria-hidden="true" className="w-5 shrink-0 text-right text-ink-muted tabular-nums">
                {i + 1}.
              </span>
              <a href={`#${section.id}`} className="text-ink hover:text-accent">
                {section.title}
              </a>
            </li>
          ))}
        </ol>
      </nav>
      <article className="methods-prose max-w-[42rem] font-serif text-[0.95rem] leading-7 text-ink">
        {METHODS_SECTIONS.map((section, i) => (
          <section key={section.id} aria-labelledby={section.id} className="mb-10">
            <h2 id={section.id} className="mb-3 scroll-mt-6 font-serif text-xl font-bold text-ink">
              <span className="mr-2 text-ink-muted tabular-nums">{i + 1}.</span>
              {section.title}
            </h2>
            <div className="space-y-3 [&_li]:mt-1.5 [&_ol]:list-decimal [&_ol]:pl-6 [&_ul]:list-disc [&_ul]:pl-6">
              {section.body}
            </div>
          </section>
        ))}
      </article>
    </div>
  );
}
