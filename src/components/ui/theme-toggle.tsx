import { THEME_CHOICES, setThemeChoice, useThemeChoice, type ThemeChoice } from '@/lib/theme.ts';
import { cn } from './cn.ts';

const labels: Record<ThemeChoice, string> = { light: 'Light', dark: 'Dark', system: 'System' };

/** Light, dark or follow the system; remembered in this browser. */
export function ThemeToggle() {
  const choice = useThemeChoice();
  return (
    <div
      role="radiogroup"
      aria-label="Colour theme"
      className="inline-flex rounded-md border border-rule-strong bg-surface p-0.5 text-xs"
    >
      {THEME_CHOICES.map((c) => (
        <button
          key={c}
          type="button"
          role="radio"
          aria-checked={choice === c}
          onClick={() => setThemeChoice(c)}
          className={cn(
            'rounded-sm px-2 py-1 font-medium',
            choice === c ? 'bg-accent text-on-accent' : 'text-ink-muted hover:text-ink',
          )}
        >
          {labels[c]}
        </button>
      ))}
    </div>
  );
}
