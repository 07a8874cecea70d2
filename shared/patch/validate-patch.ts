import { patchSchema, type Patch, type Polyline } from './patch-schema';
import { fieldIssue, type FieldIssue, type Validation } from './field-issue';
import { issueFromZod } from './zod-issues';
import { fundamentalFrequencyHz } from '../engine/mode-frequencies';
import { passThroughIssues } from './pass-through-bounds';

/** The rules of one polyline that tie it to the string: ends at 0 and L, x strictly increasing, zero at both ends. */
function polylineIssues(points: Polyline, lengthM: number, path: ReadonlyArray<PropertyKey>): FieldIssue[] {
  const issues: FieldIssue[] = [];
  const last = points.length - 1;
  if (points[0][0] !== 0) issues.push(fieldIssue([...path, 0, 0], 'must be 0 (the first point sits on the support at x = 0)', points[0][0]));
  if (points[last][0] !== lengthM) {
    issues.push(fieldIssue([...path, last, 0], `must equal string.lengthM (${lengthM}), the far support`, points[last][0]));
  }
  if (points[0][1] !== 0) issues.push(fieldIssue([...path, 0, 1], 'must be 0 (the string is pinned at its supports)', points[0][1]));
  if (points[last][1] !== 0) issues.push(fieldIssue([...path, last, 1], 'must be 0 (the string is pinned at its supports)', points[last][1]));
  for (let i = 1; i < points.length && issues.length < 5; i++) {
    if (!(points[i][0] > points[i - 1][0])) {
      issues.push(fieldIssue([...path, i, 0], `must be > the previous point's x (${points[i - 1][0]}); x must strictly increase`, points[i][0]));
    }
  }
  return issues;
}

/**
 * Validates an unknown value as a patch: the schema first (types, ranges, limits from `LIMITS`),
 * then the rules between fields. Returns the patch with defaults filled in, or every problem found,
 * each naming its field.
 */
export function validatePatch(input: unknown): Validation<Patch> {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) {
    return { ok: false, issues: [fieldIssue([], 'must be a JSON object', input)] };
  }
  const bounds = passThroughIssues(input as Record<string, unknown>);
  if (bounds.length > 0) return { ok: false, issues: bounds };
  const parsed = patchSchema.safeParse(input);
  if (!parsed.success) return { ok: false, issues: parsed.error.issues.map((issue) => issueFromZod(issue, input)) };

  const patch = parsed.data;
  const { lengthM } = patch.string;
  const issues: FieldIssue[] = [
    ...polylineIssues(patch.excitation.displacementM, lengthM, ['excitation', 'displacementM']),
    ...(patch.excitation.velocityMPerS ? polylineIssues(patch.excitation.velocityMPerS, lengthM, ['excitation', 'velocityMPerS']) : []),
  ];
  if (!(patch.pickup.positionM < lengthM)) {
    issues.push(fieldIssue(['pickup', 'positionM'], `must be < string.lengthM (${lengthM}); the pickup sits between the supports`, patch.pickup.positionM));
  }
  const f0Hz = fundamentalFrequencyHz(patch.string);
  const nyquistHz = patch.render.sampleRateHz / 2;
  if (!(f0Hz < nyquistHz)) {
    issues.push(
      fieldIssue(
        ['string', 'tensionN'],
        `gives a fundamental of ${f0Hz.toPrecision(6)} Hz, at or above half the sample rate (${nyquistHz} Hz); no mode could sound`,
        patch.string.tensionN,
      ),
    );
  }
  return issues.length > 0 ? { ok: false, issues } : { ok: true, value: patch };
}
