import type { EntityManager } from 'typeorm';
import { Studio } from '../db/entities/studio';

/** A URL-friendly, unique slug for a studio name: `Kestrel Lantern Audio` → `kestrel-lantern-audio`(-2, -3…). */
export async function uniqueStudioSlug(manager: EntityManager, name: string): Promise<string> {
  const base =
    name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 48) || 'studio';
  let slug = base;
  for (let n = 2; await manager.getRepository(Studio).existsBy({ slug }); n++) slug = `${base}-${n}`;
  return slug;
}
