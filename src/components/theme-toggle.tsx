import { useLayoutEffect, useState } from 'react';
import { applyTheme, storedTheme, type ThemeChoice } from './theme';

const order: ThemeChoice[] = ['system', 'light', 'dark'];
const labels: Record<ThemeChoice, string> = { system: 'Theme: follows system', light: 'Theme: light', dark: 'Theme: dark' };

/** Cycles system → light → dark; the choice is remembered on this device. */
export function ThemeToggle() {
  const [choice, setChoice] = useState<ThemeChoice>(storedTheme);
  // A layout effect: the class is on <html> before any page's effects run or anything is painted, so a
  // canvas drawn on a direct load already sees the dark theme.
  useLayoutEffect(() => {
    applyTheme(choice);
    if (choice !== 'system') return;
    const media = window.matchMedia?.('(prefers-color-scheme: dark)');
    const follow = () => applyTheme('system');
    media?.addEventListener('change', follow);
    return () => media?.removeEventListener('change', follow);
  }, [choice]);
  return (
    <button
      type="button"
      onClick={() => setChoice(order[(order.indexOf(choice) + 1) % order.length])}
      className="rounded-md px-3 py-2 text-sm text-slate-700 hover:bg-slate-700/10 focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-slate-300 dark:hover:bg-slate-100/10"
      aria-label={labels[choice]}
      title={labels[choice]}
    >
      {choice === 'dark' ? '◐ Dark' : choice === 'light' ? '◑ Light' : '◒ System'}
    </button>
  );
}
