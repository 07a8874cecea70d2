import type { MeResponse, StudioSummary } from '../../../shared/api/responses';

const KEY = 'tautline-last-studio';

export function rememberStudio(studioId: string): void {
  localStorage.setItem(KEY, studioId);
}

/** The studio in the address, else the last one used, else the first one. */
export function currentStudio(me: MeResponse, fromUrl: string | undefined): StudioSummary | undefined {
  const wanted = fromUrl ?? localStorage.getItem(KEY) ?? undefined;
  return me.studios.find((studio) => studio.id === wanted) ?? me.studios[0];
}
