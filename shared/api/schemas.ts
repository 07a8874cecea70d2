import { z } from 'zod';
import { ROLES } from '../access/roles';
import { LIMITS } from '../limits';

/**
 * Request bodies of the REST API. The server validates every body with these; the client reuses
 * them for its forms. A patch inside a body is `unknown` here and checked by `validatePatch`, so
 * its problems come back field by field.
 */

const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'must be at most 254 characters')
  .pipe(z.email('must be an e-mail address'));

const label = (what: string) =>
  z
    .string()
    .trim()
    .min(1, `must not be empty`)
    .max(LIMITS.maxLabelLength, `must be at most ${LIMITS.maxLabelLength} characters`)
    .describe(what);

const password = z.string().max(LIMITS.maxPasswordLength, `must be at most ${LIMITS.maxPasswordLength} characters`);

export const registerBody = z.object({ email, password, displayName: label('display name') });
export const loginBody = z.object({ email, password: z.string().min(1, 'is required') });
export const passwordResetRequestBody = z.object({ email });
export const passwordResetConfirmBody = z.object({ token: z.string().min(1, 'is required'), password });
export const updateProfileBody = z.object({ displayName: label('display name') });
export const changePasswordBody = z.object({ currentPassword: z.string().min(1, 'is required'), newPassword: password });
export const deleteAccountBody = z.object({ password: z.string().min(1, 'is required') });

export const role = z.enum(ROLES, `must be one of ${ROLES.join(', ')}`);
export const createStudioBody = z.object({ name: label('studio name') });
export const updateStudioBody = z.object({ name: label('studio name') });
export const inviteBody = z.object({ email, role });
export const changeRoleBody = z.object({ role });
export const acceptInvitationBody = z.object({
  token: z.string().min(1, 'is required'),
  displayName: label('display name').optional(),
  password: password.optional(),
});

export const createSessionBody = z.object({
  name: label('session name'),
  patch: z.unknown().optional(),
  presetId: z.string().min(1).optional(),
});
export const updateSessionBody = z
  .object({ name: label('session name').optional(), patch: z.unknown().optional(), archived: z.boolean().optional() })
  .refine((body) => body.name !== undefined || body.patch !== undefined || body.archived !== undefined, 'must change name, patch or archived');
export const loadPresetBody = z.object({ presetId: z.string().min(1, 'is required') });

const tag = z
  .string()
  .trim()
  .toLowerCase()
  .min(1, 'must not be empty')
  .max(LIMITS.maxTagLength, `must be at most ${LIMITS.maxTagLength} characters`);
const tags = z.array(tag).max(LIMITS.maxPresetTags, `must have at most ${LIMITS.maxPresetTags} tags`);

export const createPresetBody = z
  .object({
    name: label('preset name'),
    tags: tags.default([]),
    description: z.string().trim().max(500, 'must be at most 500 characters').optional(),
    patch: z.unknown().optional(),
    sessionId: z.string().min(1).optional(),
  })
  .refine((body) => (body.patch === undefined) !== (body.sessionId === undefined), 'must give either a patch or a sessionId');
export const updatePresetBody = z
  .object({
    name: label('preset name').optional(),
    tags: tags.optional(),
    description: z.string().trim().max(500, 'must be at most 500 characters').optional(),
    patch: z.unknown().optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), 'must change name, tags, description or patch');

export const PRESET_SORTS = ['name', 'date', 'author'] as const;
export const listPresetsQuery = z.object({
  q: z.string().trim().max(LIMITS.maxLabelLength).optional(),
  tag: tag.optional(),
  sort: z.enum(PRESET_SORTS, `must be one of ${PRESET_SORTS.join(', ')}`).default('name'),
});
