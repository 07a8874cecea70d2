import { useEffect, useState } from 'react';

const isDark = () => document.documentElement.classList.contains('dark');

/**
 * Whether the page is dark now, for drawings that pick their own colours (Konva stages). The theme
 * is put on <html> by the header's ThemeToggle; on a direct load that can happen after this hook
 * first reads it, so the hook reads it again once its observer is watching, and never misses it.
 */
export function useDarkTheme(): boolean {
  const [dark, setDark] = useState(isDark);
  useEffect(() => {
    const observer = new MutationObserver(() => setDark(isDark()));
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] });
    setDark(isDark());
    return () => observer.disconnect();
  }, []);
  return dark;
}
