/** Colours given to people in a session: slate-friendly brass, teal, ember, violet, leaf and rose of our own palette. */
export const PEOPLE_COLOURS = ['#e8b64f', '#4cc7b8', '#ef8566', '#9b8cf2', '#7fc96b', '#f28cc6'] as const;

/** A person's colour, picked from their display name so that everyone sees the same one. */
export function presenceColour(name: string): string {
  return PEOPLE_COLOURS[[...name].reduce((sum, char) => sum + char.charCodeAt(0), 0) % PEOPLE_COLOURS.length];
}
