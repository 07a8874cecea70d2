import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '../../shared/access/roles';
import { validatePatch } from '../../shared/patch/validate-patch';
import type { Patch } from '../../shared/patch/patch-schema';
import type { PluckPart } from '../../shared/patch/excitation-part';
import { polylinesFromParts } from '../../shared/collab/excitation-polyline';
import { assert } from '../../shared/assert';
import { hashPassword } from '../auth/password-hash';
import { Membership } from '../db/entities/membership';
import { Preset } from '../db/entities/preset';
import { Session } from '../db/entities/session';
import { Studio } from '../db/entities/studio';
import { User } from '../db/entities/user';

export const PRESETS_DIR = fileURLToPath(new URL('../../presets/', import.meta.url));

/** Demo-only password of the seeded accounts; printed on start and listed in the README. */
export const DEMO_PASSWORD = 'saltglass-demo';

/** The invented studio behind the demo, and one account per role. */
export const DEMO_STUDIO = { name: 'Kestrel Lantern Audio', slug: 'kestrel-lantern-audio' };
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'wren@kestrel-lantern.example', displayName: 'Wren Halloway', role: 'lead' },
  { email: 'tamsin@kestrel-lantern.example', displayName: 'Tamsin Okafor', role: 'designer' },
  { email: 'joaquin@kestrel-lantern.example', displayName: 'Joaquín Reyes', role: 'producer' },
  { email: 'pell@kestrel-lantern.example', displayName: 'Pell Ashby', role: 'listener' },
];

export interface FactoryPreset {
  file: string;
  patch: Patch;
  tags: string[];
  description: string;
}

/** Reads and validates every factory preset in presets/. */
export function readFactoryPresets(dir = PRESETS_DIR): FactoryPreset[] {
  return readdirSync(dir)
    .filter((file) => file.endsWith('.json'))
    .sort()
    .map((file) => {
      const json = JSON.parse(readFileSync(join(dir, file), 'utf8')) as { tags?: unknown; description?: unknown };
      const result = validatePatch(json);
      if (!result.ok) throw new Error(`presets/${file}: ${result.issues[0].message}`);
      return {
        file,
        patch: result.value,
        tags: Array.isArray(json.tags) ? json.tags.filter((tag): tag is string => typeof tag === 'string') : [],
        description: typeof json.description === 'string' ? json.description : '',
      };
    });
}

let factoryPresetsRead: FactoryPreset[] | null = null;

/**
 * Adds the factory presets (presets/*.json, read and validated once per process) to a studio,
 * inside the caller's transaction: the demo studio and every new studio start with them.
 */
export async function addFactoryPresets(manager: EntityManager, studioId: string, createdById: string | null, presets: FactoryPreset[] = (factoryPresetsRead ??= readFactoryPresets())): Promise<Map<string, Preset>> {
  const byFile = new Map<string, Preset>();
  for (const preset of presets) {
    const saved = await manager.save(
      Preset,
      manager.create(Preset, { studioId, name: preset.patch.name, tags: [...preset.tags], description: preset.description, patch: structuredClone(preset.patch), version: 1, createdById }),
    );
    byFile.set(preset.file, saved);
  }
  return byFile;
}

/**
 * Seeds the demo on a database that has no users yet: the studio, one account per role, the
 * factory presets, and two sessions started from presets. Returns false (and changes nothing)
 * when the database already has users.
 */
export async function seedDemo(dataSource: DataSource, passwordHashCost: number): Promise<boolean> {
  if ((await dataSource.getRepository(User).count()) > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD, passwordHashCost);
  const presets = readFactoryPresets();
  await dataSource.transaction(async (manager) => {
    if ((await manager.getRepository(User).count()) > 0) return;
    const studio = await manager.save(Studio, manager.create(Studio, DEMO_STUDIO));
    const users: User[] = [];
    for (const account of DEMO_ACCOUNTS) {
      const user = await manager.save(User, manager.create(User, { email: account.email, displayName: account.displayName, passwordHash }));
      await manager.save(Membership, manager.create(Membership, { userId: user.id, studioId: studio.id, role: account.role }));
      users.push(user);
    }
    const [lead, designer] = users;
    const saved = await addFactoryPresets(manager, studio.id, lead.id, presets);
    // Each demo session starts from a preset with its pluck laid down as a pluck (a handle to drag),
    // near where the preset plucks: invented demo data.
    const sessions: Array<[string, string, User, PluckPart]> = [
      ['Lighthouse stair climb', 'lantern-room-harp.json', designer, { kind: 'pluck', positionM: 0.25, heightM: 0.004, widthM: 0.003, contact: 'fingertip' }],
      ['Storm-surge chase pulse', 'breakwater-bass.json', lead, { kind: 'pluck', positionM: 0.16, heightM: 0.004, widthM: 0.015, contact: 'fingertip' }],
    ];
    for (const [name, file, author, pluck] of sessions) {
      const preset = saved.get(file) ?? [...saved.values()][0];
      const patch = withPluck({ ...structuredClone(preset.patch), name }, pluck);
      await manager.save(
        Session,
        manager.create(Session, { studioId: studio.id, name, patch, createdById: author.id, updatedById: author.id, archived: false, docState: null, sourcePresetId: preset.id }),
      );
    }
  });
  return true;
}

/** The patch with its displacement made by one pluck (kept as `excitation.parts`, the polyline regenerated from it). */
function withPluck(patch: Patch, pluck: PluckPart): Patch {
  const made = polylinesFromParts(patch.string.lengthM, [pluck]);
  assert(made.ok && made.displacement !== null, `demo pluck does not fit: ${made.ok ? 'no displacement' : made.reason}`);
  return { ...patch, excitation: { ...patch.excitation, parts: [pluck], displacementM: [[0, 0], ...made.displacement, [patch.string.lengthM, 0]] } };
}
