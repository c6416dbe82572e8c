/**
 * Bifolio's mark: one sheet folded into two leaves, crossed by an S-shaped equilibrium curve whose
 * two turning points (folds) are marked. Same drawing as src/assets/logo.svg (the favicon), but
 * coloured from the theme so it reads in light and dark.
 */
export function LogoMark({ className, title }: { className?: string; title?: string }) {
  const lower =
    'M11 51.8 L16.6 50.9 L21.6 50 L26 49.1 L29.8 48.2 L33 47.3 L35.7 46.4 L37.9 45.5 L39.6 44.6 L40.9 43.7 L41.7 42.8 L42.2 41.9 L42.4 41';
  const middle =
    'M42.4 41 L42.2 40.1 L41.8 39.2 L41.1 38.3 L40.2 37.4 L39.1 36.5 L37.9 35.6 L36.5 34.7 L35.1 33.8 L33.6 32.9 L32 32 L30.4 31.1 L28.9 30.2 L27.5 29.3 L26.1 28.4 L24.9 27.5 L23.8 26.6 L22.9 25.7 L22.2 24.8 L21.8 23.9 L21.6 23';
  const upper =
    'M21.6 23 L21.8 22.1 L22.3 21.2 L23.1 20.3 L24.4 19.4 L26.1 18.5 L28.3 17.6 L31 16.7 L34.2 15.8 L38 14.9 L42.4 14 L47.4 13.1 L53 12.2';
  return (
    <svg
      viewBox="0 0 64 64"
      className={className}
      role={title ? 'img' : undefined}
      aria-label={title}
      aria-hidden={title ? undefined : true}
    >
      <path
        d="M32 11 L7 6 L7 54 L32 59 Z"
        fill="var(--bf-sunken)"
        stroke="var(--bf-ink)"
        strokeWidth="2.5"
        strokeLinejoin="round"
      />
      <path
        d="M32 11 L57 6 L57 54 L32 59 Z"
        fill="var(--bf-surface)"
        stroke="var(--bf-ink)"
        strokeWidth="2.5"
        strokeLinejoin="round"
      />
      <g fill="none" stroke="var(--bf-accent)" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round">
        <path d={lower} />
        <path d={middle} strokeDasharray="2.4 3" />
        <path d={upper} />
      </g>
      <circle cx="42.4" cy="41" r="2.8" fill="var(--bf-unstable)" />
      <circle cx="21.6" cy="23" r="2.8" fill="var(--bf-unstable)" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className ?? ''}`}>
      <LogoMark className="size-8" />
      <span className="font-serif text-xl font-bold tracking-tight text-ink">Bifolio</span>
    </span>
  );
}
