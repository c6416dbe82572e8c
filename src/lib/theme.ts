import { useSyncExternalStore } from 'react';

export const THEME_CHOICES = ['light', 'dark', 'system'] as const;
export type ThemeChoice = (typeof THEME_CHOICES)[number];
export const THEME_STORAGE_KEY = 'bifolio.theme';

const listeners = new Set<() => void>();

export function readThemeChoice(): ThemeChoice {
  try {
    const v = localStorage.getItem(THEME_STORAGE_KEY);
    return (THEME_CHOICES as readonly string[]).includes(v ?? '') ? (v as ThemeChoice) : 'system';
  } catch {
    return 'system';
  }
}

/** The theme actually shown: a stored choice, or the system's preference. */
export function resolveTheme(choice: ThemeChoice, systemPrefersDark: boolean): 'light' | 'dark' {
  if (choice === 'system') return systemPrefersDark ? 'dark' : 'light';
  return choice;
}

const darkQuery = () => window.matchMedia('(prefers-color-scheme: dark)');

export function applyTheme(choice: ThemeChoice = readThemeChoice()): void {
  document.documentElement.dataset.theme = resolveTheme(choice, darkQuery().matches);
}

export function setThemeChoice(choice: ThemeChoice): void {
  try {
    localStorage.setItem(THEME_STORAGE_KEY, choice);
  } catch {
    // Storage may be blocked; the choice then lasts for this page only.
  }
  applyTheme(choice);
  listeners.forEach((l) => l());
}

/** Follows the system setting while "system" is chosen; call once at start. */
export function watchSystemTheme(): () => void {
  const mq = darkQuery();
  const onChange = () => applyTheme();
  mq.addEventListener('change', onChange);
  return () => mq.removeEventListener('change', onChange);
}

/** The stored choice, for the theme controls. */
export function useThemeChoice(): ThemeChoice {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    readThemeChoice,
    () => 'system' as const,
  );
}
