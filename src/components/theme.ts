export type ThemeChoice = 'system' | 'light' | 'dark';

const KEY = 'tautline-theme';

export function storedTheme(): ThemeChoice {
  const value = typeof localStorage !== 'undefined' ? localStorage.getItem(KEY) : null;
  return value === 'light' || value === 'dark' ? value : 'system';
}

/** Applies a theme choice to the document: `system` follows prefers-color-scheme. */
export function applyTheme(choice: ThemeChoice): void {
  const dark = choice === 'dark' || (choice === 'system' && window.matchMedia?.('(prefers-color-scheme: dark)').matches);
  document.documentElement.classList.toggle('dark', Boolean(dark));
  document.documentElement.style.colorScheme = dark ? 'dark' : 'light';
  if (choice === 'system') localStorage.removeItem(KEY);
  else localStorage.setItem(KEY, choice);
}
