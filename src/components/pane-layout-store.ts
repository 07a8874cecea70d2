/**
 * Where a resizable pane's share is remembered: this device's localStorage, one key per splitter.
 * A missing, unreadable or out-of-range value reads as "not set".
 */
const PREFIX = 'tautline-pane:';

export function storedPaneFraction(id: string, minFraction: number, maxFraction: number): number | null {
  try {
    const raw = typeof localStorage === 'undefined' ? null : localStorage.getItem(PREFIX + id);
    const value = raw === null ? NaN : Number(raw);
    return Number.isFinite(value) && value >= minFraction && value <= maxFraction ? value : null;
  } catch {
    return null;
  }
}

export function storePaneFraction(id: string, fraction: number): void {
  try {
    localStorage.setItem(PREFIX + id, fraction.toFixed(4));
  } catch {
    // Private windows may refuse storage: the layout is then kept for this visit only.
  }
}

/** A share kept between its bounds. */
export function clampFraction(fraction: number, minFraction: number, maxFraction: number): number {
  return Math.min(maxFraction, Math.max(minFraction, fraction));
}
